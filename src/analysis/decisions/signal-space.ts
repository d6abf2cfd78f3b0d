// The space of signal values a condition speaks about: numbers in SI base units over their declared range,
// enumerations, booleans. A condition becomes a union of boxes (disjunctive normal form), each box holding
// one value set per signal, so "can both be true?" and "is anything left over?" are exact set questions.
import type { CompareOp, Condition, Literal } from '../conditions/ast.ts';
import { formatNumber, fromBase, toBase, unitDimension } from '../units.ts';
import { contains, everything, interval, intersect, isEmpty, subtract, equals, union, type IntervalSet } from './interval-set.ts';

/** What a condition may know about a signal; the model's Signal fits. */
export interface SignalInfo {
  unit?: string;
  range?: [number, number];
  values?: Array<string | number | boolean>;
}

export type Variable =
  | { kind: 'number'; name: string; unit?: string; domain: IntervalSet }
  | { kind: 'enum'; name: string; values: string[] };

export type ValueSet = { kind: 'number'; set: IntervalSet } | { kind: 'enum'; set: string[] };

/** One value set per signal it names; a signal it does not name may take any value. */
export type Box = Map<string, ValueSet>;
/** A union of boxes; empty when the condition can never be true. */
export type Region = Box[];

/** Thrown when a condition cannot be analysed exactly (unknown name, unit trouble, too many cases). */
export class NotAnalysable extends Error {}

/** Any value of an enumerated signal that the procedure did not list. */
export const otherValue = '\u0000other';
/** Most disjoint cases a decision is split into; beyond it the decision is reported as not analysed. */
export const maxBoxes = 2048;

/**
 * How far, relative to its value, the state analysis lets a moving signal reach past the point it stops at (a sliver
 * each side of it: a value that stops at a threshold), and how wide a set of values may be and still be shown as
 * that one point (see showInterval).
 */
export const sliverHalfWidth = 1e-6;
export const sliverWidth = 4 * sliverHalfWidth;

/** Unit conversion leaves float noise (212 degF → 373.15000000000003 K); 12 significant digits keep real differences such as 760 mmHg vs 1 atm (1.4e-7). */
export function snap(value: number): number {
  return Number.isFinite(value) ? Number(value.toPrecision(12)) : value;
}

// Unit conversion goes through mathjs and is slow next to everything else here; thresholds repeat a lot.
const baseCache = new Map<string, number | null>();
function base(value: number, unit: string): number | null {
  const key = `${value} ${unit}`;
  let found = baseCache.get(key);
  if (found === undefined) {
    found = toBase(value, unit);
    if (baseCache.size > 10_000) baseCache.clear();
    baseCache.set(key, found);
  }
  return found;
}

export interface SpaceOptions {
  /** Hold numeric signals to their declared range (true), or let them take any number (false). */
  useRanges: boolean;
}

export class SignalSpace {
  readonly variables = new Map<string, Variable>();

  private readonly signals: Readonly<Record<string, SignalInfo>>;
  private readonly options: SpaceOptions;

  constructor(signals: Readonly<Record<string, SignalInfo>>, conditions: Condition[], options: SpaceOptions) {
    this.signals = signals;
    this.options = options;
    const words = new Map<string, Set<string>>();
    const numbers = new Set<string>();
    const order = new Set<string>();
    const visit = (c: Condition) => {
      if (c.kind === 'compare' || c.kind === 'flag') order.add(c.name.name);
      if (c.kind === 'compare') {
        if (c.value.kind === 'word') {
          if (!words.has(c.name.name)) words.set(c.name.name, new Set());
          words.get(c.name.name)!.add(c.value.value);
        } else numbers.add(c.name.name);
      } else if (c.kind === 'flag') {
        if (!words.has(c.name.name)) words.set(c.name.name, new Set());
        words.get(c.name.name)!.add('true').add('false');
      } else if (c.kind === 'not') visit(c.operand);
      else for (const o of c.operands) visit(o);
    };
    conditions.forEach(visit);
    for (const name of order) this.variables.set(name, this.variableFor(name, words.get(name), numbers.has(name)));
  }

  /** Adds a signal that no condition names (e.g. one a step only drives), with its declared values. */
  include(name: string): Variable {
    let v = this.variables.get(name);
    if (!v) {
      v = this.variableFor(name, undefined, false);
      this.variables.set(name, v);
    }
    return v;
  }

