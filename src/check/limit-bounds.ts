// The operating limits of each signal in one procedure (its own and the register's), in SI base units.
import type { ProcedureFacts } from '../analysis/procedure-facts.ts';
import { convert, formatConverted, fromBase, toBase } from '../analysis/units.ts';
import type { PathKey } from '../parse/read-source.ts';

export interface Bound {
  base: number;
  text: string;
  unit: string;
  path: readonly PathKey[];
}

export function limitBounds(facts: ProcedureFacts): Map<string, { low?: Bound; high?: Bound }> {
  const bounds = new Map<string, { low?: Bound; high?: Bound }>();
  for (const site of facts.quantities) {
    if ((site.role !== 'limit-low' && site.role !== 'limit-high') || !site.quantity || site.problems.length) continue;
    const base = toBase(site.quantity.value, site.quantity.unit);
    if (base === null) continue;
    const entry = bounds.get(site.signal) ?? {};
    entry[site.role === 'limit-low' ? 'low' : 'high'] = { base, text: site.text, unit: site.quantity.unit, path: site.path };
    bounds.set(site.signal, entry);
  }
  return bounds;
}

/**
 * A written quantity in its signal's unit, for a message about the signal's limits: rounded for reading, but never
 * level with, or across, one of the limits (see formatConverted).
 */
export function convertedFor(quantity: { value: number; unit: string }, unit: string, limits: { low?: Bound; high?: Bound } | undefined): string {
  const against = [limits?.low, limits?.high].map((b) => (b ? fromBase(b.base, unit) : undefined));
  return formatConverted(convert(quantity.value, quantity.unit, unit) ?? Number.NaN, unit, against);
}
