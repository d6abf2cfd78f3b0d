// Reports an effective date earlier than one of the approvals: a revision cannot take effect before it is signed.
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'effective-before-approval',
    summary: "The 'effective' date is earlier than an approval date.",
    category: 'document-control',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(l): procedures updated and authorized before start-up of the changed process',
    docs: 'A revision takes effect only after every required signature. An effective date before a signature date means the record is wrong, or the procedure was used before it was approved.',
    examples: { bad: 'effective: 2026-03-01\napprovals: [{..., date: 2026-03-05}]', good: 'effective: 2026-03-08' },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p?.effective) return;
    for (const a of p.approvals) {
      if (!a.date || a.date <= p.effective) continue;
      ctx.report({
        path: ['effective'],
        message: `Effective date ${p.effective} is before the approval by ${a.name} on ${a.date}.`,
        hint: 'Set the effective date on or after the last approval.',
        related: [{ path: [...a.path, 'date'], message: `approval by ${a.name}` }],
      });
    }
  },
);
