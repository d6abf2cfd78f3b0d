// Reports a waiver that names a rule Stepwright does not have, or one that cannot be waived.
import { closest } from 'fastest-levenshtein';
import { defineFileRule } from '../define-rule.ts';
import { unwaivableRules } from '../waivers.ts';

export default defineFileRule(
  {
    id: 'waiver-unknown-rule',
    summary: 'A waiver names a rule that does not exist or cannot be waived.',
    category: 'document-control',
    defaultSeverity: 'error',
    docs: `\`waive\` names rule ids exactly as the checker reports them (e.g. \`one-action-per-step\`). A misspelt id
waives nothing and would hide the mistake. Rules about waivers themselves and about unreadable files cannot
be waived.`,
    examples: {
      bad: `waive:
  - { rule: one-action, reason: The two valves share one hand wheel }`,
      good: `waive:
  - { rule: one-action-per-step, reason: The two valves share one hand wheel }`,
    },
  },
  (ctx) => {
    if (!ctx.facts) return;
    const known = ctx.ruleIds;
    for (const { step } of ctx.facts.steps) {
      for (const waiver of step.waivers ?? []) {
        if (unwaivableRules.has(waiver.rule)) {
          ctx.report({ path: [...waiver.path, 'rule'], message: `The rule '${waiver.rule}' cannot be waived.`, hint: 'Fix the problem instead.' });
        } else if (!known.includes(waiver.rule)) {
          ctx.report({
            path: [...waiver.path, 'rule'],
            message: `Step '${step.id}' waives '${waiver.rule}', which is not a Stepwright rule.`,
            hint: `Did you mean '${closest(waiver.rule, known)}'?`,
          });
        }
      }
    }
  },
);
