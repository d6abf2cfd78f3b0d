// The levels written for one signal (operating limits, alarms, trips, relief set pressures) and the order they
// must keep: operating limit < alarm < trip < relief set pressure on the high side, mirrored on the low side,
// all inside the instrument's range. Shared by the register check and the consistency rules.
import type { PathKey } from '../parse/read-source.ts';
import type { Procedure } from '../model/procedure.ts';
import type { PlantRegister, RegisterQuantity, RegisterSignal } from '../model/register.ts';
import type { Condition } from './conditions/ast.ts';
import { comparisonsIn, parseCondition } from './conditions/parse.ts';
import { everything, subtract, union, type IntervalSet } from './decisions/interval-set.ts';
import { NotAnalysable, SignalSpace, snap, type SignalInfo } from './decisions/signal-space.ts';
import { formatNumber, fromBase, parseQuantity, pressureConversionNote, sameDimension, toBase } from './units.ts';

export type LevelKind = 'limit' | 'alarm' | 'trip' | 'relief';
export type Side = 'low' | 'high';

/** Where a level is written: a register file or a procedure file, and the YAML path in it. */
export interface LevelPlace {
  file: string;
  path: PathKey[];
  inRegister: boolean;
}

export interface Level {
  kind: LevelKind;
  side: Side;
  signal: string;
  /** The quantity as written ("255 degC"). */
  text: string;
  value: number;
  unit: string;
  /** The value in SI base units, gauge pressures converted with the standard atmosphere. */
  base: number;
  /** The trip's or relief device's tag. */
  owner?: string;
  /** The whole trip condition, for messages. */
  condition?: string;
  /** For a trip that acts only between two values (SI base units, ends included): the band; `base` is its low end. */
  band?: { low: number; high: number };
  at: LevelPlace;
}

/** One level that breaks the order against another level, or against the signal's range. */
export interface LevelProblem {
  level: Level;
  against?: Level;
  range?: { low: number; high: number; unit: string; at: LevelPlace };
}

/** A level from a quantity text; null when the text is not a quantity of the signal's kind (reported elsewhere). */
export function levelOf(kind: LevelKind, side: Side, signal: string, text: string, at: LevelPlace, signalUnit: string | undefined, extra: Partial<Level> = {}): Level | null {
  const q = parseQuantity(text);
  if (!q.ok) return null;
  if (signalUnit && !sameDimension(q.unit, signalUnit)) return null;
  const base = toBase(q.value, q.unit);
  if (base === null || !Number.isFinite(base)) return null;
  return { kind, side, signal, text: text.trim(), value: q.value, unit: q.unit, base, at, ...extra };
}

/** A trip condition's levels on the signals it trips on, or why the condition could not be read as values. */
export type TripLevels = { ok: true; levels: Level[]; onlyWith: string[] } | { ok: false; reason: string };

/**
 * The levels of a trip condition, read from the set of values at which it trips rather than from how it is
 * written: `TI >= 180 degC`, `not (TI < 180 degC)` and `TI >= 356 degF` give the same level. For each numeric
 * signal the condition names, the values of that signal at which it trips whatever the other signals do; a part
 * of that set unbounded above is a high trip, one unbounded below a low trip, a bounded part a band (a level with
 * `band`, judged by whether a value lies in it). A signal the condition trips on only together with another
 * condition (`PI >= 400 kPag and burner == on`) gets no level and is listed in `onlyWith`. `ok: false` when the
 * condition does not parse or
 * cannot be read as values (an undeclared name, a unit that does not fit, too many cases), with the reason.
 */
export function tripLevels(condition: string, signals: Readonly<Record<string, SignalInfo>>, at: LevelPlace, owner: string): TripLevels {
  const parsed = parseCondition(condition);
  if (!parsed.ok) return { ok: false, reason: 'the condition does not parse' };
  let sets: Map<string, IntervalSet>;
  try {
    sets = tripSets(parsed.condition, signals);
  } catch (error) {
    if (error instanceof NotAnalysable) return { ok: false, reason: error.message };
    throw error;
  }
  const levels: Level[] = [];
  for (const [signal, set] of sets) {
    const unit = signals[signal]?.unit;
    for (const part of set) {
      const extra = { owner, condition: condition.trim() };
      if (part.hi === Infinity && part.lo !== -Infinity) levels.push(tripLevel('high', signal, part.lo, parsed.condition, unit, at, extra));
      else if (part.lo === -Infinity && part.hi !== Infinity) levels.push(tripLevel('low', signal, part.hi, parsed.condition, unit, at, extra));
      else levels.push({ ...tripLevel('high', signal, part.lo, parsed.condition, unit, at, extra), band: { low: part.lo, high: part.hi } });
    }
  }
  const compared = comparisonsIn(parsed.condition).filter((c) => c.value.kind === 'quantity').map((c) => c.name.name);
  const onlyWith = [...new Set(compared)].filter((name) => !sets.has(name) && name !== 'elapsed' && name !== 'done');
  return { ok: true, levels, onlyWith };
}

