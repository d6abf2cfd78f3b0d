// Reports a setpoint at or beyond an interlock trip: running the step as written would trip the plant.
import { evaluateCondition } from '../../analysis/evaluate-condition.ts';
import { pressureConversionNote, toBase } from '../../analysis/units.ts';
import { comparisonsIn } from '../../analysis/conditions/parse.ts';
import { defineFileRule } from '../define-rule.ts';
import { unnamedRegisterTrips } from '../register-trips.ts';

export default defineFileRule(
  {
    id: 'setpoint-at-trip',
    summary: 'A setpoint would itself make an interlock trip.',
    category: 'limits',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(iv): safety systems and their functions',
    docs: `A step that sets a signal to a value at which an interlock trips will trip the plant when followed as
written — or tempts an operator to bypass the interlock. The setpoint is compared with every interlock's
\`trips-when\` condition after unit conversion; the condition is evaluated with the setpoint in place of the signal.
Trips and relief devices of the plant register on the same signal count too, whether or not the procedure names
them: they act in the plant all the same.`,
    examples: { bad: "trips-when: TI-210 >= 255 degC\nset: {TI-210: 255 degC}", good: 'set: {TI-210: 238 degC}' },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const trips = ctx.facts.conditions.filter((c) => c.role === 'trips-when' && c.result.ok && c.problems.length === 0);
    for (const site of ctx.facts.quantities) {
      if (site.role !== 'setpoint' || !site.quantity || site.problems.length) continue;
      const base = toBase(site.quantity.value, site.quantity.unit);
      if (base === null) continue;
      const known = new Map([[site.signal, { kind: 'number' as const, base }]]);
      for (const trip of trips) {
        if (!trip.result.ok) continue;
        if (evaluateCondition(trip.result.condition, known) !== true) continue;
        ctx.report({
          path: site.path,
          message: `Step '${site.step}' sets ${site.signal} to ${site.text}, where interlock ${trip.owner} trips (${trip.text})${noteFor(site.quantity.unit, trip.result.condition, site.signal)}.`,
          hint: 'Keep setpoints clear of interlock trips with a margin; never plan to run at a trip point.',
          related: [{ path: trip.path, message: `trip condition of ${trip.owner}` }],
        });
      }
      for (const trip of unnamedRegisterTrips(ctx.register, ctx.procedure, site.signal)) {
        if (evaluateCondition(trip.condition, known) !== true) continue;
        ctx.report({
          path: site.path,
          message: `Step '${site.step}' sets ${site.signal} to ${site.text}, where ${trip.tag} of the plant register acts (${trip.text})${noteFor(site.quantity.unit, trip.condition, site.signal)}; the procedure does not name ${trip.tag}.`,
          hint: `Keep setpoints clear of trips with a margin, and list ${trip.tag} under 'uses' so the operator sees it.`,
          related: [trip.related],
        });
      }
    }
  },
);

/** The gauge/absolute note when the trip compares the same signal in the other reference. */
function noteFor(unit: string, condition: Parameters<typeof comparisonsIn>[0], signal: string): string {
  for (const cmp of comparisonsIn(condition)) {
    if (cmp.name.name === signal && cmp.value.kind === 'quantity') {
      const note = pressureConversionNote(unit, cmp.value.unit);
      if (note) return note;
    }
  }
  return '';
}
