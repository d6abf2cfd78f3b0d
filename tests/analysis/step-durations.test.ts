// The shortest time a step's until needs by elapsed time, checked against evaluating the condition itself.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseCondition } from '../../src/analysis/conditions/parse.ts';
import { evaluateCondition, type KnownValue } from '../../src/analysis/evaluate-condition.ts';
import { shortestElapsed } from '../../src/analysis/step-durations.ts';
import { rules } from '../../src/check/rules/index.ts';

// Conditions over elapsed time (in min, s or h) and one valve, joined by and / or.
const leaf = fc.oneof(
  fc.tuple(fc.constantFrom('>=', '>', '<', '<=', '=='), fc.integer({ min: 1, max: 120 }), fc.constantFrom('min', 's', 'h'))
    .map(([op, n, unit]) => `elapsed ${op} ${n} ${unit}`),
  fc.constantFrom('XV-1 == open', 'XV-1 == closed'),
);
const condition: fc.Arbitrary<string> = fc.letrec((tie) => ({
  node: fc.oneof({ depthSize: 'small', withCrossShrink: true }, leaf, fc.tuple(tie('node'), fc.constantFrom('and', 'or'), tie('node')).map(([a, op, b]) => `(${a} ${op} ${b})`)),
})).node as fc.Arbitrary<string>;

const holdsAt = (text: string, seconds: number, valve: string) => {
  const parsed = parseCondition(text);
  if (!parsed.ok) throw new Error(parsed.error.message);
  const known = new Map<string, KnownValue>([['elapsed', { kind: 'number', base: seconds }], ['XV-1', { kind: 'word', value: valve }]]);
  return evaluateCondition(parsed.condition, known) === true;
};

describe('shortest elapsed time of an until', () => {
  it('is never later than a moment the condition can hold, and the condition cannot hold by elapsed time alone before it', () => {
    fc.assert(fc.property(condition, fc.integer({ min: 0, max: 8 * 3600 }), (text, t) => {
      const parsed = parseCondition(text);
      if (!parsed.ok) return;
      const bound = shortestElapsed(parsed.condition);
      const can = holdsAt(text, t, 'open') || holdsAt(text, t, 'closed');
      // Sound: any moment at which the until can be true lies at or after the bound (after it, when strict).
      if (can) expect(t > bound.seconds || (t === bound.seconds && !bound.strict)).toBe(true);
    }), { numRuns: 400 });
  });

  it('reads each unit of time', () => {
    // Source: NIST SP 811, Appendix B.8 (1 h = 3600 s, 1 min = 60 s)
    const of = (text: string) => {
      const p = parseCondition(text);
      return p.ok ? shortestElapsed(p.condition).seconds : Number.NaN;
    };
    expect(of('elapsed >= 1.5 h')).toBe(5400);
    expect(of('elapsed >= 60 min and XV-1 == open')).toBe(3600);
    expect(of('elapsed >= 60 min or XV-1 == open')).toBe(0);
    expect(of('(elapsed >= 2 min or elapsed >= 90 s) and elapsed > 30 s')).toBe(90);
  });

  it('the time-limit rules cite their sources', () => {
    // Source: DOE-STD-1029-92, time-dependent steps and contingency actions; common practice
    expect(rules['time-limit-below-expected'].meta.source).toMatch(/DOE-STD-1029.*common practice/);
    // Source: DOE-STD-1029-92 contingency actions; HSE HSG48, planning for the expected failure
    expect(rules['contingency-goto-unsafe'].meta.source).toMatch(/DOE-STD-1029.*HSG48/);
  });
});