/**
 * For each numeric signal a condition names, the values of that signal (SI base units) at which the condition is
 * true whatever the other signals are: everything outside where the condition can be false. Throws NotAnalysable.
 */
export function tripSets(condition: Condition, signals: Readonly<Record<string, SignalInfo>>): Map<string, IntervalSet> {
  const space = new SignalSpace(signals, [condition], { useRanges: false });
  const untripped = space.regionOf(condition, false);
  const out = new Map<string, IntervalSet>();
  for (const variable of space.variables.values()) {
    if (variable.kind !== 'number' || variable.name === 'elapsed' || variable.name === 'done') continue;
    let safe: IntervalSet = [];
    for (const box of untripped) {
      const set = box.get(variable.name);
      safe = set?.kind === 'number' ? union(safe, set.set) : everything;
    }
    const trips = subtract(variable.domain, safe);
    if (trips.length) out.set(variable.name, trips);
  }
  return out;
}

/** The values a condition can be true at, per signal; or why they could not be worked out. */
export type EndingValues = { ok: true; values: Map<string, IntervalSet> } | { ok: false; reason: string };

/**
 * The values of each numeric signal the condition compares at which it can be true (SI base units), whatever the
 * other signals are: what a step's `until` can end at (the sibling of tripSets). Not ok, with the reason, when the
 * condition cannot be analysed (too many cases, a signal compared with numbers and words).
 */
export function valuesWhereTrue(condition: Condition, signals: Readonly<Record<string, SignalInfo>>): EndingValues {
  const out = new Map<string, IntervalSet>();
  let space: SignalSpace;
  let region;
  try {
    space = new SignalSpace(signals, [condition], { useRanges: false });
    region = space.regionOf(condition, true);
  } catch (error) {
    if (error instanceof NotAnalysable) return { ok: false, reason: error.message };
    throw error;
  }
  const compared = new Set(comparisonsIn(condition).filter((c) => c.value.kind === 'quantity').map((c) => c.name.name));
  for (const name of compared) {
    const variable = space.variables.get(name);
    if (variable?.kind !== 'number') continue;
    let set: IntervalSet = [];
    for (const box of region) {
      const values = box.get(name);
      set = union(set, values?.kind === 'number' ? values.set : variable.domain);
    }
    out.set(name, set);
  }
  return { ok: true, values: out };
}

/** A trip level at a bound of its set, shown as the condition writes that threshold when it does. */
function tripLevel(side: Side, signal: string, base: number, condition: Condition, unit: string | undefined, at: LevelPlace, extra: Partial<Level>): Level {
  const written = comparisonsIn(condition).find((c) => c.name.name === signal && c.value.kind === 'quantity' && snap(toBase(c.value.value, c.value.unit) ?? Number.NaN) === base);
  if (written && written.value.kind === 'quantity') {
    return { kind: 'trip', side, signal, text: `${written.value.value} ${written.value.unit}`, value: written.value.value, unit: written.value.unit, base, at, ...extra };
  }
  if (!Number.isFinite(base)) return { kind: 'trip', side, signal, text: 'any value', value: base, unit: unit ?? '', base, at, ...extra };
  const shownUnit = unit ?? '';
  const value = unit ? fromBase(base, unit) ?? base : base;
  return { kind: 'trip', side, signal, text: `${formatNumber(value)} ${shownUnit}`.trim(), value, unit: shownUnit, base, at, ...extra };
}

/**
 * A trip whose levels were not judged: its condition could not be read as values (`reason`), or it acts on the
 * signals in `onlyWith` only together with the rest of its condition (`PI >= 400 kPag and burner == on`), so it has
 * no level of its own on them.
 */
