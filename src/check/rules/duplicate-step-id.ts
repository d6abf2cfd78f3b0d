// Reports step ids used twice in one procedure; ids carry jumps, hazards and revision diffs.
import { walkSteps } from '../../model/walk-steps.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'duplicate-step-id',
    summary: 'Two steps in one procedure have the same id.',
    category: 'structure',
    defaultSeverity: 'error',
    docs: `Step ids name the target of a \`goto\`, the steps a hazard is repeated before, and the rows of a
revision comparison. Each must be unique within the procedure.`,
    examples: { bad: '- step: sample\n...\n- step: sample', good: '- step: sample\n...\n- step: resample' },
  },
  (ctx) => {
    if (!ctx.procedure) return;
    const first = new Map<string, readonly (string | number)[]>();
    for (const { step } of walkSteps(ctx.procedure.steps)) {
      if (!step.id) continue;
      const earlier = first.get(step.id);
      if (!earlier) {
        first.set(step.id, step.path);
        continue;
      }
      ctx.report({
        path: [...step.path, 'step'],
        message: `Step id '${step.id}' is used twice in this procedure.`,
        hint: 'Rename one of the steps; ids must stay unique and stable across revisions.',
        related: [{ path: [...earlier, 'step'], message: `'${step.id}' first used here` }],
      });
    }
  },
);
