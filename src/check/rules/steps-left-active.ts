// Reports a run that reaches the end while steps are still active (the procedure does not complete properly).
import { analyseSequence, causeOf, locatePlaces, showTrace, traceWords } from '../../analysis/soundness/analyse-sequence.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'steps-left-active',
    summary: 'The procedure can reach its end while steps are still active.',
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'van der Aalst (1997), soundness of workflow nets: proper completion',
    docs: `When the procedure ends, nothing may still be running: no step left active, no parallel branch
unfinished. A \`goto\` out of a parallel branch to a later step lets the sequence finish while the other branches
still run. Stepwright reports the first run that ends this way, with the steps still active.`,
    examples: {
      bad: "- parallel:\n    a: [{step: a1, ...}, {choose: [{when: x == skip, goto: finish}, {otherwise: true}]}]\n    b: [{step: b1, ...}]\n- step: finish",
      good: "- parallel: {a: [...], b: [...]}\n- step: finish",
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const analysis = analyseSequence(ctx.facts);
    const result = analysis.result;
    if (!result || result.problems.some((p) => p.kind === 'unsafe')) return;
    const where = locatePlaces(ctx.facts);
    for (const problem of result.problems) {
      if (problem.kind !== 'improper') continue;
      const words = traceWords(problem.path, analysis.graph);
      const left = problem.places.filter((p) => !['end', 'start'].includes(where.place(p)?.kind ?? ''));
      const cause = causeOf(problem.path, true);
      const onCause = cause && !where.crossesParallel(cause) ? where.causePath(cause) : undefined;
      const at = onCause ?? where.pathOf(left[0] ?? '') ?? ['steps'];
      const related = left.flatMap((p) => {
        const path = where.pathOf(p);
        return path ? [{ path, message: `still active: ${where.describe(p)}` }] : [];
      });
      if (cause && !onCause) {
        const path = where.causePath(cause);
        if (path) related.unshift({ path, message: 'the jump that skips ahead' });
      }
      ctx.report({
        path: at,
        part: onCause || at[at.length - 1] === 'step' ? 'value' : 'key',
        message: `After ${showTrace(words)}, the procedure reaches its end while ${left.map((p) => where.describe(p)).join(', ')} ${left.length > 1 ? 'are' : 'is'} still active.`,
        hint: 'Let every parallel branch finish before the sequence goes on; jump only within one branch.',
        related,
        trace: words,
      });
    }
  },
);