  private variableFor(name: string, words: Set<string> | undefined, numeric: boolean): Variable {
    const signal = Object.hasOwn(this.signals, name) ? this.signals[name] : undefined;
    if (!signal) {
      if (name === 'done') return { kind: 'enum', name, values: ['true', 'false'] };
      if (name === 'elapsed') return { kind: 'number', name, unit: 'min', domain: interval(0, Infinity) };
      throw new NotAnalysable(`'${name}' is not declared`);
    }
    if (signal.unit) {
      if (unitDimension(signal.unit) === null) throw new NotAnalysable(`unknown unit ${signal.unit}`);
      let domain = everything;
      if (this.options.useRanges && signal.range) {
        const [a, b] = signal.range.map((v) => snap(base(v, signal.unit!) ?? Number.NaN));
        if (Number.isNaN(a) || Number.isNaN(b)) throw new NotAnalysable('range cannot be converted');
        domain = interval(Math.min(a, b), Math.max(a, b));
      }
      return { kind: 'number', name, unit: signal.unit, domain };
    }
    if (signal.values?.length) return { kind: 'enum', name, values: [...new Set(signal.values.map(String))] };
    if (numeric && !words) return { kind: 'number', name, domain: everything };
    if (numeric) throw new NotAnalysable(`${name} is compared with numbers and words`);
    return { kind: 'enum', name, values: [...(words ?? [])].concat(otherValue) };
  }

  private variable(name: string): Variable {
    const v = this.variables.get(name);
    if (!v) throw new NotAnalysable(`'${name}' is not known`);
    return v;
  }

  full(v: Variable): ValueSet {
    return v.kind === 'number' ? { kind: 'number', set: v.domain } : { kind: 'enum', set: v.values };
  }

  /** The values of every signal for which the condition is true (or false, when `positive` is false). */
  regionOf(c: Condition, positive = true): Region {
    switch (c.kind) {
      case 'compare':
        return this.single(c.name.name, this.compareSet(this.variable(c.name.name), c.op, c.value), positive);
      case 'flag': {
        const v = this.variable(c.name.name);
        if (v.kind !== 'enum' || !v.values.includes('true')) throw new NotAnalysable(`${c.name.name} is not a yes/no signal`);
        return this.single(c.name.name, { kind: 'enum', set: ['true'] }, positive);
      }
      case 'not':
        return this.regionOf(c.operand, !positive);
      case 'and':
      case 'or': {
        const parts = c.operands.map((o) => this.regionOf(o, positive));
        const conjunction = (c.kind === 'and') === positive;
        return conjunction ? parts.reduce((a, b) => this.and(a, b)) : parts.reduce((a, b) => this.or(a, b));
      }
    }
  }

  private single(name: string, set: ValueSet, positive: boolean): Region {
    const v = this.variable(name);
    const values = positive ? this.meet(set, this.full(v)) : this.without(this.full(v), set);
    return values ? [new Map([[name, values]])] : [];
  }

  private compareSet(v: Variable, op: CompareOp, literal: Literal): ValueSet {
    if (v.kind === 'enum') {
      if (literal.kind === 'quantity') throw new NotAnalysable('a quantity compared with an enumeration');
      if (op !== '==' && op !== '!=') throw new NotAnalysable('words have no order');
      const word = String(literal.value);
      const eq = v.values.includes(word) ? [word] : [];
      return { kind: 'enum', set: op === '==' ? eq : v.values.filter((x) => x !== word) };
    }
    let threshold: number | null = null;
    if (literal.kind === 'quantity' && v.unit && unitDimension(literal.unit) === unitDimension(v.unit)) threshold = base(literal.value, literal.unit);
    if (literal.kind === 'quantity' && v.name === 'elapsed' && !this.signals.elapsed && unitDimension(literal.unit) === 'time') threshold = base(literal.value, literal.unit);
    if (literal.kind === 'number' && !v.unit) threshold = literal.value;
    if (threshold === null || Number.isNaN(threshold)) throw new NotAnalysable('threshold cannot be compared');
    const t = snap(threshold);
    const set: Record<CompareOp, IntervalSet> = {
      '<': interval(-Infinity, t, true, true),
      '<=': interval(-Infinity, t, true, false),
      '>': interval(t, Infinity, true, true),
      '>=': interval(t, Infinity, false, true),
      '==': interval(t, t),
      '!=': subtract(everything, interval(t, t)),
    };
    return { kind: 'number', set: set[op] };
  }

  private meet(a: ValueSet, b: ValueSet): ValueSet | null {
    if (a.kind === 'number' && b.kind === 'number') {
      const set = intersect(a.set, b.set);
      return isEmpty(set) ? null : { kind: 'number', set };
    }
    if (a.kind === 'enum' && b.kind === 'enum') {
      const set = a.set.filter((x) => b.set.includes(x));
      return set.length ? { kind: 'enum', set } : null;
    }
    throw new NotAnalysable('mixed kinds');
  }

  private without(a: ValueSet, b: ValueSet): ValueSet | null {
    if (a.kind === 'number' && b.kind === 'number') {
      const set = subtract(a.set, b.set);
      return isEmpty(set) ? null : { kind: 'number', set };
    }
    if (a.kind === 'enum' && b.kind === 'enum') {
      const set = a.set.filter((x) => !b.set.includes(x));
      return set.length ? { kind: 'enum', set } : null;
    }
    throw new NotAnalysable('mixed kinds');
  }

