// Reports a unit Stepwright does not know, in a condition, setpoint, limit or signal declaration.
import { defineFileRule } from '../define-rule.ts';
import { isKnownUnit, unitHint } from '../../analysis/units.ts';
import { reportProblemsOfKind } from '../report-condition-problems.ts';

export default defineFileRule(
  {
    id: 'unknown-unit',
    summary: 'A unit is not one Stepwright knows.',
    category: 'conditions',
    defaultSeverity: 'error',
    source: 'NIST SP 811, Guide for the Use of the International System of Units, Appendix B (conversion factors)',
    docs: `Only the units listed in the format reference are read: degC degF K; Pa kPa MPa bar mbar psi atm mmHg Torr
inHg and the gauge (kPag barg psig ...) and absolute (kPaa bara psia ...) forms; mg g kg t lb; mL L m3 USgal bbl;
s min h d; percent or %, ppm; mm m kW rpm A V gpm; and two of them joined by one '/' (kg/h, m3/h, mg/g). Anything
else is refused with the spelling to use instead: \`C\` is not degC (a unit library reads it as the coulomb), \`mt\`
is not the metric tonne (it reads as a millitonne), \`gal\` does not say which gallon, and \`ton\` has three
meanings. Unit names are case-sensitive (\`degC\`, not \`DEGC\`). The spelling suggested is the same wherever the
quantity is written (a condition, a limit, a setpoint, the register), and fits the signal: on a pressure in barg,
\`5 C\` is not answered with degC (a temperature) but with the signal's own kind of unit. A unit written apart
(\`bar g\`, \`kPa(g)\`, \`deg C\`) is told to be written as one word (\`barg\`, \`kPag\`, \`degC\`).`,
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
          hint: unitHint(signal.unit),
        });
      }
    }
  },
);