export interface TripNotAnalysed {
  owner: string;
  condition: string;
  reason?: string;
  onlyWith?: string[];
  at: LevelPlace;
}

/**
 * The trips of the register, or those a procedure declares itself, whose conditions could not be read as values or
 * that act on a signal only together with another condition.
 */
export function tripsNotAnalysed(source: { register: PlantRegister } | { procedure: Procedure }): TripNotAnalysed[] {
  const out: TripNotAnalysed[] = [];
  if ('register' in source) {
    const signals = registerSignalInfo(source.register);
    for (const fn of source.register.safetyFunctions.values()) {
      if (!fn.tripsWhen) continue;
      const at = { file: fn.file, path: fn.tripsWhen.path, inRegister: true };
      const read = tripLevels(fn.tripsWhen.value, signals, at, fn.id);
      if (!read.ok) out.push({ owner: fn.id, condition: fn.tripsWhen.value.trim(), reason: read.reason, at });
      else if (read.onlyWith.length) out.push({ owner: fn.id, condition: fn.tripsWhen.value.trim(), onlyWith: read.onlyWith, at });
    }
    return out;
  }
  const { procedure } = source;
  for (const interlock of procedure.interlocks) {
    if (interlock.from) continue;
    const at = { file: procedure.file, path: interlock.tripsWhen.path, inRegister: false };
    const read = tripLevels(interlock.tripsWhen.value, procedure.signals, at, interlock.tag);
    if (!read.ok) out.push({ owner: interlock.tag, condition: interlock.tripsWhen.value.trim(), reason: read.reason, at });
    else if (read.onlyWith.length) out.push({ owner: interlock.tag, condition: interlock.tripsWhen.value.trim(), onlyWith: read.onlyWith, at });
  }
  return out;
}

const registerSignalCache = new WeakMap<PlantRegister, Record<string, SignalInfo>>();
function registerSignalInfo(register: PlantRegister): Record<string, SignalInfo> {
  let found = registerSignalCache.get(register);
  if (!found) {
    found = Object.fromEntries([...register.signals.values()].map((s) => [s.id, { unit: s.unit, range: s.range, values: s.values }]));
    registerSignalCache.set(register, found);
  }
  return found;
}

function registerQuantityLevel(kind: LevelKind, side: Side, signal: RegisterSignal, q: RegisterQuantity | undefined, file: string): Level | null {
  if (!q) return null;
  return levelOf(kind, side, signal.id, q.value, { file, path: q.path, inRegister: true }, signal.unit);
}

/** Every level the register writes, by signal. */
export function levelsInRegister(register: PlantRegister): Map<string, Level[]> {
  const out = new Map<string, Level[]>();
  const add = (level: Level | null) => {
    if (!level) return;
    const list = out.get(level.signal) ?? [];
    list.push(level);
    out.set(level.signal, list);
  };
  for (const signal of register.signals.values()) {
    add(registerQuantityLevel('limit', 'low', signal, signal.limits?.low, signal.file));
    add(registerQuantityLevel('limit', 'high', signal, signal.limits?.high, signal.file));
    add(registerQuantityLevel('alarm', 'low', signal, signal.alarms?.low, signal.file));
    add(registerQuantityLevel('alarm', 'high', signal, signal.alarms?.high, signal.file));
  }
  for (const fn of register.safetyFunctions.values()) {
    if (!fn.tripsWhen) continue;
    const read = tripLevels(fn.tripsWhen.value, registerSignalInfo(register), { file: fn.file, path: fn.tripsWhen.path, inRegister: true }, fn.id);
    if (read.ok) read.levels.forEach(add);
  }
  for (const device of register.reliefDevices.values()) {
    if (!device.signal || !device.setPressure.value) continue;
    const signal = register.signals.get(device.signal);
    add(levelOf('relief', 'high', device.signal, device.setPressure.value, { file: device.file, path: device.setPressure.path, inRegister: true }, signal?.unit, { owner: device.id }));
  }
  return out;
}

/**
 * The levels that hold for a procedure, by signal: its own limits and interlocks, plus every register level on
 * the same signals that the procedure does not replace with a declaration of its own (a register trip exists in
 * the plant whether or not the procedure names it).
 */