  private meetBoxes(a: Box, b: Box): Box | null {
    const out: Box = new Map(a);
    for (const [name, set] of b) {
      const mine = out.get(name);
      const met = mine ? this.meet(mine, set) : set;
      if (!met) return null;
      out.set(name, met);
    }
    return out;
  }

  and(a: Region, b: Region): Region {
    let out: Region = [];
    for (const x of a) {
      for (const y of b) {
        const m = this.meetBoxes(x, y);
        if (m) out.push(m);
        if (out.length > maxBoxes) out = this.withinLimit(out);
      }
    }
    return out;
  }

  or(a: Region, b: Region): Region {
    const out = [...a, ...b];
    return out.length > maxBoxes ? this.withinLimit(out) : out;
  }

  /** A region over the case limit, compacted; still over it, the question is not analysable. */
  private withinLimit(region: Region): Region {
    const compact = this.compact(region);
    if (compact.length > maxBoxes) throw new NotAnalysable('too many cases');
    return compact;
  }

  /**
   * The same values in fewer boxes: boxes that agree on every signal but one become one box holding the union
   * on that signal (exact: {x in A, rest R} or {x in B, rest R} is {x in A or B, rest R}); repeated until nothing merges.
   */
  compact(region: Region): Region {
    let boxes = region;
    for (let changed = true; changed && boxes.length > 1;) {
      changed = false;
      const names = [...new Set(boxes.flatMap((b) => [...b.keys()]))].sort();
      for (const name of names) {
        const groups = new Map<string, Box[]>();
        for (const box of boxes) {
          const key = [...box].filter(([n]) => n !== name).sort(([x], [y]) => (x < y ? -1 : x > y ? 1 : 0)).map(([n, set]) => `${n}=${setKey(set)}`).join('|');
          const group = groups.get(key);
          if (group) group.push(box);
          else groups.set(key, [box]);
        }
        if (groups.size === boxes.length) continue;
        changed = true;
        boxes = [...groups.values()].map((group) => (group.length === 1 ? group[0] : this.mergeOn(name, group)));
      }
    }
    return boxes;
  }

  private mergeOn(name: string, group: Box[]): Box {
    const out: Box = new Map(group[0]);
    let merged: ValueSet | undefined;
    for (const box of group) {
      const set = box.get(name);
      if (!set) { merged = undefined; out.delete(name); return out; }
      merged = !merged ? set
        : merged.kind === 'number' && set.kind === 'number' ? { kind: 'number', set: union(merged.set, set.set) }
        : merged.kind === 'enum' && set.kind === 'enum' ? { kind: 'enum', set: [...new Set([...merged.set, ...set.set])] }
        : (() => { throw new NotAnalysable('mixed kinds'); })();
    }
    out.set(name, merged!);
    return out;
  }

  /**
   * Everything outside the region (within the declared domains). Each box is cut out of the result by
   * splitting the result's boxes into disjoint pieces, one signal at a time, so the count grows with the
   * shape of what is left rather than multiplying (15 of the 16 cases of four yes/no signals leave one box).
   */
  not(a: Region): Region {
    try {
      return this.notByProduct(a);
    } catch (error) {
      if (!(error instanceof NotAnalysable) || error.message !== 'too many cases') throw error;
      return this.notBySplitting(a);
    }
  }

  /** The complement as a product of each box's outside: short descriptions, but it multiplies with many boxes. */
  private notByProduct(a: Region): Region {
    let result: Region = [new Map()];
    for (const box of a) {
      const outside: Region = [];
      for (const [name, set] of box) {
        const rest = this.without(this.full(this.variable(name)), set);
        if (rest) outside.push(new Map([[name, rest]]));
      }
      result = this.and(result, outside);
      if (!result.length) return [];
    }
    return result;
  }

  private notBySplitting(a: Region): Region {
    let result: Region = [new Map()];
    for (const box of a) {
      const next: Region = [];
      for (const r of result) {
        let inside: Box = new Map(r);
        for (const [name, set] of box) {
          const mine = inside.get(name) ?? this.full(this.variable(name));
          const outside = this.without(mine, set);
          if (outside) {
            const piece = new Map(inside);
            piece.set(name, outside);
            next.push(piece);
            if (next.length > maxBoxes) next.splice(0, next.length, ...this.withinLimit(next));
          }
          const met = this.meet(mine, set);
          if (!met) break;
          inside = new Map(inside);
          inside.set(name, met);
        }
      }
      result = next;
      if (!result.length) return [];
    }
    return result;
  }

