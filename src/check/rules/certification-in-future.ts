// Reports a yearly certification dated after today: a record of something that has not happened.
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'certification-in-future',
    summary: 'A certification under \'certifications\' is dated after today.',
    category: 'document-control',
    defaultSeverity: 'error',
    dated: true,
    source: 'OSHA 29 CFR 1910.119(f)(3): the employer certifies annually that the operating procedures are current and accurate',
    docs: `A certification records that someone confirmed the procedure current and accurate on a date; that date cannot
be in the future. A mistyped year (2062 for 2026) would otherwise push the next certification decades out and keep
\`review-interval-too-long\` and \`review-overdue\` quiet. Such a certification is not counted as the last one; write
the date on which the procedure was actually certified.`,
    examples: {
      bad: 'certifications:\n  - { name: Daniel Osei, role: Operations superintendent, date: 2062-11-02 }   # today 2026-12-01',
      good: 'certifications:\n  - { name: Daniel Osei, role: Operations superintendent, date: 2026-11-02 }',
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p) return;
    for (const c of p.certifications) {
      if (!/^\d{4}-\d{2}-\d{2}$/.test(c.date) || c.date <= ctx.today) continue;
      ctx.report({
        path: [...c.path, 'date'],
        message: `The certification by ${c.name || 'an unnamed person'} is dated ${c.date}, after today (${ctx.today}); it is not counted.`,
        hint: 'Write the date on which the procedure was certified current and accurate.',
      });
    }
  },
);
