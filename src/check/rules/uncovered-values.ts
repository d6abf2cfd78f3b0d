// Reports signal values for which no branch of a decision is true: the sequence would wait there.
import { analyseDecisions } from '../../analysis/decisions/analyse-decisions.ts';
import { conditionPressureNote } from '../../analysis/condition-pressure-note.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'uncovered-values',
    summary: 'For some signal values no branch of a choose block is true.',
    category: 'conditions',
    defaultSeverity: 'warning',
    source: 'IEC 61131-3 SFC: selective divergence; a step stays active until one of its transitions is true',
    docs: `A step followed by a \`choose\` stays active until one branch condition is true. If the branches leave
values uncovered, the sequence can wait there with no instruction for the operator. Bounds are taken exactly:
\`LI-8 < 10 %\` and \`LI-8 > 10 %\` leave exactly 10 % uncovered. Values outside the signals' declared ranges do not
count, nor does waiting while \`elapsed\` is below a time limit, since time goes on. Add a branch with
\`otherwise: true\` for everything else, or close the gap.`,
    examples: {
      bad: '- choose:\n    - when: LI-8 < 10 percent\n    - when: LI-8 > 10 percent',
      good: '- choose:\n    - when: LI-8 < 10 percent\n    - otherwise: true',
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    for (const decision of analyseDecisions(ctx.facts)) {
      if (!decision.gap.length || !decision.space) continue;
      const space = decision.space;
      const shown = decision.gap.slice(0, 3).map((box) => space.describe(box));
      const more = decision.gap.length > 3 ? ` and ${decision.gap.length - 3} more` : '';
      const witness = space.witness(decision.gap[0]).join(' and ') || 'any values';
      const after = decision.before ? ` once '${decision.before.text}' holds` : '';
      const facts = ctx.facts;
      const conditions = [...decision.block.branches.map((b) => b.when?.path), decision.before?.path].flatMap((path) => {
        const site = path ? facts.conditionAt(path) : undefined;
        return site?.result.ok ? [site.result.condition] : [];
      });
      const signals = ctx.procedure.signals;
      const note = conditionPressureNote(conditions, (n) => signals[n]?.unit);
      ctx.report({
        path: [...decision.block.path, 'choose'],
        part: 'key',
        message: `No branch is true when ${witness}${after}: the sequence would wait here (uncovered: ${shown.join('; ')}${more})${note}.`,
        hint: "Add a branch with 'otherwise: true', or widen a condition to cover these values (e.g. < to <=).",
        related: decision.before ? [{ path: decision.before.path, message: "the step's own until, part of every branch" }] : undefined,
      });
    }
  },
);
