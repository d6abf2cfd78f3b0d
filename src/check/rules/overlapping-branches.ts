// Reports two branches of a decision that can be true at the same time, with values that make both true.
import { analyseDecisions } from '../../analysis/decisions/analyse-decisions.ts';
import { conditionPressureNote } from '../../analysis/condition-pressure-note.ts';
import type { PathKey } from '../../parse/read-source.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'overlapping-branches',
    summary: 'Two branches of a choose block can be true at the same time.',
    category: 'conditions',
    defaultSeverity: 'error',
    source: 'IEC 61131-3 SFC: the transitions of a selective divergence must be mutually exclusive',
    docs: `Exactly one branch of a \`choose\` may be taken, so no two branch conditions may be true together.
Stepwright works over the signals' declared ranges and values, in SI base units after unit conversion, with
strict and non-strict bounds taken exactly: \`LI-8 <= 10 %\` and \`LI-8 >= 10 %\` overlap at exactly 10 %, and
\`PI >= 1 atm\` overlaps \`PI < 760 mmHg\` in a sliver because 760 mmHg is 101325.0144 Pa. The message gives values
that make both branches true. A step's own \`until\` is part of each branch's condition.`,
    examples: {
      bad: '- choose:\n    - when: TI-5 > 80 degC\n    - when: TI-5 < 85 degC',
      good: '- choose:\n    - when: TI-5 > 80 degC\n    - when: TI-5 <= 80 degC',
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const facts = ctx.facts;
    const signals = ctx.procedure.signals;
    const parsed = (path: readonly PathKey[] | undefined) => {
      const site = path ? facts.conditionAt(path) : undefined;
      return site?.result.ok ? [site.result.condition] : [];
    };
    for (const decision of analyseDecisions(facts)) {
      for (const overlap of decision.overlaps) {
        const a = decision.block.branches[overlap.a];
        const b = decision.block.branches[overlap.b];
        if (!a.when || !b.when) continue;
        const note = conditionPressureNote([...parsed(a.when.path), ...parsed(b.when.path), ...parsed(decision.before?.path)], (n) => signals[n]?.unit);
        ctx.report({
          path: b.when.path,
          message: `Branches ${overlap.a + 1} and ${overlap.b + 1} can both be true: both are true when ${overlap.witness.join(' and ') || 'any values'} ('${a.when.value}' and '${b.when.value}')${note}.`,
          hint: 'Make the conditions exclusive, e.g. pair < with >=, or > with <=, at the same threshold.',
          related: [{ path: a.when.path, message: `branch ${overlap.a + 1}: ${a.when.value}` }],
        });
      }
    }
  },
);
