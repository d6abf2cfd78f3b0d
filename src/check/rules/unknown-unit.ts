// Reports a unit Stepwright does not know, in a condition, setpoint, limit or signal declaration.
import { defineFileRule } from '../define-rule.ts';
import { isKnownUnit } from '../../analysis/units.ts';
import { reportProblemsOfKind } from '../report-condition-problems.ts';

export default defineFileRule(
  {
    id: 'unknown-unit',
    summary: 'A unit is not one Stepwright knows.',
    category: 'conditions',
    defaultSeverity: 'error',
    docs: `Units are written as in the format reference: degC degF K, Pa kPa MPa bar psi mmHg Torr atm, kg g lb t,
L m3 gal, s min h, percent or %, mg/g, kg/h, L/min, m3/h and their combinations. Unit names are case-sensitive
(\`degC\`, not \`DEGC\`).`,
    examples: { bad: 'unit: celsius', good: 'unit: degC' },
  },
  (ctx) => {
    reportProblemsOfKind(ctx, ['unknown-unit']);
    if (!ctx.procedure) return;
    for (const signal of Object.values(ctx.procedure.signals)) {
      if (!signal.from && signal.unit && !isKnownUnit(signal.unit)) {
        ctx.report({
          path: [...signal.path, 'unit'],
          message: `Signal '${signal.name}' has unit '${signal.unit}', which Stepwright does not know.`,
          hint: 'Use a unit from the format reference, e.g. degC, bar, kg, m3/h, percent.',
        });
      }
    }
  },
);
