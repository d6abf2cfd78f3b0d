// Reports a run after which the end of the procedure can no longer be reached (a deadlock), with its trace.
import { analyseSequence, causeOf, locatePlaces, showTrace, traceWords } from '../../analysis/soundness/analyse-sequence.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'sequence-deadlock',
    summary: 'Some run of the sequence can no longer reach the end.',
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'van der Aalst (1997), soundness of workflow nets: from every reachable state the end can be reached; IEC 61131-3 SFC "unreachable" networks',
    docs: `Stepwright plays every way the sequence can run, taking each decision both ways, and reports the first
run after which the end can no longer be reached: for example a \`goto\` into a parallel branch starts that branch
alone, so the block waits forever for the others. The message shows the run in the procedure's own words
(\`after heat-up → sample → lab-result == fail → …\`) and points at the jump or decision taken last before the
point of no return. Restructure the jump so that it stays inside one branch, or loop the whole block.`,
    examples: {
      bad: "- parallel:\n    a: [{step: a1, ...}]\n    b: [{step: b1, ...}]\n- step: check\n- choose: [{when: x == bad, goto: b1}, {otherwise: true}]",
      good: "- step: prepare\n- parallel: {...}\n- step: check\n- choose: [{when: x == bad, goto: prepare}, {otherwise: true}]",
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const analysis = analyseSequence(ctx.facts);
    const result = analysis.result;
    // An endless loop and a step active twice are reported by their own rules, which explain the cause better.
    if (!result || analysis.endless.length || result.problems.some((p) => p.kind === 'unsafe')) return;
    const where = locatePlaces(ctx.facts);
    for (const problem of result.problems) {
      if (problem.kind !== 'stuck') continue;
      const words = traceWords(problem.path, analysis.graph);
      const cause = causeOf(problem.path, false);
      const waiting = problem.places.filter((p) => where.place(p)?.kind !== 'start');
      const onCause = cause && !where.crossesParallel(cause) ? where.causePath(cause) : undefined;
      const at = onCause ?? where.pathOf(waiting[0] ?? '') ?? ['steps'];
      const related = waiting.flatMap((p) => {
        const path = where.pathOf(p);
        return path ? [{ path, message: `still active: ${where.describe(p)}` }] : [];
      });
      if (cause && !onCause) {
        const path = where.causePath(cause);
        if (path) related.unshift({ path, message: 'the jump that leads here' });
      }
      // A join that waits for a branch nobody is in can never fire: say which branch.
      const idle = where.idleBranches(problem.places);
      for (const b of idle) related.push({ path: b.path, message: `branch '${b.name}' is not running, so the parallel block cannot finish` });
      const waits = idle.length ? ` The parallel block waits for branch${idle.length > 1 ? 'es' : ''} ${idle.map((b) => `'${b.name}'`).join(', ')}, which ${idle.length > 1 ? 'are' : 'is'} not running.` : '';
      ctx.report({
        path: at,
        part: onCause || at[at.length - 1] === 'step' ? 'value' : 'key',
        message: `After ${showTrace(words)} … the end can no longer be reached (still active: ${waiting.map((p) => where.describe(p)).join(', ') || 'nothing'}).${waits}`,
        hint: cause?.jump
          ? `Make the jump to '${cause.jump.target}' stay inside one branch, or give every branch a way to the end.`
          : 'Give every branch of the sequence a way to the end.',
        related,
        trace: words,
      });
    }
  },
);
