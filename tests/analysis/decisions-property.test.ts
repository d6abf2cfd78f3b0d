import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseCondition } from '../../src/analysis/conditions/parse.ts';
import type { Condition } from '../../src/analysis/conditions/ast.ts';
import { evaluateCondition, type KnownValue } from '../../src/analysis/evaluate-condition.ts';
import { SignalSpace, type Region } from '../../src/analysis/decisions/signal-space.ts';
import { contains } from '../../src/analysis/decisions/interval-set.ts';
import { toBase } from '../../src/analysis/units.ts';

// Two signals: a level in percent over [0, 20] and a lab result. Thresholds are whole numbers, so every
// non-empty set a condition describes holds a whole or half value: checking those points is exhaustive.
const signals = { L: { unit: 'percent', range: [0, 20] as [number, number] }, R: { values: ['pass', 'fail', 'retest'] } };
const points: Array<Map<string, KnownValue>> = [];
for (let half = 0; half <= 40; half++) {
  for (const r of ['pass', 'fail', 'retest']) {
    points.push(new Map<string, KnownValue>([['L', { kind: 'number', base: toBase(half / 2, 'percent')! }], ['R', { kind: 'word', value: r }]]));
  }
}

const atom = fc.oneof(
  fc.tuple(fc.constantFrom('<', '<=', '>', '>=', '==', '!='), fc.integer({ min: -2, max: 22 })).map(([op, v]) => `L ${op} ${v} percent`),
  fc.tuple(fc.constantFrom('==', '!='), fc.constantFrom('pass', 'fail', 'retest')).map(([op, v]) => `R ${op} ${v}`),
);
const condition: fc.Arbitrary<string> = fc.letrec<{ c: string }>((tie) => ({
  c: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    atom,
    fc.tuple(tie('c'), fc.constantFrom('and', 'or'), tie('c')).map(([a, op, b]) => `(${a}) ${op} (${b})`),
    tie('c').map((a) => `not (${a})`),
  ),
})).c;

const parse = (text: string): Condition => {
  const r = parseCondition(text);
  if (!r.ok) throw new Error(`${text}: ${r.error.message}`);
  return r.condition;
};

describe('signal-space reasoning agrees with evaluating every distinct value', () => {
  it('finds an overlap exactly when some values make both conditions true, and a gap exactly when none is true', () => {
    fc.assert(
      fc.property(condition, condition, (ta, tb) => {
        const a = parse(ta);
        const b = parse(tb);
        const space = new SignalSpace(signals, [a, b], { useRanges: true });
        const ra = space.regionOf(a);
        const rb = space.regionOf(b);
        const both = points.filter((p) => evaluateCondition(a, p) === true && evaluateCondition(b, p) === true);
        const neither = points.filter((p) => evaluateCondition(a, p) === false && evaluateCondition(b, p) === false);
        expect(space.and(ra, rb).length > 0).toBe(both.length > 0);
        expect(space.not(space.or(ra, rb)).length > 0).toBe(neither.length > 0);
        // The witness really makes both true, whatever the signals it leaves open are (all of them).
        const overlap = space.and(ra, rb);
        if (overlap.length) {
          const fixed = new Map<string, KnownValue>();
          for (const text of space.witness(overlap[0])) {
            const [name, value] = text.split(' = ');
            fixed.set(name, name === 'L' ? { kind: 'number', base: toBase(Number.parseFloat(value), 'percent')! } : { kind: 'word', value });
          }
          const holds = points.every((p) => {
            const known = new Map([...p, ...fixed]);
            return evaluateCondition(a, known) === true && evaluateCondition(b, known) === true;
          });
          expect(holds).toBe(true);
        }
      }),
      { numRuns: 1500 },
    );
  });

  it('compacting a region keeps exactly the same values in no more boxes', () => {
    const inRegion = (region: Region, p: Map<string, KnownValue>) => region.some((box) => [...box].every(([name, set]) => {
      const v = p.get(name)!;
      return set.kind === 'number' ? v.kind === 'number' && contains(set.set, v.base) : v.kind === 'word' && set.set.includes(v.value);
    }));
    fc.assert(
      fc.property(fc.array(condition, { minLength: 1, maxLength: 4 }), (texts) => {
        const conditions = texts.map(parse);
        const space = new SignalSpace(signals, conditions, { useRanges: true });
        const region = conditions.map((c) => space.regionOf(c)).reduce((x, y) => space.or(x, y));
        const compact = space.compact(region);
        expect(compact.length).toBeLessThanOrEqual(region.length);
        // Two signals: one box per distinct set of lab results at the most (2^3 subsets, or none named).
        expect(compact.length).toBeLessThanOrEqual(8);
        for (const p of points) expect(inRegion(compact, p)).toBe(inRegion(region, p));
      }),
      { numRuns: 500 },
    );
  });
});
