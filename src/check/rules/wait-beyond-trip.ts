// Reports a step whose `until` waits for values at which an interlock trips, or that lie outside the operating
// limits, whatever the other signals do: the step can only end with the plant tripped, or out of its limits.
import type { Condition } from '../../analysis/conditions/ast.ts';
import { comparisonsIn } from '../../analysis/conditions/parse.ts';
import { isEmpty, subtract, type IntervalSet } from '../../analysis/decisions/interval-set.ts';
import { NotAnalysable, type SignalInfo } from '../../analysis/decisions/signal-space.ts';
import { tripSets, valuesWhereTrue } from '../../analysis/signal-levels.ts';
import { limitBounds } from '../limit-bounds.ts';
import { unnamedRegisterTrips } from '../register-trips.ts';
import { defineFileRule } from '../define-rule.ts';
import { stoppingKinds } from '../../model/kinds.ts';

/**
 * What a condition gives, by its text and the declarations of the signals it names: the same wait or trip written in
 * many procedures (a shared operation's copies, every procedure of one unit) is worked out once.
 */
const worked = new Map<string, unknown>();

function memo<T>(kind: string, text: string, condition: Condition, signals: Readonly<Record<string, SignalInfo>>, work: () => T): T {
  const declared = [...new Set(comparisonsIn(condition).map((c) => c.name.name))].sort().map((n) => {
    const s = signals[n];
    return s ? [n, s.unit ?? '', s.range ?? null, s.values ?? null] : [n];
  });
  const key = `${kind}\u0000${text}\u0000${JSON.stringify(declared)}`;
  let found = worked.get(key) as T | undefined;
  if (found === undefined) {
    found = work();
    if (worked.size >= 20_000) worked.clear();
    worked.set(key, found);
  }
  return found;
}

/** Whether every value of `a` lies in `b` (and `a` has some). */
function within(a: IntervalSet, b: IntervalSet): boolean {
  return !isEmpty(a) && isEmpty(subtract(a, b));
}

