// The levels written for one signal (operating limits, alarms, trips, relief set pressures) and the order they
// must keep: operating limit < alarm < trip < relief set pressure on the high side, mirrored on the low side,
// all inside the instrument's range. Shared by the register check and the consistency rules.
import type { PathKey } from '../parse/read-source.ts';
import type { Procedure } from '../model/procedure.ts';
import type { PlantRegister, RegisterQuantity, RegisterSignal } from '../model/register.ts';
import type { Condition } from './conditions/ast.ts';
import { parseCondition } from './conditions/parse.ts';
import { parseQuantity, pressureConversionNote, sameDimension, toBase } from './units.ts';

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

/**
 * The single-signal thresholds at which a trip condition trips on its own: the condition itself when it is one
 * comparison, or each comparison of an `or`. `>`/`>=` trip high, `<`/`<=` trip low. Comparisons inside `and` or
 * `not` trip only together with something else and give no level.
 */
export function tripThresholds(condition: string): Array<{ signal: string; side: Side; text: string }> {
  const parsed = parseCondition(condition);
  if (!parsed.ok) return [];
  const out: Array<{ signal: string; side: Side; text: string }> = [];
  const visit = (c: Condition) => {
    if (c.kind === 'or') {
      c.operands.forEach(visit);
      return;
    }
    if (c.kind !== 'compare' || c.value.kind !== 'quantity') return;
    const side: Side | null = c.op === '>' || c.op === '>=' ? 'high' : c.op === '<' || c.op === '<=' ? 'low' : null;
    if (side) out.push({ signal: c.name.name, side, text: `${c.value.value} ${c.value.unit}` });
  };
  visit(parsed.condition);
  return out;
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
    for (const t of tripThresholds(fn.tripsWhen.value)) {
      const signal = register.signals.get(t.signal);
      add(levelOf('trip', t.side, t.signal, t.text, { file: fn.file, path: fn.tripsWhen.path, inRegister: true }, signal?.unit, { owner: fn.id, condition: fn.tripsWhen.value }));
    }
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
    for (const t of tripThresholds(interlock.tripsWhen.value)) {
      add(levelOf('trip', t.side, t.signal, t.text, at(interlock.tripsWhen.path), procedure.signals[t.signal]?.unit, { owner: interlock.tag, condition: interlock.tripsWhen.value }));
    }
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
      if (kindOrder[inner.kind] >= kindOrder[outer.kind] || inner.side !== outer.side) continue;
      const beyond = outer.side === 'high' ? inner.base >= outer.base : inner.base <= outer.base;
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
  return levels.filter((l) => sameDimension(l.unit, unit) && (l.base < low || l.base > high)).map((level) => ({ level, low: range[0], high: range[1] }));
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
