// Reports an operating limit, alarm or trip at or above the set pressure of a relief device on the same signal.
import { describeLevel, levelNote, levelsOutOfOrder } from '../../analysis/signal-levels.ts';
import { defineManualRule } from '../define-rule.ts';
import { capitalize, checkLevels, relatedOf, reportAtPlace, reportTripsNotAnalysed } from '../report-level.ts';

export default defineManualRule(
  {
    id: 'limit-beyond-relief',
    summary: 'An operating limit, alarm or trip lies at or above the set pressure of a relief device on the same signal.',
    category: 'limits',
    defaultSeverity: 'error',
    source: 'IEC 61511-1 / ANSI/ISA-84.00.01 (layers of protection: the relief device is the last layer, after the trip); ASME BPVC Section VIII (relief set at or below the maximum allowable working pressure)',
    docs: `A relief device (\`relief-devices\` in the register, with the pressure \`signal\` it watches) is the last
layer of protection: it lifts only when the operating limits, the alarm and the trip have all failed to hold the
pressure. An operating limit, alarm or trip at or above its set pressure means the device lifts during normal
operation, or before the trip can act. A high limit of 11 bar under a relief valve set at 10 bar is one example.
The set pressure is usually gauge and the signal may be absolute: the comparison converts through the standard
atmosphere (101.325 kPa) and says so in the message. A trip is judged by the values at which it trips (its lowest
high trip value, however the condition is written, as in \`limit-beyond-trip\`); a trip on a relieved signal whose
condition cannot be read as values is not judged, and the rule says so (info).`,
    examples: {
      bad: 'signals:\n  PI-250: { unit: barg, limits: { high: 11 barg } }\nrelief-devices:\n  PSV-250: { set-pressure: 10 barg, signal: PI-250 }',
      good: 'signals:\n  PI-250: { unit: barg, limits: { high: 8 barg } }\nrelief-devices:\n  PSV-250: { set-pressure: 10 barg, signal: PI-250 }',
    },
  },
  (ctx) => {
    checkLevels(ctx, (levels) => levelsOutOfOrder(levels, ['relief']), ({ level, against }, file) => {
      if (!against) return;
      const reportAt = !level.at.inRegister || against.at.inRegister ? level : against;
      const other = reportAt === level ? against : level;
      const why = level.kind === 'trip' ? 'the relief device would lift before the trip acts' : 'the relief device would lift within normal operation';
      reportAtPlace(ctx, reportAt.at, file, {
        message: `${capitalize(describeLevel(level))} is at or above ${describeLevel(against)}: ${why}${levelNote(level, against)}.`,
        hint: `Keep the order operating limit < alarm < trip < relief set pressure. Correct the value that is wrong through management of change.`,
        related: [relatedOf(other, other.kind === 'relief' ? `relief device ${other.owner ?? ''}`.trim() : `${other.side} ${other.kind}`, ctx.register)],
      });
    });
    // A trip on a signal with a relief device that could not be read was not compared with the set pressure.
    const relieved = new Set([...(ctx.register?.reliefDevices.values() ?? [])].map((d) => d.signal).filter((s): s is string => !!s));
    if (relieved.size) reportTripsNotAnalysed(ctx, 'with the relief set pressure', (trip) => [...relieved].some((s) => namesSignal(trip.condition, s)));
  },
);

/** Whether a condition's text names the signal (as a whole name, not part of a longer one). */
function namesSignal(condition: string, signal: string): boolean {
  const escaped = signal.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  return new RegExp(`(^|[^A-Za-z0-9_-])${escaped}($|[^A-Za-z0-9_-])`).test(condition);
}
