// Reports a waiver on a step that gives no written reason: such a waiver waives nothing.
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'waiver-without-reason',
    summary: 'A waiver on a step gives no written reason.',
    category: 'document-control',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(l)(2)(i): a deviation from procedure needs its technical basis on record; common practice for checker waivers',
    docs: `A step may waive one rule where the rule does not fit, with \`waive: [{rule, reason}]\`. The reason is
what a reviewer reads to accept the exception, and the site shows it beside the step. A waiver without a
reason is an error and waives nothing.`,
    examples: {
      bad: `waive:
  - rule: one-action-per-step`,
      good: `waive:
  - rule: one-action-per-step
    reason: The two valves share one hand wheel and move together`,
    },
  },
  (ctx) => {
    if (!ctx.facts) return;
    for (const { step } of ctx.facts.steps) {
      for (const waiver of step.waivers ?? []) {
        if (waiver.reason?.trim()) continue;
        ctx.report({
          path: waiver.path,
          message: `The waiver of '${waiver.rule}' on step '${step.id}' gives no reason, so it waives nothing.`,
          hint: "Add 'reason' saying why the rule does not apply to this step.",
        });
      }
    }
  },
);
