// Reports a revision marked effective whose effective date is still ahead: it is not in force yet.
import { effectiveLater } from '../../analysis/document-control.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'effective-in-future',
    summary: "The status is 'effective' but the 'effective' date is after today, so the revision is not in force yet.",
    category: 'document-control',
    defaultSeverity: 'warning',
    dated: true,
    source: 'common practice: a revision applies from its effective date, not from the day it was released',
    docs: `The effective date decides when a revision is in force; the status only says that it has been released.
A revision committed as \`effective\` with a date after today is treated like an \`approved\` one that has not
taken effect: the manual keeps serving the last revision in force from git and shows the new one on its own page,
marked as taking effect on its date. The status then says something the manual does not do, so it is reported:
keep the revision \`approved\` until its date and set it \`effective\` then, or correct the date.`,
    examples: {
      bad: 'revision: 9\nstatus: effective\neffective: 2027-01-15   # today 2026-12-01',
      good: 'revision: 9\nstatus: approved\neffective: 2027-01-15',
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || String(p.status) !== 'effective') return;
    const later = effectiveLater(p, ctx.today);
    if (!later) return;
    ctx.report({
      path: ['effective'],
      message: `Revision ${p.revision} is 'effective' but takes effect only on ${later}, after today (${ctx.today}); it is not in force yet, and the manual serves the last revision in force until then.`,
      hint: `Keep 'status: approved' until ${later} and set it 'effective' then, or correct the date.`,
      related: [{ path: ['status'], message: "the status says 'effective' here" }],
    });
  },
);
