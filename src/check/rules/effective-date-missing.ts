// Reports a procedure that is approved or later in its life-cycle but does not say when it took effect.
import { defineFileRule } from '../define-rule.ts';

const needsDate = new Set(['approved', 'effective', 'superseded', 'retired']);

export default defineFileRule(
  {
    id: 'effective-date-missing',
    summary: "An approved, effective, superseded or retired procedure has no 'effective' date.",
    category: 'document-control',
    defaultSeverity: 'error',
    docs: `From \`approved\` on, a revision records the date it takes (or took) effect, so that anyone can tell which
revision governed the plant on a given day.`,
    examples: { bad: 'status: approved', good: 'status: approved\neffective: 2026-12-15' },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || !needsDate.has(String(p.status)) || p.effective) return;
    ctx.report({
      path: ['status'],
      message: `The procedure is '${p.status}' but has no 'effective' date.`,
      hint: "Add 'effective: YYYY-MM-DD', the date this revision takes effect.",
    });
  },
);
