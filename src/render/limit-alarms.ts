// The plant register's alarms on a signal, for the operating limits table: the operator sees at which value the
// alarm comes beside the limit. Each alarm keeps the quantity as written; where its unit is the unit the table
// row shows its limits in, the number alone is shown (the row's unit column says the unit).
import type { Procedure } from '../model/procedure.ts';
import type { RegisterSignal } from '../model/register.ts';

/** What this needs of a plant register: its signals by id. */
export interface AlarmSource {
  signals?: ReadonlyMap<string, Pick<RegisterSignal, 'section' | 'alarms'>>;
}

export interface LimitAlarms {
  alarmLow?: string;
  alarmHigh?: string;
}

/** Splits `15 degC` into number and unit, so a table can show the unit once. */
export function splitQuantity(text: string | undefined): { value?: string; unit?: string } {
  if (text === undefined) return {};
  const m = /^\s*(-?[0-9][0-9.,]*(?:e-?[0-9]+)?)\s*(.*?)\s*$/i.exec(text);
  return m ? { value: m[1], unit: m[2] || undefined } : { value: text };
}

/**
 * The register's low and high alarm of `signal`, each as the row shows it: the number when `unit` is its unit,
 * else the quantity as written. Looked up in `register` when given, else in the entries the procedure was read
 * against. Empty when the register sets no alarm on the signal.
 */
export function limitAlarms(signal: string, unit: string | undefined, procedure: Pick<Procedure, 'registerUses'>, register?: AlarmSource): LimitAlarms {
  const known = register?.signals?.get(signal);
  const used = procedure.registerUses?.find((u) => u.id === signal)?.entry;
  const alarms = (known ?? (used?.section === 'signals' ? used : undefined))?.alarms;
  const shown = (text: string | undefined): string | undefined => {
    if (!text?.trim()) return undefined;
    const parts = splitQuantity(text);
    return unit !== undefined && parts.unit === unit ? parts.value : text.trim();
  };
  const low = shown(alarms?.low?.value);
  const high = shown(alarms?.high?.value);
  return { ...(low ? { alarmLow: low } : {}), ...(high ? { alarmHigh: high } : {}) };
}
