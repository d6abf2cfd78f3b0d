// Reports a setpoint outside the operating limits of its signal, after converting units.
import { convertedFor, limitBounds } from '../limit-bounds.ts';
import { toBase, pressureConversionNote } from '../../analysis/units.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'setpoint-outside-limits',
    summary: "A setpoint lies outside its signal's operating limits (after unit conversion).",
    category: 'limits',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(ii): operating limits',
    docs: `Operating limits say where the process may run; a step must never ask for a setpoint beyond them.
The setpoint and the limits may be written in different units (degF against degC, psi against bar): both are
converted exactly before they are compared.`,
    examples: { bad: 'limits: {TI-210: {high: 245 degC}}\nset: {TI-210: 250 degC}', good: 'set: {TI-210: 238 degC}' },
  },
  (ctx) => {
    if (!ctx.facts) return;
    const bounds = limitBounds(ctx.facts);
    for (const site of ctx.facts.quantities) {
      if (site.role !== 'setpoint' || !site.quantity || site.problems.length) continue;
      const limit = bounds.get(site.signal);
      const value = toBase(site.quantity.value, site.quantity.unit);
      if (!limit || value === null) continue;
      const unit = ctx.procedure?.signals[site.signal]?.unit;
      const shown = unit && unit !== site.quantity.unit ? ` (${convertedFor(site.quantity, unit, limit)})` : '';
      if (limit.high && value > limit.high.base) {
        ctx.report({
          path: site.path,
          message: `Step '${site.step}' sets ${site.signal} to ${site.text}${shown}, above its high operating limit ${limit.high.text}${pressureConversionNote(site.quantity.unit, limit.high.unit)}.`,
          hint: 'Lower the setpoint to within the operating limits, or change the limits through management of change.',
          related: [{ path: limit.high.path, message: 'high operating limit' }],
        });
      } else if (limit.low && value < limit.low.base) {
        ctx.report({
          path: site.path,
          message: `Step '${site.step}' sets ${site.signal} to ${site.text}${shown}, below its low operating limit ${limit.low.text}${pressureConversionNote(site.quantity.unit, limit.low.unit)}.`,
          hint: 'Raise the setpoint to within the operating limits, or change the limits through management of change.',
          related: [{ path: limit.low.path, message: 'low operating limit' }],
        });
      }
    }
  },
);
