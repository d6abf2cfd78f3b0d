// Reports a step parameter that sets a signal to a value outside its operating limits, or at one of its trips.
import { evaluateCondition } from '../../analysis/evaluate-condition.ts';
import { pressureConversionNote, toBase } from '../../analysis/units.ts';
import { defineFileRule } from '../define-rule.ts';
import { convertedFor, limitBounds } from '../limit-bounds.ts';
import { unnamedRegisterTrips } from '../register-trips.ts';

export default defineFileRule(
  {
    id: 'param-outside-limits',
    summary: "A step parameter that sets a signal lies outside the signal's operating limits, or at one of its trips.",
    category: 'limits',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(ii): operating limits; (f)(1)(iv): safety systems and their functions',
    docs: `A step's \`params\` pass values to a phase or another unit (the hot-oil supply temperature a heater should
deliver). A parameter is a setpoint in other words when its name is a signal (\`params: { TI-220: 270 degC }\`),
or when the plant register gives its name to a signal (\`params: [hot-oil-supply]\` under the signal). Such a
parameter is converted into the signal's unit and checked like a setpoint: within the operating limits, and not
at a value where a trip acts (a trip or relief device of the register on that signal counts even when the
procedure does not name it). Its unit must be of the signal's kind (\`unit-mismatch\`, \`unknown-unit\`).
Parameters that name no signal stay free text.`,
    examples: {
      bad: "signals:\n  TI-220: { unit: degC, limits: { high: 290 degC }, params: [hot-oil-supply] }   # register\nparams: { hot-oil-supply: 300 degC }",
      good: 'params: { hot-oil-supply: 270 degC }',
    },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    const bounds = limitBounds(ctx.facts);
    const trips = ctx.facts.conditions.filter((c) => c.role === 'trips-when' && c.result.ok && c.problems.length === 0);
    for (const site of ctx.facts.quantities) {
      if (site.role !== 'param' || !site.quantity || site.problems.length) continue;
      const value = toBase(site.quantity.value, site.quantity.unit);
      if (value === null) continue;
      const unit = ctx.procedure.signals[site.signal]?.unit;
      const limit = bounds.get(site.signal);
      const shown = unit && unit !== site.quantity.unit ? ` (${convertedFor(site.quantity, unit, limit)})` : '';
      const what = site.param === site.signal ? `parameter ${site.signal}` : `parameter '${site.param}' (${site.signal})`;
      const side = limit?.high && value > limit.high.base ? 'high' : limit?.low && value < limit.low.base ? 'low' : undefined;
      if (side) {
        const bound = limit![side]!;
        ctx.report({
          path: site.path,
          message: `Step '${site.step}' sets ${what} to ${site.text}${shown}, ${side === 'high' ? 'above' : 'below'} its ${side} operating limit ${bound.text}${pressureConversionNote(site.quantity.unit, bound.unit)}.`,
          hint: 'Bring the parameter within the operating limits, or change the limits through management of change.',
          related: [{ path: bound.path, message: `${side} operating limit` }],
        });
        continue;
      }
      const known = new Map([[site.signal, { kind: 'number' as const, base: value }]]);
      for (const trip of trips) {
        if (!trip.result.ok || evaluateCondition(trip.result.condition, known) !== true) continue;
        ctx.report({
          path: site.path,
          message: `Step '${site.step}' sets ${what} to ${site.text}${shown}, where interlock ${trip.owner} trips (${trip.text}).`,
          hint: 'Keep parameters clear of interlock trips with a margin.',
          related: [{ path: trip.path, message: `trip condition of ${trip.owner}` }],
        });
      }
      for (const trip of unnamedRegisterTrips(ctx.register, ctx.procedure, site.signal)) {
        if (evaluateCondition(trip.condition, known) !== true) continue;
        ctx.report({
          path: site.path,
          message: `Step '${site.step}' sets ${what} to ${site.text}${shown}, where ${trip.tag} of the plant register acts (${trip.text}); the procedure does not name ${trip.tag}.`,
          hint: `Keep parameters clear of trips with a margin, and list ${trip.tag} under 'uses'.`,
          related: [trip.related],
        });
      }
    }
  },
);
