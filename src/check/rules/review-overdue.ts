// Warns when a procedure in use has passed its periodic review date.
import { defineFileRule } from '../define-rule.ts';

const inUse = new Set(['approved', 'effective']);

export default defineFileRule(
  {
    id: 'review-overdue',
    summary: "The 'review-by' date has passed.",
    category: 'document-control',
    defaultSeverity: 'warning',
    dated: true,
    source: 'OSHA 29 CFR 1910.119(f)(3): procedures reviewed and certified annually as current and accurate',
    docs: 'Procedures in use are reviewed periodically to confirm they still match the plant. Once `review-by` has passed, the procedure is overdue: review it, then set the next date.',
    examples: { bad: 'review-by: 2025-01-31', good: 'review-by: 2027-06-30' },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p?.reviewBy || !inUse.has(String(p.status)) || p.reviewBy >= ctx.today) return;
    ctx.report({
      path: ['review-by'],
      message: `The periodic review was due by ${p.reviewBy} and is overdue.`,
      hint: "Review the procedure against the plant, then set a new 'review-by' date.",
    });
  },
);
