// Says plainly when the plant-state checks could not look at all of a procedure.
import { analyseSequence } from '../../analysis/soundness/analyse-sequence.ts';
import { defineFileRule, type FileContext } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'state-not-analysed',
    summary: 'The plant-state checks could not analyse part of the procedure.',
    category: 'sequence',
    defaultSeverity: 'warning',
    source: 'Common practice: a check that could not run says so',
    docs: `Hazard conditions, step needs, latched trips and the trips a step resets are checked against the plant state at every step. When
a condition cannot be analysed exactly (a name that is not declared, a unit that does not convert, too many
cases) or the procedure has more combinations of steps and states than the check explores, the rest of the
procedure was not checked for them, and this rule says which part. Fix the reported condition, or split the
procedure. It also names a step the sequence reaches but no worked-out plant state does: a transition before it
can never become true in the states the check works out, most often an \`until\` on a valve or switch that no step
puts in that position with \`state\` (an \`until\` only waits; \`state: { XV-901: open }\` opens the valve). The
steps from there on were not checked for hazards, needs and latched trips.`,
    examples: { bad: "hazards: [{ when: 'M-21O == running' }]  # a letter O, not a zero", good: "hazards: [{ when: 'M-210 == running' }]" },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const p = ctx.procedure;
    const usesState = p.hazards.some((h) => h.when) || p.interlocks.some((i) => i.latches && i.holds.length)
      || ctx.facts.steps.some(({ step }) => step.needs || (step.resets ?? []).some((r) => p.interlocks.some((i) => i.latches && i.tag === r.value)));
    // The end-state rules (end-state-differs, contingency-goto-unsafe, trip-left-latched) follow every procedure that
    // moves equipment or trips on purpose: a step they cannot reach is said for those too.
    const judgedAtEnd = ctx.facts.steps.some(({ step }) => (step.state ?? []).length > 0 || (step.trips ?? []).length > 0);
    if (usesState || judgedAtEnd) reportUnreached(ctx);
    if (!usesState) return;
    const state = ctx.facts.state;
    const gaps = state.gaps;
    if (!gaps.length) return;
    ctx.report({
      path: ['steps'],
      part: 'key',
      message: `The plant-state checks (hazard conditions, needs, latched trips) did not cover everything: ${[...new Set(gaps)].slice(0, 3).join('; ')}${gaps.length > 3 ? ` and ${gaps.length - 3} more` : ''}.`,
      hint: 'Correct the conditions named here; until then, hazards, needs and latched trips are checked only where they can be.',
    });
  },
);

/**
 * Steps the sequence can reach but the plant-state check never does: a transition before them can never become
 * true in the states worked out (an until on a valve that no step's `state` opens). Everything from there on went
 * unchecked for hazards, needs and trips, which is said at the first such step of each stretch.
 */
function reportUnreached(ctx: FileContext): void {
  const facts = ctx.facts!;
  const state = facts.state;
  const sequence = analyseSequence(facts).result;
  if (!state.complete || !sequence?.complete || sequence.problems.some((p) => p.kind === 'unsafe')) return;
  const graph = facts.graph;
  const unreached = graph.places.filter((pl) => pl.kind === 'step' && pl.step && !sequence.deadPlaces.has(pl.id) && !state.views.get(pl.id)?.length);
  const ids = new Set(unreached.map((pl) => pl.id));
  for (const place of unreached) {
    const into = graph.transitions.filter((t) => t.to.includes(place.id) && t.from.some((f) => !ids.has(f)));
    if (!into.length) continue;
    // All parts of one transition must hold together; any of the transitions into the step would do.
    const waits = [...new Set(into.map((t) => t.guard.filter((g) => g.kind === 'until' || g.kind === 'when').map((g) => g.text.trim()).join(' and ')).filter(Boolean))];
    const after = unreached.length - 1;
    ctx.report({
      path: place.step!.path,
      message: `The plant-state check finds no run that reaches step '${place.step!.id}'${after ? ` (nor ${after} other step${after === 1 ? '' : 's'} it leads to)` : ''}: ${waits.length ? `no state worked out before it makes ${waits.join(' or ')} true` : 'the transition into it never fires in the states worked out'}, so hazards, needs, latched trips and end states were not checked there.`,
      hint: 'Give the step that moves the equipment its `state` (an until only waits: `state: { XV-901: open }` opens the valve), or correct the condition.',
    });
  }
}
