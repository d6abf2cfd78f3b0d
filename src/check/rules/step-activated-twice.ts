// Reports a run in which a step becomes active while it is still active (an unsafe sequence), with its trace.
import { analyseSequence, causeOf, locatePlaces, showTrace, traceWords } from '../../analysis/soundness/analyse-sequence.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'step-activated-twice',
    summary: 'A step can become active a second time while it is still active.',
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'IEC 61131-3 SFC: "unsafe" networks, where a step can be activated twice',
    docs: `A step is either active or not: an operator cannot be at one step twice. When a \`goto\` leaves a
parallel branch, the other branches keep running while the sequence starts over, so a step can be reached a second
time before it has ended. Stepwright plays every run of the sequence and reports the first in which a step would
hold two activations, with the run in the procedure's words and the jump that caused it.`,
    examples: {
      bad: "- parallel:\n    a: [{step: a1, ...}, {choose: [{when: x == bad, goto: prepare}, {otherwise: true}]}]\n    b: [{step: b1, ...}]",
      good: "- parallel: {a: [...], b: [...]}\n- step: check\n- choose: [{when: x == bad, goto: prepare}, {otherwise: true}]",
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const analysis = analyseSequence(ctx.facts);
    const where = locatePlaces(ctx.facts);
    for (const problem of analysis.result?.problems ?? []) {
      if (problem.kind !== 'unsafe') continue;
      const words = traceWords(problem.path, analysis.graph);
      const twice = problem.places[0];
      const cause = causeOf(problem.path, true);
      // goto-crosses-parallel already marks a jump out of a branch; put the consequence at the step instead.
      const onCause = cause && !where.crossesParallel(cause) ? where.causePath(cause) : undefined;
      const at = onCause ?? where.pathOf(twice) ?? ['steps'];
      const related = [];
      if (onCause) {
        const path = where.pathOf(twice);
        if (path) related.push({ path, message: `${where.describe(twice)}, active twice` });
      } else if (cause) {
        const path = where.causePath(cause);
        if (path) related.push({ path, message: 'the jump that starts it again' });
      }
      ctx.report({
        path: at,
        part: onCause || at[at.length - 1] === 'step' ? 'value' : 'key',
        message: `After ${showTrace(words)}, ${where.describe(twice)} becomes active again while it is still active.`,
        hint: 'Keep jumps inside one parallel branch, or loop the whole parallel block from a decision after it.',
        related,
        trace: words,
      });
    }
  },
);
