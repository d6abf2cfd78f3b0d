// Reports a hazard whose `at` list names a step that does not exist, so its warning would never be repeated.
import { closest } from 'fastest-levenshtein';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'hazard-unknown-step',
    summary: "A hazard's 'at' names a step that does not exist.",
    category: 'safety',
    defaultSeverity: 'error',
    source: 'DOE-STD-1029-92: warnings and cautions come immediately before the step they apply to',
    docs: `Hazards are shown at the top of the procedure and repeated directly before the steps listed in \`at\`.
A misspelt step id would silently drop the repeated warning at the point of danger.`,
    examples: { bad: 'at: [heatup]', good: 'at: [heat-up]' },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const ids = [...ctx.facts.stepById.keys()];
    for (const hazard of ctx.procedure.hazards) {
      for (const at of hazard.at) {
        if (ctx.facts.stepById.has(at.value)) continue;
        ctx.report({
          path: at.path,
          message: `Hazard '${hazard.hazard}' is to be repeated before step '${at.value}', which does not exist.`,
          hint: ids.length ? `Did you mean '${closest(at.value, ids)}'?` : 'Name an existing step id.',
        });
      }
    }
  },
);
