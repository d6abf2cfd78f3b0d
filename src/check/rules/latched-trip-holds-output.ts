// Reports a step that needs or drives an output that a latched trip holds, with no reset step in between; the
// outputs of a plant-register function are held too, and those that cannot be mapped onto the procedure's signals are said.
import { heldOutputConflicts, unmetNeeds } from '../../analysis/state/state-findings.ts';
import { startsAfterTrip } from '../../analysis/state/state-input.ts';
import type { Procedure, Step, UnheldOutput } from '../../model/procedure.ts';
import type { Report } from '../define-rule.ts';
import { defineFileRule } from '../define-rule.ts';
import { showPath } from '../state-path.ts';

export default defineFileRule(
  {
    id: 'latched-trip-holds-output',
    summary: 'A step needs an output that a latched trip holds, and no reset step comes between.',
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(iv): safety systems and their functions; IEC 61131-3 SFC stored (S) and reset (R) action qualifiers',
    docs: `An interlock with \`latches: true\` and \`holds: { XV-2102: closed }\` keeps its outputs where it put them
until a step resets it (\`resets: [PSHH-210]\`). A step that trips it on purpose says so with \`trips\`, and an
\`emergency\` or \`emergency-shutdown\` procedure starts with any of its latching trips possibly in force. A step
that opens a valve the trip keeps closed (\`state: { XV-2102: open }\`), or that needs it open, cannot work as
written: the valve stays closed, the step waits for ever, or the operator is tempted to bypass the trip.

A plant-register safety function the procedure uses holds its outputs in the same way while it is latched: its
\`closes\`, \`opens\` and \`stops\` lists, and those of the function it \`starts\` (TSHH-210 starts ESD-210, which
closes XV-2101 and opens drown valve XV-2109). Each is read as the value of the procedure's enumerated signal that
names that state (\`closed\` or \`shut\`, \`open\`, \`stopped\` or \`off\`); \`keeps-running\` forces nothing. An
output that is not an enumerated signal of the procedure, or whose values have no word for the state, is not
checked, and an info line on the trip says which and why, where the trip can be latched.

Fix it by adding a step that resets the trip, once its cause is cleared, before the step that needs the output;
or use another way that the trip does not block.`,
    examples: {
      bad: "interlocks: [{ tag: PSHH-210, latches: true, holds: { XV-2102: closed } }]\nkind: emergency-shutdown\nsteps: [{ step: set-blanket, state: { XV-2102: open } }]",
      good: 'steps: [{ step: reset-trip, resets: [PSHH-210] }, { step: set-blanket, state: { XV-2102: open } }]',
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    reportUnheld(ctx.procedure, ctx.facts.steps.map(({ step }) => step), ctx.report);
    if (!ctx.procedure.interlocks.some((i) => i.latches && i.holds.length)) return;
    const state = ctx.facts.state;
    const trips = ctx.procedure.interlocks.map((i) => ({ tag: i.tag, latches: i.latches, holds: i.holds }));
    for (const f of heldOutputConflicts(state, ctx.facts.graph, trips)) {
      const action = f.step.state?.find((a) => a.signal === f.signal);
      ctx.report({
        path: action?.path ?? [...f.step.path, 'step'],
        message: `Step '${f.step.id}' sets ${f.signal} ${f.wanted}, but latched trip ${f.trip} may be in force there and holds ${f.signal} ${f.held}. Path: ${showPath(f.path)}.`,
        hint: `Add a step that resets ${f.trip} (resets: [${f.trip}]) once its cause is cleared, before this step.`,
        trace: f.path,
      });
    }
    for (const f of unmetNeeds(state, ctx.facts.graph, trips)) {
      if (!f.trip) continue;
      ctx.report({
        path: f.step.needs!.path,
        message: `Step '${f.step.id}' needs ${f.step.needs!.value}, but latched trip ${f.trip} may be in force there and holds it otherwise (${f.values}). Path: ${showPath(f.path)}.`,
        hint: `Add a step that resets ${f.trip} (resets: [${f.trip}]) once its cause is cleared, before this step.`,
        trace: f.path,
      });
    }
  },
);

const whyWords: Record<UnheldOutput['why'], string> = {
  'not-declared': 'not a signal of this procedure',
  'no-values': 'a signal without declared values',
  'no-matching-value': 'a signal with no value for that state',
};

/**
 * A register function's outputs that could not be mapped onto the procedure's signals are not checked: said once
 * per latching trip that can be in force (tripped by a step, or at the start of an emergency procedure), and once
 * per started function for all the trips that start it.
 */
function reportUnheld(p: Procedure, steps: Step[], report: (r: Report) => void): void {
  const tripped = new Set(steps.flatMap((s) => (s.trips ?? []).map((t) => t.value)));
  const said = new Set<string>();
  for (const i of p.interlocks) {
    if (!i.latches || !i.unheld?.length || !(startsAfterTrip.has(p.kind) || tripped.has(i.tag))) continue;
    const left = i.unheld.filter((u) => !said.has(`${u.via ?? i.tag}|${u.signal}`));
    if (!left.length) continue;
    for (const u of left) said.add(`${u.via ?? i.tag}|${u.signal}`);
    const groups = new Map<string, string[]>();
    for (const u of left) {
      const key = `${u.why}|${u.state}`;
      groups.set(key, [...(groups.get(key) ?? []), u.signal]);
    }
    const parts = [...groups].map(([key, tags]) => {
      const [why, state] = key.split('|') as [UnheldOutput['why'], string];
      return `${tags.join(', ')} (${state}: ${whyWords[why]})`;
    });
    const via = [...new Set(left.map((u) => u.via).filter((v) => v))];
    report({
      path: i.path,
      severity: 'info',
      message: `While ${i.tag} is latched${via.length ? ` (through ${via.join(', ')})` : ''}, the plant register says it holds outputs that were not checked against the steps: ${parts.join('; ')}.`,
      hint: 'Declare the outputs the steps drive as enumerated signals with values such as open/closed or running/stopped; the others need no change.',
    });
  }
}
