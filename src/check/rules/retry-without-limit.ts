// Reports a loop back to an earlier step that does not state how many times it may be taken.
import type { ChooseBranch, SequenceItem } from '../../model/procedure.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'retry-without-limit',
    summary: 'A loop back to an earlier step does not state its limit.',
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'Common practice: burner management and retry sequences limit attempts, then lock out',
    docs: `A branch that jumps back (\`goto\` an earlier step) repeats part of the procedure: another light-off
attempt, another cook period. Without a limit the operator may try again and again, long after the attempts
should have stopped (a burner relit into an unpurged firebox). State the limit with \`repeat: { expected, max }\`
on the branch that jumps back, and make the branch that leaves the loop say what happens when the limit is
reached (lock out, call the supervisor).`,
    examples: {
      bad: "- when: flame == off\n  goto: light-off",
      good: "- when: flame == off\n  goto: purge\n  repeat: { expected: 0.2, max: 2 }",
    },
  },
  (ctx) => {
    if (!ctx.procedure) return;
    const order = new Map<string, number>();
    const loops: Array<{ branch: ChooseBranch; before: number }> = [];
    let count = 0;
    const visit = (items: SequenceItem[]) => {
      for (const item of items) {
        if (item.kind === 'step') {
          if (!order.has(item.id)) order.set(item.id, count);
          count++;
          continue;
        }
        const before = count;
        for (const b of item.branches) {
          if (b.items) visit(b.items);
          if (item.kind === 'choose' && (b as ChooseBranch).goto) loops.push({ branch: b as ChooseBranch, before });
        }
      }
    };
    visit(ctx.procedure.steps);
    for (const { branch, before } of loops) {
      const target = order.get(branch.goto!.value);
      if (target === undefined || target >= before) continue;
      const repeat = branch.extra.repeat as { max?: unknown } | undefined;
      if (repeat && typeof repeat.max === 'number') continue;
      ctx.report({
        path: branch.goto!.path,
        message: `The branch jumps back to '${branch.goto!.value}' but does not state how many times it may be taken.`,
        hint: 'Add repeat: { expected, max } to this branch, and say in the other branch what happens when the limit is reached.',
      });
    }
  },
);
