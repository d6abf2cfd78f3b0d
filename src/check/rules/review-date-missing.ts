// Reports an approved or effective procedure that has no periodic review date.
import { defineFileRule } from '../define-rule.ts';

const inUse = new Set(['approved', 'effective']);

export default defineFileRule(
  {
    id: 'review-date-missing',
    summary: "An approved or effective procedure has no 'review-by' date.",
    category: 'document-control',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(3): operating procedures reviewed as often as necessary and certified annually as current and accurate',
    docs: `A procedure in use is certified at least once a year as current and accurate. \`review-by\` is the date by
which the next certification is due; without it, nothing tells anyone that the yearly certification has lapsed.
Set it at most 12 months after the last certification (see \`review-interval-too-long\`).`,
    examples: { bad: 'status: effective\neffective: 2026-04-20', good: 'status: effective\neffective: 2026-04-20\nreview-by: 2027-04-20' },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || !inUse.has(String(p.status)) || p.reviewBy) return;
    ctx.report({
      path: ['status'],
      message: `The procedure is '${p.status}' but has no 'review-by' date, so its yearly certification cannot be tracked.`,
      hint: "Add 'review-by: YYYY-MM-DD', at most 12 months after the last certification (or the effective date).",
    });
  },
);