export function levelsForProcedure(procedure: Procedure, registerLevels?: Map<string, Level[]>): Map<string, Level[]> {
  const out = new Map<string, Level[]>();
  const add = (level: Level | null) => {
    if (!level) return;
    const list = out.get(level.signal) ?? [];
    list.push(level);
    out.set(level.signal, list);
  };
  const at = (path: PathKey[]): LevelPlace => ({ file: procedure.file, path, inRegister: false });
  const localLimit = new Set<string>();
  const localTrip = new Set<string>();
  for (const limit of procedure.limits) {
    if (limit.from) continue;
    localLimit.add(limit.signal);
    const unit = procedure.signals[limit.signal]?.unit;
    if (limit.low) add(levelOf('limit', 'low', limit.signal, limit.low.value, at(limit.low.path), unit));
    if (limit.high) add(levelOf('limit', 'high', limit.signal, limit.high.value, at(limit.high.path), unit));
  }
  for (const interlock of procedure.interlocks) {
    if (interlock.from) continue;
    localTrip.add(interlock.tag);
    const read = tripLevels(interlock.tripsWhen.value, procedure.signals, at(interlock.tripsWhen.path), interlock.tag);
    if (read.ok) read.levels.forEach(add);
  }
  if (registerLevels) {
    for (const signal of Object.keys(procedure.signals)) {
      for (const level of registerLevels.get(signal) ?? []) {
        if ((level.kind === 'limit' && localLimit.has(signal)) || (level.owner && localTrip.has(level.owner))) continue;
        add(level);
      }
    }
  }
  return out;
}

const kindOrder: Record<LevelKind, number> = { limit: 0, alarm: 1, trip: 2, relief: 3 };

/**
 * Pairs of levels on one signal that break the order: a level of an earlier kind (limit, alarm, trip) at or
 * beyond a later kind on the same side (a relief device counts on the high side only). `kinds` picks which later
 * kinds are judged: ['trip'] or ['relief'].
 */
export function levelsOutOfOrder(levels: readonly Level[], against: readonly LevelKind[]): LevelProblem[] {
  const out: LevelProblem[] = [];
  for (const outer of levels) {
    if (!against.includes(outer.kind)) continue;
    for (const inner of levels) {
      if (kindOrder[inner.kind] >= kindOrder[outer.kind]) continue;
      // Unit conversion leaves float noise (356 degF is 453.15000000000003 K); levels compare as the trip sets do.
      const value = snap(inner.base);
      let beyond: boolean;
      if (outer.band) beyond = value >= outer.band.low && value <= outer.band.high;
      else if (inner.side !== outer.side) continue;
      else beyond = outer.side === 'high' ? value >= snap(outer.base) : value <= snap(outer.base);
      if (beyond) out.push({ level: inner, against: outer });
    }
  }
  return out;
}

/** Levels outside the signal's range [low, high] in its unit (the range is read whichever way round it is written). */
export function levelsOutsideRange(levels: readonly Level[], range: [number, number], unit: string): Array<{ level: Level; low: number; high: number }> {
  const a = toBase(range[0], unit);
  const b = toBase(range[1], unit);
  if (a === null || b === null) return [];
  const low = Math.min(a, b);
  const high = Math.max(a, b);
  const outside = (v: number) => Number.isFinite(v) && (snap(v) < snap(low) || snap(v) > snap(high));
  return levels.filter((l) => sameDimension(l.unit, unit) && (outside(l.base) || (l.band !== undefined && outside(l.band.high)))).map((level) => ({ level, low: range[0], high: range[1] }));
}

const kindWords: Record<LevelKind, string> = { limit: 'operating limit', alarm: 'alarm', trip: 'trip', relief: 'relief set pressure' };

/** "the high operating limit of TI-210 (260 degC)", "trip TSHH-210 (TI-210 >= 255 degC)". */
export function describeLevel(level: Level): string {
  if (level.kind === 'trip') return `trip ${level.owner ?? ''} (${level.condition ?? `${level.signal} ${level.side === 'high' ? '>=' : '<='} ${level.text}`})`.replace('trip  (', 'trip (');
  if (level.kind === 'relief') return `the set pressure of relief device ${level.owner ?? ''} (${level.text})`;
  return `the ${level.side} ${kindWords[level.kind]} of ${level.signal} (${level.text})`;
}

/** The gauge/absolute note for a message comparing two levels, or ''. */
export function levelNote(a: Level, b: Level): string {
  return pressureConversionNote(a.unit, b.unit);
}
