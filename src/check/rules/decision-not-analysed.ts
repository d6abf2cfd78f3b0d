// Reports a decision the exclusivity and coverage analysis gave up on because it splits into too many cases.
import { defineFileRule } from '../define-rule.ts';
import { analyseDecisions } from '../../analysis/decisions/analyse-decisions.ts';
import { maxBoxes } from '../../analysis/decisions/signal-space.ts';
import { groupDigits } from '../../parse/group-digits.ts';

export default defineFileRule(
  {
    id: 'decision-not-analysed',
    summary: 'A decision is too large to prove its branches exclusive and complete; it was not checked.',
    category: 'conditions',
    defaultSeverity: 'warning',
    docs: `Every \`choose\` block is checked for branches that can be true at once (\`overlapping-branches\`) and for
values no branch takes (\`uncovered-values\`). The check splits the values of the signals the branches name
into cases; a decision whose conditions need more than ${groupDigits(maxBoxes)} cases is not checked, and this warning says so
with its size, so that a reviewer checks it by hand or the decision is split. Each branch of a decision an
operator takes should be readable at a glance: split a large decision into several steps, each deciding on
one or two signals.`,
    examples: { bad: 'choose: with 300 branches over 40 signals', good: 'choose: with a few branches over one or two signals, and otherwise' },
  },
  (ctx) => {
    if (!ctx.facts) return;
    for (const d of analyseDecisions(ctx.facts)) {
      if (d.skipped !== 'too many cases') continue;
      const signals = d.space?.variables.size;
      ctx.report({
        path: d.block.path,
        message: `This decision has ${d.block.branches.length} branches${signals ? ` over ${signals} signals` : ''}; proving them exclusive and complete needs more than ${groupDigits(maxBoxes)} cases, so overlaps and uncovered values were not fully checked.`,
        hint: 'Split the decision into steps that each decide on one or two signals, or have it checked by hand and waive this warning with the reason.',
      });
    }
  },
);
