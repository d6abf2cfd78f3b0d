// Reports an operating limit that does not say what happens on deviation or how to correct it.
import { defineFileRule } from '../define-rule.ts';
import { contentSeverity } from '../content-severity.ts';

export default defineFileRule(
  {
    id: 'limit-incomplete',
    summary: 'An operating limit lacks its consequence of deviation or the steps to correct it.',
    category: 'safety',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(ii): operating limits with the consequences of deviation and the steps required to correct or avoid deviation',
    docs: `A limit is only useful to an operator who knows why it matters and what to do when it is crossed.
Every entry under \`limits\` states a \`consequence\` (what happens outside the limit) and a \`correction\`
(the steps that bring the process back or avoid the deviation).

Missing content is a **warning** while the procedure is a \`draft\` and an **error** from \`in-review\` on.`,
    examples: {
      bad: `limits:
  TI-210: { low: 15 degC, high: 245 degC }`,
      good: `limits:
  TI-210:
    low: 15 degC
    high: 245 degC
    consequence: Above 245 degC the resin gels and can vent through the scrubber
    correction: Close hot-oil valve XV-2101`,
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p) return;
    for (const limit of p.limits) {
      if (limit.from) continue;
      const missing = [
        !limit.consequence?.trim() && 'the consequence of deviation (consequence)',
        !limit.correction?.trim() && 'the steps to correct it (correction)',
      ].filter(Boolean);
      if (!missing.length) continue;
      ctx.report({
        path: limit.path,
        part: 'key',
        severity: contentSeverity(String(p.status)),
        message: `The operating limit for ${limit.signal} does not state ${missing.join(' or ')}.`,
        hint: "Add 'consequence' (what happens outside the limit) and 'correction' (what the operator does) to the limit.",
      });
    }
  },
);
