// Reports a loop made by a goto that nothing ever leaves: the sequence can go round it forever.
import { analyseSequence, locatePlaces, showTrace, traceWords } from '../../analysis/soundness/analyse-sequence.ts';
import { walk } from '../../analysis/soundness/loops.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'loop-without-exit',
    summary: 'A loop made by goto has no way out.',
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'van der Aalst (1997), soundness of workflow nets: the end can always be reached',
    docs: `A \`goto\` back to an earlier step makes a loop, such as "sample, and heat again while the lab says
fail". Every loop needs an exit: a branch of some decision in the loop that goes on past it. When every branch
leads back into the loop, the end can never be reached. \`stepwright check --explain\` names each loop and its exit.`,
    examples: {
      bad: "- step: heat-up\n- step: sample\n- choose: [{when: lab-result == fail, goto: heat-up}, {when: lab-result == pass, goto: heat-up}]",
      good: "- step: heat-up\n- step: sample\n- choose: [{when: lab-result == fail, goto: heat-up}, {when: lab-result == pass}]",
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const analysis = analyseSequence(ctx.facts);
    const where = locatePlaces(ctx.facts);
    const graph = analysis.graph;
    const seen = new Set<string>();
    for (const loop of analysis.endless) {
      const jump = loop.jump;
      // Jumps that go round the same steps make one loop; report it once, at the first jump.
      const key = [...loop.body].sort().join('|');
      if (seen.has(key)) continue;
      seen.add(key);
      if (!jump.jump || where.place(graph.start) === undefined) continue;
      const into = walk(graph, graph.start, loop.head);
      // Dead loops are reported as unreachable steps; a loop only matters when a run can enter it.
      if (!into.length && loop.head !== graph.start) continue;
      const around = walk(graph, loop.head, jump.from[0], loop.body);
      const words = traceWords([...into, ...around, jump], graph);
      const head = where.describe(loop.head);
      const source = where.describe(jump.from[0]);
      ctx.report({
        path: jump.jump.path,
        message: `The loop from ${head} to ${source} (goto '${jump.jump.target}') has no exit: after ${showTrace(words)} … every branch leads back into the loop, so the end can never be reached.`,
        hint: 'Give the decision a branch that goes on past the loop, e.g. when the lab result is pass.',
        related: [{ path: where.pathOf(loop.head) ?? [], message: `start of the loop: ${head}` }],
        trace: words,
      });
    }
  },
);
