// Reports that the sequence has too many states to prove sound within the budget.
import { analyseSequence } from '../../analysis/soundness/analyse-sequence.ts';
import { defaultStateBudget } from '../../analysis/soundness/explicit.ts';
import { defineFileRule } from '../define-rule.ts';
import { groupDigits } from '../../parse/group-digits.ts';

export default defineFileRule(
  {
    id: 'sequence-too-large',
    summary: 'The sequence is too large to prove sound; some sequence checks did not finish.',
    category: 'sequence',
    defaultSeverity: 'info',
    docs: `Parallel blocks that no \`goto\` crosses are proved sound one by one, which is fast whatever their size.
Only where jumps cross parallel branches does Stepwright play every combination of active steps, and it stops
after a fixed number of states. When that happens the sequence is not proved sound (nor shown unsound): keep jumps
inside one branch, or split the procedure.`,
    examples: {
      bad: 'a goto out of a branch of a parallel block with many long branches',
      good: 'the same block, looped as a whole from a decision after it',
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const result = analyseSequence(ctx.facts).result;
    if (!result || result.complete) return;
    ctx.report({
      path: ['steps'],
      part: 'key',
      message: `The sequence has more than ${groupDigits(defaultStateBudget)} combinations of active steps where jumps cross parallel branches; it was not proved sound.`,
      hint: 'Keep each goto inside one parallel branch, or loop whole blocks, so that the structural proof applies.',
    });
  },
);
