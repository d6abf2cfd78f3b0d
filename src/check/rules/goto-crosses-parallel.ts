// Reports a goto that jumps out of, into, or between parallel branches.
import { walkBlocks } from '../../model/walk-steps.ts';
import type { SequenceItem } from '../../model/procedure.ts';
import { parallelScopeKey } from '../../model/walk-steps.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'goto-crosses-parallel',
    summary: 'A goto leaves or enters a parallel branch.',
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'IEC 61131-3 SFC: "unsafe" and "unreachable" networks',
    docs: `A jump out of a parallel branch leaves the other branches running while the sequence goes on: a step
can then be active twice (an unsafe sequence). A jump into a parallel branch starts only that branch, and the
block can never complete (an unreachable end). Keep each \`goto\` inside the branch it starts in; loop the whole
parallel block from outside it instead.`,
    examples: {
      bad: '- parallel:\n    a: [ ..., {choose: [{when: x == 1, goto: step-before-block}, ...]} ]',
      good: '- parallel: {...}\n- choose: [{when: x == 1, goto: step-before-block}, {otherwise: true}]',
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const scopeOfBlock = new Map<string, string[]>();
    const visit = (items: SequenceItem[], scope: string[]) => {
      for (const item of items) {
        if (item.kind === 'step') continue;
        scopeOfBlock.set(item.path.join('.'), scope);
        for (const b of item.branches) {
          if (!b.items) continue;
          visit(b.items, item.kind === 'parallel' ? [...scope, parallelScopeKey(item, (b as { name: string }).name)] : scope);
        }
      }
    };
    visit(ctx.procedure.steps, []);
    for (const block of walkBlocks(ctx.procedure.steps)) {
      if (block.kind !== 'choose') continue;
      const from = scopeOfBlock.get(block.path.join('.')) ?? [];
      for (const branch of block.branches) {
        if (!branch.goto) continue;
        const target = ctx.facts.stepById.get(branch.goto.value);
        if (!target) continue;
        const to = target.parallelScope;
        if (from.join('|') === to.join('|')) continue;
        const leaves = from.length > to.length || from.some((s, i) => to[i] !== s);
        ctx.report({
          path: branch.goto.path,
          message: leaves
            ? `goto '${branch.goto.value}' jumps out of a parallel branch: the other branches keep running and a step can become active twice.`
            : `goto '${branch.goto.value}' jumps into a parallel branch: the other branches never start, so the block can never finish.`,
          hint: 'Keep jumps inside one branch, or loop the whole parallel block from a decision after it.',
          related: [{ path: [...target.step.path, 'step'], message: `target step '${branch.goto.value}'` }],
        });
      }
    }
  },
);
