// Reports an operating limit, alarm, trip or relief set pressure outside the range of the signal's instrument.
import { describeLevel, levelsOutsideRange, type Level } from '../../analysis/signal-levels.ts';
import { pressureConversionNote } from '../../analysis/units.ts';
import { defineManualRule } from '../define-rule.ts';
import { capitalize, checkLevels, reportAtPlace } from '../report-level.ts';

export default defineManualRule(
  {
    id: 'limit-outside-range',
    summary: "An operating limit, alarm, trip or relief set pressure lies outside the signal's range.",
    category: 'limits',
    defaultSeverity: 'error',
    source: 'Common practice: a transmitter is ranged to read every level the process relies on, including the trip and the relief set pressure',
    docs: `A signal's \`range\` is what its instrument can read. A limit, alarm or trip outside it can never be
seen by the instrument (a 320 degC trip on a 0–300 degC transmitter never trips), and a relief set pressure above
the range means the board loses the pressure before the relief device lifts. Values are converted into the
signal's unit before comparing. Trip conditions written in a procedure are judged by \`threshold-outside-range\`;
this rule covers the register's levels and the limits a procedure declares.`,
    examples: {
      bad: 'signals:\n  TI-220: { unit: degC, range: [0, 300] }\nsafety-functions:\n  TSHH-220: { trips-when: TI-220 >= 320 degC }',
      good: 'signals:\n  TI-220: { unit: degC, range: [0, 350] }\nsafety-functions:\n  TSHH-220: { trips-when: TI-220 >= 320 degC }',
    },
  },
  (ctx) => {
    checkLevels(ctx, (levels, signal, where) => {
      const declared = where.file ? where.file.procedure?.signals[signal] : ctx.register?.signals.get(signal);
      if (!declared?.range || !declared.unit) return [];
      // In a procedure, its own trips are threshold-outside-range's; here only its limits.
      const judged = where.file ? levels.filter((l: Level) => l.kind !== 'trip' || l.at.inRegister) : levels;
      return levelsOutsideRange(judged, declared.range, declared.unit);
    }, ({ level }, file) => {
      const signal = file ? file.procedure?.signals[level.signal] : ctx.register?.signals.get(level.signal);
      const range = signal?.range ?? [Number.NaN, Number.NaN];
      const unit = signal?.unit ?? '';
      const why = level.kind === 'relief'
        ? 'the instrument stops reading before the relief device lifts'
        : 'the instrument can never read it';
      reportAtPlace(ctx, level.at, file, {
        message: `${capitalize(describeLevel(level))} is outside the range of ${level.signal} (${Math.min(...range)}..${Math.max(...range)} ${unit}): ${why}${pressureConversionNote(level.unit, unit)}.`,
        hint: 'Correct the value, or the range if the instrument reads further.',
      });
    });
  },
);