  /** A value per constrained signal that lies in the box, as people write it ("TI-5 = 82 degC"). */
  witness(box: Box): string[] {
    const out: string[] = [];
    for (const [name, set] of this.inOrder(box)) {
      const v = this.variable(name);
      if (this.isFull(v, set)) continue;
      if (set.kind === 'enum') out.push(`${name} = ${this.showWord(v, set.set[0])}`);
      else out.push(`${name} = ${this.showNumber(v, pickNumber(set.set, v.kind === 'number' ? v.unit : undefined))}`);
    }
    return out;
  }

  /** The whole box in words: "LI-8 = 10 percent", "5 degC <= TI < 20 degC", "lab-result = fail". */
  describe(box: Box): string {
    const parts: string[] = [];
    for (const [name, set] of this.inOrder(box)) {
      const v = this.variable(name);
      if (this.isFull(v, set)) continue;
      if (set.kind === 'enum') parts.push(set.set.length === 1 ? `${name} = ${this.showWord(v, set.set[0])}` : `${name} in {${set.set.map((w) => this.showWord(v, w)).join(', ')}}`);
      else parts.push(set.set.map((i) => this.showInterval(v, name, i)).join(' or '));
    }
    return parts.length ? parts.join(' and ') : 'any values';
  }

  /** The box's signals in the order the conditions first name them. */
  private inOrder(box: Box): Array<[string, ValueSet]> {
    return [...this.variables.keys()].filter((n) => box.has(n)).map((n) => [n, box.get(n)!]);
  }

  private isFull(v: Variable, set: ValueSet): boolean {
    if (v.kind === 'number' && set.kind === 'number') return equals(set.set, v.domain);
    return v.kind === 'enum' && set.kind === 'enum' && set.set.length === v.values.length;
  }

  private showWord(v: Variable, word: string): string {
    if (word !== otherValue) return word;
    const listed = v.kind === 'enum' ? v.values.filter((w) => w !== otherValue) : [];
    return `a value other than ${listed.join(', ')}`;
  }

  private showNumber(v: Variable, base: number): string {
    if (v.kind !== 'number' || !v.unit) return formatNumber(base);
    return `${formatNumber(fromBase(base, v.unit) ?? base)} ${v.unit}`;
  }

  private showInterval(v: Variable, name: string, i: IntervalSet[number]): string {
    const lo = this.showNumber(v, i.lo);
    const hi = this.showNumber(v, i.hi);
    if (i.lo === i.hi) return `${name} = ${lo}`;
    // A sliver (a value reaching a setpoint or a threshold, a millionth wide): the point it stands for, not two
    // numbers that differ in the sixth digit.
    if (Number.isFinite(i.lo) && Number.isFinite(i.hi) && i.hi - i.lo <= sliverWidth * Math.max(1, Math.abs(i.hi))) {
      if (i.loOpen && !i.hiOpen) return `${name} just above ${lo}`;
      if (i.hiOpen && !i.loOpen) return `${name} just below ${hi}`;
      return `${name} = ${lo.length <= hi.length ? lo : hi}`;
    }
    if (i.lo === -Infinity) return `${name} ${i.hiOpen ? '<' : '<='} ${hi}`;
    if (i.hi === Infinity) return `${name} ${i.loOpen ? '>' : '>='} ${lo}`;
    return `${lo} ${i.loOpen ? '<' : '<='} ${name} ${i.hiOpen ? '<' : '<='} ${hi}`;
  }
}

/** A readable number inside the set: a closed bound if there is one, else a round value in the signal's unit. */
export function pickNumber(set: IntervalSet, unit?: string): number {
  const i = set[0];
  const toShown = (b: number) => (unit ? fromBase(b, unit) ?? b : b);
  const fromShown = (s: number) => (unit ? snap(base(s, unit) ?? s) : s);
  if (!i.loOpen && Number.isFinite(i.lo)) return i.lo;
  if (!i.hiOpen && Number.isFinite(i.hi)) return i.hi;
  const candidates: number[] = [];
  if (Number.isFinite(i.lo)) candidates.push(Math.floor(toShown(i.lo)) + 1);
  if (Number.isFinite(i.hi)) candidates.push(Math.ceil(toShown(i.hi)) - 1);
  if (!Number.isFinite(i.lo) && !Number.isFinite(i.hi)) candidates.push(0);
  for (const c of candidates) {
    const base = fromShown(c);
    if (contains(set, base)) return base;
  }
  return (i.lo + i.hi) / 2;
}

/** A canonical text of a value set, so equal sets group together. */
function setKey(set: ValueSet): string {
  if (set.kind === 'enum') return `e:${[...set.set].sort().join('\u0001')}`;
  return `n:${set.set.map((i) => `${i.loOpen ? '(' : '['}${i.lo},${i.hi}${i.hiOpen ? ')' : ']'}`).join(';')}`;
}
