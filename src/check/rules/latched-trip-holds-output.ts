// Reports a step that needs or drives an output that a latched trip holds, with no reset step in between.
import { heldOutputConflicts, unmetNeeds } from '../../analysis/state/state-findings.ts';
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

Fix it by adding a step that resets the trip, once its cause is cleared, before the step that needs the output;
or use another way that the trip does not block.`,
    examples: {
      bad: "interlocks: [{ tag: PSHH-210, latches: true, holds: { XV-2102: closed } }]\nkind: emergency-shutdown\nsteps: [{ step: set-blanket, state: { XV-2102: open } }]",
      good: 'steps: [{ step: reset-trip, resets: [PSHH-210] }, { step: set-blanket, state: { XV-2102: open } }]',
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
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
