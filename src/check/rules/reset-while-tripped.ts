// Reports a step that resets a latching trip while the trip's cause can still be present there, on some path; a
// reset of a shared latch (trips that start one latching register function) is judged against each of its trips.
import type { Region } from '../../analysis/decisions/signal-space.ts';
import { resetsWithCausePresent } from '../../analysis/state/state-findings.ts';
import { sharedLatches } from '../../analysis/state/state-input.ts';
import type { PathKey } from '../../parse/read-source.ts';
import { defineFileRule } from '../define-rule.ts';
import { showPath } from '../state-path.ts';

export default defineFileRule(
  {
    id: 'reset-while-tripped',
    summary: "A step resets a latching trip while the trip's condition can still be true there.",
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(iv): safety systems and their functions; common practice: a latched trip is reset only once its cause has been found and cleared',
    docs: `A latching trip (\`latches: true\`, or a plant-register safety function the procedure uses that latches)
stays in force until a step resets it (\`resets: [TSHH-210]\`). Resetting it while its cause is still present
either trips the plant again at once or, where the outputs follow the reset, restarts what the trip stopped with
the hazard still there; an operator who sees the reset fail is tempted to bypass the trip.

Stepwright follows every path to each step that resets a latching trip and reports the step when the trip's
\`trips-when\` can still be true while the step is active, with the path that leads there and the values at which
it holds. The reset is taken to happen when the step starts, so the step's own \`until\` does not clear the cause; the
step's \`needs\` does (step-need-unmet reports a need that may fail). The condition is judged by its values, however
it is written (\`TI-210 >= 255 degC\`, \`not (TI-210 < 255 degC)\` and \`TI-210 >= 491 degF\` are the same trip). It is
an error in every kind of procedure: an emergency procedure resets trips too, and starts with the cause possibly
present. A trip whose condition cannot be analysed (or that has none) is not judged, and an info line says so at the
reset.

Trips that latch through one plant-register function share its latch: TSHH-210, PSHH-210 and HS-2190 each start
ESD-210, which latches, and its reset at the panel resets the shutdown whichever trip caused it. So a reset of any
of them, or of the function itself (\`resets: [ESD-210]\`, when the procedure uses it), is judged against every trip
that the register says starts the function: cooling below the temperature trip is not enough while the pressure
or the push-button can still be at its trip. A trip whose signals the procedure does not declare is named in an
info line at the reset.

Fix it with a step before the reset whose \`until\` brings the signal back clear of the trip
(\`until: TI-210 <= 200 degC\`), or a \`needs\` on the reset step that says the cause has cleared.`,
    examples: {
      bad: "interlocks: [{ tag: TSHH-210, trips-when: 'TI-210 >= 255 degC', latches: true }]\nsteps: [{ step: reset-trip, resets: [TSHH-210] }]",
      good: "steps:\n  - { step: cool, until: 'TI-210 <= 200 degC' }\n  - { step: reset-trip, resets: [TSHH-210] }",
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || !ctx.facts) return;
    const resetting = ctx.facts.steps.filter(({ step }) => (step.resets ?? []).length > 0);
    if (!resetting.length) return;
    const latching = new Map(p.interlocks.filter((i) => i.latches).map((i) => [i.tag, i]));
    // A trip that latches through a function (TSHH-210 starts ESD-210) shares that function's latch: its reset
    // resets the function, so it is judged against every trip that starts the function, and a step may name the
    // function itself. Common practice: a shutdown is reset once every cause of it has cleared.
    const shared = sharedLatches(p);
    const causesOf = (reset: string): string[] => {
      const fn = latching.get(reset)?.latchesThrough ?? (shared.has(reset) && !latching.has(reset) ? reset : undefined);
      return fn ? [...new Set([...(latching.has(reset) ? [reset] : []), ...(shared.get(fn) ?? []), ...startersOf(fn)])] : [reset];
    };
    const startersOf = (fn: string): string[] => [...(ctx.register?.safetyFunctions.values() ?? [])].filter((f) => f.starts === fn && f.tripsWhen).map((f) => f.id);
    const causeText = new Map<string, { text: string; path?: PathKey[] }>();
    for (const [tag, i] of latching) causeText.set(tag, { text: i.tripsWhen.value.trim(), path: i.tripsWhen.path });
    for (const { step } of resetting) {
      for (const r of step.resets!) {
        for (const c of causesOf(r.value)) {
          const fn = ctx.register?.safetyFunctions.get(c);
          if (!causeText.has(c) && fn?.tripsWhen) causeText.set(c, { text: fn.tripsWhen.value.trim() });
        }
      }
    }
    if (!resetting.some(({ step }) => step.resets!.some((r) => causesOf(r.value).some((c) => causeText.has(c))))) return;
    const analysis = ctx.facts.state;
    const regions = new Map<string, Region>();
    const notJudged = new Map<string, string>();
    for (const [tag, { text }] of causeText) {
      if (!text) {
        notJudged.set(tag, 'it states no trip condition');
        continue;
      }
      const region = analysis.regionOf(text);
      if (region) {
        regions.set(tag, region);
        continue;
      }
      const site = ctx.facts.conditions.find((c) => c.role === 'trips-when' && c.owner === tag);
      const why = site && !site.result.ok ? `it cannot be read: ${site.result.error.message}` : analysis.whyNotAnalysed(text) ?? 'it cannot be analysed';
      notJudged.set(tag, `its condition ${text} could not be analysed against the plant state (${why})`);
    }
    // Never passed over in silence: each reset of a trip that could not be judged says so where it is written.
    for (const { step } of resetting) {
      for (const r of step.resets!) {
        for (const c of causesOf(r.value)) {
          const why = notJudged.get(c);
          if (!why) continue;
          ctx.report({
            path: r.path,
            severity: 'info',
            message: c === r.value
              ? `Step '${step.id}' resets ${r.value}, but whether the trip's cause can still be present there was not checked: ${why}.`
              : `Step '${step.id}' resets ${r.value}, which also resets ${c} (the same latch), but whether the cause of ${c} can still be present there was not checked: ${why}.`,
          hint: 'Correct the trip condition as the other diagnostics on it say (or declare its signals); until then make sure by hand that a step before the reset brings the signal clear of the trip.',
          });
        }
      }
    }
    for (const f of resetsWithCausePresent(analysis, ctx.facts.graph, regions, causesOf)) {
      const cause = causeText.get(f.trip)!;
      const at = f.step.resets!.find((r) => r.value === f.reset)!;
      const through = f.reset === f.trip ? '' : ` (it resets ${f.reset}, which shares the latch of ${f.trip})`;
      ctx.report({
        path: at.path,
        message: `Step '${f.step.id}' resets latching trip ${f.trip}${through}, but its condition ${cause.text} can still be true there (${f.values}): the reset may be tried with the cause present. Path: ${showPath(f.path)}.`,
        hint: `Add a step before the reset whose until brings the signal clear of the trip, or a needs on this step that the cause of ${f.trip} has cleared.`,
        related: cause.path ? [{ path: cause.path, message: `trip condition of ${f.trip}` }] : [],
        trace: f.path,
      });
    }
  },
);
