// Reports an operating limit or alarm at or beyond a trip on the same signal, in the trip's direction.
import { describeLevel, levelNote, levelsOutOfOrder, type Level } from '../../analysis/signal-levels.ts';
import { formatNumber, fromBase } from '../../analysis/units.ts';
import { defineManualRule } from '../define-rule.ts';
import { capitalize, checkLevels, relatedOf, reportAtPlace, reportTripsNotAnalysed } from '../report-level.ts';

export default defineManualRule(
  {
    id: 'limit-beyond-trip',
    summary: 'An operating limit or alarm lies at or beyond a trip on the same signal (a high limit at or above a high trip, a low one at or below a low trip).',
    category: 'limits',
    defaultSeverity: 'error',
    source: 'IEC 61511-1 / ANSI/ISA-84.00.01 (layers of protection: the process stays within its operating limits, the alarm and operator act next, the safety instrumented function last); OSHA 29 CFR 1910.119(f)(1)(ii)',
    docs: `On each side of a signal the levels keep one order: the operating limit first, then the alarm, then the
trip. A high operating limit at or above the high trip (or a low one at or below the low trip) means running at
the limit trips the plant, and a high alarm at or above the trip warns only after the shutdown. Either the limit
or the trip is wrong.

A trip is judged by the set of values at which it trips, not by how its condition is written: \`TI-901 >= 180 degC\`,
\`not (TI-901 < 180 degC)\` and \`TI-901 >= 356 degF\` are the same trip. Values at which the trip acts on a signal
whatever the other signals do, and without an upper end, make a high trip; without a lower end, a low trip. A trip
that acts only between two values (\`TI-901 >= 180 degC and TI-901 <= 300 degC\`) is a band: a limit or alarm inside
the band is reported (a limit outside it is not, since the rule cannot tell from which side the process comes). A
trip that acts on a signal only together with another condition (\`PI-253 >= 400 kPag and burner-on == true\`)
sets no level on that signal and is not judged against it; the rule says so (info), so that its level is compared
with the limits of the mode it acts in by hand. A trip whose condition cannot be read as values (an
undeclared name, a unit that does not fit the signal, too many cases) is not judged, and the rule says so (info),
next to the other diagnostics on that condition. Units are converted exactly before comparing; a gauge and an
absolute pressure are compared through the standard atmosphere (101.325 kPa) and the message says so.

The rule looks at the register (each problem once, in the register file) and at every procedure (a limit or trip
the procedure declares itself, against its own and the register's levels).`,
    examples: {
      bad: 'limits:\n  PI-250: { high: 1200 kPag }\ninterlocks:\n  - { tag: PSHH-250, trips-when: PI-250 >= 900 kPag }',
      good: 'limits:\n  PI-250: { high: 800 kPag }\ninterlocks:\n  - { tag: PSHH-250, trips-when: PI-250 >= 900 kPag }',
    },
  },
  (ctx) => {
    checkLevels(ctx, (levels) => levelsOutOfOrder(levels, ['trip']), ({ level, against }, file) => {
      if (!against) return;
      const reportAt = !level.at.inRegister || against.at.inRegister ? level : against;
      const other = reportAt === level ? against : level;
      const where = against.band
        ? `inside the values at which ${describeLevel(against)} acts${bandText(against)}`
        : `${against.side === 'high' ? 'at or above' : 'at or below'} ${describeLevel(against)}`;
      const why = level.kind === 'alarm'
        ? 'the alarm would come only after the trip, too late for the operator to act'
        : 'running at the limit would trip the plant, and the limit leaves no room to correct a deviation before the trip';
      const toward = against.band ? 'outside the values at which the trip acts, on the side of normal running' : level.side === 'high' ? 'below the trip' : 'above the trip';
      reportAtPlace(ctx, reportAt.at, file, {
        message: `${capitalize(describeLevel(level))} is ${where}: ${why}${levelNote(level, against)}.`,
        hint: `Keep the ${level.side} ${level.kind === 'alarm' ? 'alarm' : 'operating limit'} ${toward}. Correct the value that is wrong through management of change.`,
        related: [relatedOf(other, other.kind === 'trip' ? `trip ${other.owner ?? ''}`.trim() : `${other.side} ${other.kind}`, ctx.register)],
      });
    });
    reportTripsNotAnalysed(ctx, 'with the operating limits and alarms');
  },
);

/** " (180..300 degC)" for a band trip, in the unit its signal's levels are written in. */
function bandText(trip: Level): string {
  if (!trip.band || !trip.unit || !Number.isFinite(trip.band.low) || !Number.isFinite(trip.band.high)) return '';
  const low = fromBase(trip.band.low, trip.unit);
  const high = fromBase(trip.band.high, trip.unit);
  return low === null || high === null ? '' : ` (${formatNumber(low)}..${formatNumber(high)} ${trip.unit})`;
}