export default defineFileRule(
  {
    id: 'wait-beyond-trip',
    summary: "A step's until waits for values at which an interlock trips, or outside the operating limits.",
    category: 'limits',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(iv): safety systems and their functions; (f)(1)(iii): operating limits and the consequences of deviation',
    docs: `A step that waits until a signal reaches values at which an interlock trips can only end with the plant
tripped: followed as written it trips the plant, or tempts an operator to bypass the trip to finish the step. The
set of values at which the step's \`until\` can be true is worked out for each signal it compares (whatever the other
signals do, after unit conversion) and compared with the values at which each trip acts — the procedure's own
interlocks and the register's trips and relief devices on that signal, named or not. When every value that ends the
step trips the plant, that is an error. When every such value lies above the signal's high operating limit, the
step can only end out of limits: a warning. A wait that can also end at values clear of the trips and inside the
limits is not reported. Not reported either, because they are what the procedure is for: in \`shutdown\`,
\`emergency-shutdown\` and \`emergency\` procedures, a wait for a signal to fall (a flow or a pressure falling through
its low trip as the plant stops); and in every procedure, a wait below a low operating limit (a flow falling below
its running limit as a transfer ends). A wait whose values cannot be worked out (too many cases, a signal compared
with numbers and words) is not judged, and an info line names it and the signals it was not compared on.`,
    examples: {
      bad: "limits: {TI-210: {high: 245 degC}}\ninterlocks: [{tag: TSHH-210, trips-when: 'TI-210 >= 255 degC'}]\nsteps: [{step: heat, do: Heat the kettle, until: 'TI-210 >= 260 degC'}]",
      good: "steps: [{step: heat, do: Heat the kettle, until: 'TI-210 >= 238 degC'}]",
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const signals = ctx.procedure.signals;
    const trips = ctx.facts.conditions.filter((c) => c.role === 'trips-when' && c.result.ok && c.problems.length === 0);
    const bounds = limitBounds(ctx.facts);
    const tripValues = new Map<string, Map<string, IntervalSet>>();
    const valuesOfTrip = (key: string, condition: Condition) => {
      let sets = tripValues.get(key);
      if (!sets) {
        sets = memo('trip', key, condition, signals, () => {
          try {
            return tripSets(condition, signals);
          } catch (error) {
            if (!(error instanceof NotAnalysable)) throw error;
            return new Map();
          }
        });
        tripValues.set(key, sets);
      }
      return sets;
    };
    const stopping = stoppingKinds.has(String(ctx.procedure.kind));
    // Only a wait on a signal that has a trip or a high limit can be reported: others are passed over unread.
    const guarded = new Set<string>();
    for (const trip of trips) if (trip.result.ok) for (const c of comparisonsIn(trip.result.condition)) guarded.add(c.name.name);
    for (const [signal, limit] of bounds) if (limit.high) guarded.add(signal);
    const registerGuards = (signal: string) => unnamedRegisterTrips(ctx.register, ctx.procedure!, signal).length > 0;
    for (const site of ctx.facts.conditions) {
      if (site.role !== 'until' || !site.result.ok || site.problems.length) continue;
      const names = comparisonsIn(site.result.condition).filter((c) => c.value.kind === 'quantity').map((c) => c.name.name);
      if (!names.some((n) => guarded.has(n) || registerGuards(n))) continue;
      const condition = site.result.condition;
      const ending = memo('wait', site.text, condition, signals, () => valuesWhereTrue(condition, signals));
      if (!ending.ok) {
        // Never passed over in silence: the reviewer learns which wait was not compared with its trips and limits.
        const on = [...new Set(names.filter((n) => guarded.has(n) || registerGuards(n)))].join(', ');
        ctx.report({
          path: site.path,
          severity: 'info',
          message: `The values at which step '${site.owner}' can end (until ${site.text}) could not be worked out (${ending.reason}), so they were not compared with the trips and high limits on ${on}.`,
          hint: 'Split the wait into simpler conditions (one signal against one value, joined by and), or check it against the trips by hand.',
        });
        continue;
      }
      for (const [signal, values] of ending.values) {
        // A wait for a signal to fall (every value that ends it is below some value): in a procedure that stops the
        // plant, flows and pressures falling through their low trips is what stopping does.
        if (stopping && values.every((part) => part.hi !== Infinity)) continue;
        let tripped = false;
        for (const trip of trips) {
          if (!trip.result.ok) continue;
          const at = valuesOfTrip(`${trip.owner}\u0000${trip.text}`, trip.result.condition).get(signal);
          if (!at || !within(values, at)) continue;
          tripped = true;
          ctx.report({
            path: site.path,
            message: `Step '${site.owner}' waits until ${site.text}, and at every value of ${signal} that ends it interlock ${trip.owner} trips (${trip.text}): the step can only end with the plant tripped.`,
            hint: 'Wait for a value clear of the trip, with a margin; never plan to run a step to a trip point.',
            related: [{ path: trip.path, message: `trip condition of ${trip.owner}` }],
          });
        }
        for (const trip of unnamedRegisterTrips(ctx.register, ctx.procedure, signal)) {
          const at = valuesOfTrip(`register\u0000${trip.tag}\u0000${trip.text}`, trip.condition).get(signal);
          if (!at || !within(values, at)) continue;
          tripped = true;
          ctx.report({
            path: site.path,
            message: `Step '${site.owner}' waits until ${site.text}, and at every value of ${signal} that ends it ${trip.tag} of the plant register acts (${trip.text}); the procedure does not name ${trip.tag}.`,
            hint: `Wait for a value clear of the trip, with a margin, and list ${trip.tag} under 'uses' so the operator sees it.`,
            related: [trip.related],
          });
        }
        // Beyond a high limit only: an operation's end routinely takes a flow or a level below its running limit.
        const high = bounds.get(signal)?.high;
        if (tripped || !high || !within(values, [{ lo: high.base, hi: Infinity, loOpen: true, hiOpen: true }])) continue;
        ctx.report({
          path: site.path,
          severity: 'warning',
          message: `Step '${site.owner}' waits until ${site.text}, and every value of ${signal} that ends it is above its high operating limit ${high.text}: the step can only end out of limits.`,
          hint: 'Wait for a value inside the operating limits, or change the limits through management of change.',
          related: [{ path: high.path, message: 'high operating limit' }],
        });
      }
    }
  },
);
