// Reports steps that no run of the sequence can reach (dead steps), once per unreachable stretch.
import { analyseSequence, locatePlaces } from '../../analysis/soundness/analyse-sequence.ts';
import type { SequenceItem, Step } from '../../model/procedure.ts';
import { defineFileRule } from '../define-rule.ts';

/** The item written just before a step in its own sequence. */
function itemBefore(items: SequenceItem[], step: Step): SequenceItem | undefined {
  const i = items.indexOf(step);
  if (i > 0) return items[i - 1];
  for (const item of items) {
    if (item.kind === 'step') continue;
    for (const b of item.branches) {
      const found = b.items ? itemBefore(b.items, step) : undefined;
      if (found) return found;
    }
  }
  return undefined;
}

export default defineFileRule(
  {
    id: 'unreachable-step',
    summary: 'A step can never become active.',
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'van der Aalst (1997), soundness of workflow nets: no dead transitions; IEC 61131-3 SFC "unreachable" networks',
    docs: `Every step must be reachable by some run of the sequence. A step right after a decision whose every
branch jumps elsewhere, or after a loop that never exits, can never become active: it is dead text that an
operator may still read and act on. Stepwright reports the first step of each unreachable stretch and how many
steps the stretch holds.`,
    examples: {
      bad: "- choose: [{when: x == a, goto: one}, {otherwise: true, goto: two}]\n- step: never-reached",
      good: "- choose: [{when: x == a, goto: one}, {otherwise: true}]\n- step: reached-otherwise",
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const analysis = analyseSequence(ctx.facts);
    const result = analysis.result;
    if (!result || !result.complete || result.problems.some((p) => p.kind === 'unsafe')) return;
    const where = locatePlaces(ctx.facts);
    const graph = analysis.graph;
    const deadSteps = graph.places.filter((p) => p.kind === 'step' && result.deadPlaces.has(p.id));
    const dead = new Set(deadSteps.map((p) => p.id));
    // Steps reachable along the graph from a dead step: they belong to its stretch.
    const follows = (from: string) => {
      const seen = new Set([from]);
      const queue = [from];
      for (let i = 0; i < queue.length; i++) {
        for (const t of graph.transitions) {
          if (!t.from.includes(queue[i])) continue;
          for (const p of t.to) if (!seen.has(p) && result.deadPlaces.has(p)) (seen.add(p), queue.push(p));
        }
      }
      return [...seen].filter((p) => dead.has(p));
    };
    for (const place of deadSteps) {
      const incoming = graph.transitions.filter((t) => t.to.includes(place.id));
      // Only the first step of a stretch: one whose way in starts from a place that is itself dead is skipped.
      if (incoming.some((t) => t.from.some((f) => dead.has(f)))) continue;
      const stretch = follows(place.id);
      const more = stretch.length - 1;
      const related = [];
      const before = place.step ? itemBefore(ctx.procedure.steps, place.step) : undefined;
      if (before?.kind === 'choose' && before.branches.every((b) => b.goto)) {
        related.push({ path: [...before.path, 'choose'], message: 'every branch of this decision jumps away' });
      }
      ctx.report({
        path: where.pathOf(place.id) ?? place.step!.path,
        message: `Step '${place.label}' can never become active: no run of the sequence reaches it${more > 0 ? ` (nor the ${more} step${more > 1 ? 's' : ''} after it)` : ''}.`,
        hint: incoming.length === 0
          ? 'Every branch of the decision before it jumps elsewhere: let one branch go on, or jump to this step.'
          : 'What leads to it can never complete; see the other sequence findings, or remove the step.',
        related,
      });
    }
  },
);
