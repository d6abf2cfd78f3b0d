// Reports a condition that no signal values can make true: its transition can never fire.
import { namesIn } from '../../analysis/conditions/parse.ts';
import { analyseDecisions } from '../../analysis/decisions/analyse-decisions.ts';
import { neverTrue } from '../../analysis/decisions/never-true.ts';
import { conditionPressureNote } from '../../analysis/condition-pressure-note.ts';
import type { Condition } from '../../analysis/conditions/ast.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'contradictory-condition',
    summary: 'A condition contradicts itself, so its transition can never fire.',
    category: 'conditions',
    defaultSeverity: 'error',
    docs: `A condition such as \`TI-210 > 80 degC and TI-210 < 70 degC\` is false for every value: the step it ends
never ends, the branch it selects is never taken, the interlock it describes never trips. The same holds for a
branch whose \`when\` contradicts the \`until\` of the step before it (\`until: TI >= 100 degC\`, \`when: TI < 50 degC\`).
Stepwright compares thresholds after unit conversion, with strict and non-strict bounds exactly. A threshold
outside the declared range is reported by threshold-outside-range instead.`,
    examples: { bad: 'until: TI-210 > 80 degC and TI-210 < 70 degC', good: 'until: TI-210 > 70 degC and TI-210 < 80 degC' },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const signals = ctx.procedure.signals;
    const names = (c: Condition) => [...new Set(namesIn(c).map((n) => n.name))].join(', ');
    for (const site of ctx.facts.conditions) {
      if (site.fromRegister) continue;
      if (!site.result.ok || site.problems.length) continue;
      if (neverTrue([site.result.condition], signals) !== true) continue;
      const role = {
        until: `step '${site.owner}' can never end`,
        when: 'this branch can never be taken',
        'trips-when': `interlock ${site.owner} can never trip`,
        needs: `step '${site.owner}' can never be started`,
        'line-up': 'the procedure can never be started',
        'hazard-when': 'the hazard is never checked',
      }[site.role];
      const note = conditionPressureNote([site.result.condition], (n) => signals[n]?.unit);
      ctx.report({
        path: site.path,
        message: `'${site.text}' can never be true: no value of ${names(site.result.condition)} satisfies it${note}, so ${role}.`,
        hint: 'Check the comparison operators and the thresholds; perhaps "or" was meant, or the bounds are swapped.',
      });
    }
    for (const decision of analyseDecisions(ctx.facts)) {
      if (!decision.before) continue;
      const until = ctx.facts.conditionAt(decision.before.path);
      if (!until?.result.ok || until.problems.length) continue;
      for (const branch of decision.block.branches) {
        const when = branch.when ? ctx.facts.conditionAt(branch.when.path) : undefined;
        if (!when?.result.ok || when.problems.length) continue;
        if (neverTrue([when.result.condition], signals) !== false || neverTrue([until.result.condition], signals) !== false) continue;
        if (neverTrue([until.result.condition, when.result.condition], signals) !== true) continue;
        const note = conditionPressureNote([until.result.condition, when.result.condition], (n) => signals[n]?.unit);
        ctx.report({
          path: when.path,
          message: `This branch can never be taken: '${when.text}' contradicts the step's own until '${until.text}', which must also hold${note}.`,
          hint: "Move the step's until into the branch conditions, or correct the thresholds.",
          related: [{ path: until.path, message: "the step's until" }],
        });
      }
    }
  },
);
