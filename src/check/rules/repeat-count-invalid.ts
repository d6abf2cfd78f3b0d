// Reports a `repeat` count that cannot be used: on a branch that does not jump, or expecting more than its maximum.
import { walkBlocks } from '../../model/walk-steps.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'repeat-count-invalid',
    summary: 'A repeat count on a branch without goto, or with an expected count above its maximum.',
    category: 'sequence',
    defaultSeverity: 'warning',
    docs: `\`repeat: {expected, max}\` on a choose branch with \`goto\` says how often a loop is repeated in one run; the
cycle-time estimate adds \`expected\` repeats to the typical time and \`max\` repeats to the longest. It means
nothing on a branch that does not jump back, and \`expected\` cannot be more than \`max\` (the estimate would use
\`max\`). Move the count to the branch with the jump, or correct the numbers.`,
    examples: {
      bad: '- when: acid-value > 12 mg/g\n  goto: cook\n  repeat: { expected: 5, max: 3 }',
      good: '- when: acid-value > 12 mg/g\n  goto: cook\n  repeat: { expected: 1, max: 3 }',
    },
  },
  (ctx) => {
    if (!ctx.procedure) return;
    for (const block of walkBlocks(ctx.procedure.steps)) {
      if (block.kind !== 'choose') continue;
      for (const branch of block.branches) {
        const repeat = branch.extra.repeat as { expected?: unknown; max?: unknown } | undefined;
        if (!repeat || typeof repeat !== 'object') continue;
        if (!branch.goto) {
          ctx.report({
            path: [...branch.path, 'repeat'], part: 'key',
            message: 'This branch has a repeat count but no goto, so nothing is repeated.',
            hint: 'Put repeat on the branch that jumps back (the one with goto), or remove it.',
          });
        } else if (typeof repeat.expected === 'number' && typeof repeat.max === 'number' && repeat.expected > repeat.max) {
          ctx.report({
            path: [...branch.path, 'repeat', 'expected'],
            message: `The loop back to '${branch.goto.value}' expects ${repeat.expected} repeats but allows at most ${repeat.max}.`,
            hint: 'Make expected the typical number of repeats and max the most there can be; expected cannot exceed max.',
          });
        }
      }
    }
  },
);
