// The conversion note for messages about conditions: when a judgement about conditions compared a gauge pressure
// with an absolute one on the same signal (a threshold in kPag against one in kPaa, or against the signal's own
// absolute unit), the message says that the standard atmosphere, 101.325 kPa, was used.
import type { Condition } from './conditions/ast.ts';
import { comparisonsIn } from './conditions/parse.ts';
import { pressureConversionNote, pressureReference } from './units.ts';

/**
 * The note of `pressureConversionNote` for the first signal whose pressures, across `conditions`, the signal's
 * declared unit and any `extra` quantities (e.g. a setpoint), are written both as gauge and as absolute; else ''.
 */
export function conditionPressureNote(
  conditions: readonly Condition[],
  signalUnit: (name: string) => string | undefined,
  extra: ReadonlyArray<{ signal: string; unit: string }> = [],
): string {
  const unitsBySignal = new Map<string, string[]>();
  const add = (signal: string, unit: string | undefined) => {
    if (!unit || !pressureReference(unit)) return;
    const list = unitsBySignal.get(signal) ?? [];
    if (!list.includes(unit)) list.push(unit);
    unitsBySignal.set(signal, list);
  };
  for (const condition of conditions) {
    for (const cmp of comparisonsIn(condition)) {
      if (cmp.value.kind !== 'quantity') continue;
      add(cmp.name.name, cmp.value.unit);
    }
  }
  for (const { signal, unit } of extra) add(signal, unit);
  for (const [signal, units] of unitsBySignal) {
    // The declared unit counts only for a signal the conditions compare with a pressure.
    add(signal, signalUnit(signal));
    const gauge = units.find((u) => pressureReference(u) === 'gauge');
    const absolute = units.find((u) => pressureReference(u) === 'absolute');
    if (gauge && absolute) return pressureConversionNote(gauge, absolute);
  }
  return '';
}
