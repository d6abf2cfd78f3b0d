// Whether a trip latches and how it is reset, as its sources state it, for the interlocks table and the step that
// resets it. Only what a source says: a procedure's own `latches` when written, else the plant register's (the
// safety function's own, else that of the function it starts); the reset instruction is the register's `reset`
// text, the function's own or that of the function it starts. Nothing said means nothing shown.
import type { Interlock, Procedure } from '../model/procedure.ts';
import type { RegisterSafetyFunction } from '../model/register.ts';

/** What this needs of a plant register: its safety functions by id. */
export interface TripSource {
  safetyFunctions?: ReadonlyMap<string, RegisterSafetyFunction>;
}

export interface TripLatching {
  /** Set only when a source states it. */
  latches?: boolean;
  /** The safety function the trip starts, when the latching is that function's and not the trip's own. */
  latchesThrough?: string;
  /** The register's reset instruction. */
  reset?: string;
  /** The safety function the trip starts, when the reset instruction is that function's. */
  resetThrough?: string;
}

/** The words the register page and the procedure page use for a latching trip. */
export const staysTrippedWords = 'it stays tripped until it is reset';

/**
 * The latching and reset of one interlock of the procedure. The register is looked up in `register` when given,
 * else in the entries the procedure was read against (then a function it starts may be unknown: nothing is said).
 */
export function tripLatching(interlock: Interlock, procedure: Pick<Procedure, 'data' | 'registerUses'>, register?: TripSource): TripLatching {
  const functionOf = (id: string): RegisterSafetyFunction | undefined => {
    const known = register?.safetyFunctions?.get(id);
    if (known) return known;
    const entry = procedure.registerUses?.find((u) => u.id === id)?.entry;
    return entry?.section === 'safety-functions' ? entry : undefined;
  };
  const own = functionOf(interlock.tag);
  const started = own?.starts ? functionOf(own.starts) : undefined;
  const out: TripLatching = {};
  const written = interlock.from ? undefined : writtenLatches(procedure.data, interlock);
  if (written !== undefined) out.latches = written;
  else if (own?.latches !== undefined) out.latches = own.latches;
  else if (started?.latches !== undefined) Object.assign(out, { latches: started.latches, latchesThrough: started.id });
  if (own?.reset) out.reset = own.reset;
  else if (started?.reset) Object.assign(out, { reset: started.reset, resetThrough: started.id });
  return out;
}

/** The procedure's own `latches` as written in its front-matter, or undefined where it does not say. */
function writtenLatches(data: Procedure['data'], interlock: Interlock): boolean | undefined {
  const [key, index] = interlock.path;
  if (key !== 'interlocks' || typeof index !== 'number') return undefined;
  const list = data?.interlocks;
  const item = Array.isArray(list) ? (list[index] as unknown) : undefined;
  const value = item && typeof item === 'object' ? (item as Record<string, unknown>).latches : undefined;
  return typeof value === 'boolean' ? value : undefined;
}

/** One sentence for the interlocks table: "Latches through ESD-210: it stays tripped until it is reset." */
export function latchingWords(latching: TripLatching): string | undefined {
  if (latching.latches === undefined) return undefined;
  if (!latching.latches) return 'Does not latch.';
  return `Latches${latching.latchesThrough ? ` through ${latching.latchesThrough}` : ''}: ${staysTrippedWords}.`;
}

/**
 * The outputs a trip holds, in one sentence for the interlocks table: "Holds XV-2001 closed until reset." A trip
 * that does not latch holds them while it is tripped.
 */
export function holdsWords(holds: ReadonlyArray<{ signal: string; value: string }>, latches: boolean | undefined): string | undefined {
  const seen = new Set<string>();
  const parts = holds.map((h) => `${h.signal} ${h.value}`).filter((p) => !seen.has(p) && seen.add(p));
  if (parts.length === 0) return undefined;
  const list = parts.length === 1 ? parts[0] : `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;
  return `Holds ${list} ${latches === false ? 'while tripped' : 'until reset'}.`;
}
