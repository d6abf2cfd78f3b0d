// Reports an operating limit or alarm at or beyond a trip on the same signal, in the trip's direction.
import { describeLevel, levelNote, levelsOutOfOrder } from '../../analysis/signal-levels.ts';
import { defineManualRule } from '../define-rule.ts';
import { capitalize, checkLevels, relatedOf, reportAtPlace } from '../report-level.ts';

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
or the trip is wrong. Trips are read from the trip condition: one comparison, or each comparison of an \`or\`
(a comparison inside \`and\` trips only together with something else and is not judged). Units are converted
exactly before comparing; a gauge and an absolute pressure are compared through the standard atmosphere
(101.325 kPa) and the message says so.

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
      const beyond = level.side === 'high' ? 'at or above' : 'at or below';
      const why = level.kind === 'alarm'
        ? 'the alarm would come only after the trip, too late for the operator to act'
        : 'running at the limit would trip the plant, and the limit leaves no room to correct a deviation before the trip';
      reportAtPlace(ctx, reportAt.at, file, {
        message: `${capitalize(describeLevel(level))} is ${beyond} ${describeLevel(against)}: ${why}${levelNote(level, against)}.`,
        hint: `Keep the ${level.side} ${level.kind === 'alarm' ? 'alarm' : 'operating limit'} ${level.side === 'high' ? 'below' : 'above'} the trip. Correct the value that is wrong through management of change.`,
        related: [relatedOf(other, other.kind === 'trip' ? `trip ${other.owner ?? ''}`.trim() : `${other.side} ${other.kind}`, ctx.register)],
      });
    });
  },
);
