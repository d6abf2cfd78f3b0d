import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { CompareOp, Condition, Literal } from '../../../src/analysis/conditions/ast.ts';
import { parseCondition } from '../../../src/analysis/conditions/parse.ts';
import { printCondition } from '../../../src/analysis/conditions/print.ts';

const span = { from: 0, to: 0 };
const keywords = ['and', 'or', 'not'];
const identifier = fc.stringMatching(/^[A-Za-z][A-Za-z0-9_-]{0,7}$/).filter((s) => !keywords.includes(s));
const units = ['degC', 'degF', 'K', 'kPa', 'mmHg', 'Torr', 'psi', 'bar', 'kg', 'lb', 't', 'L', 'm3', 'gal', 's', 'min', 'h', '%', 'percent', 'mg/g', 'kg/h', 'L/min', 'm3/h', '°C'];
const ops: CompareOp[] = ['==', '!=', '<', '<=', '>', '>='];
const number = fc.double({ noNaN: true, noDefaultInfinity: true });

const literal: fc.Arbitrary<Literal> = fc.oneof(
  fc.record({ kind: fc.constant('quantity' as const), value: number, unit: fc.constantFrom(...units), span: fc.constant(span) }),
  fc.record({ kind: fc.constant('number' as const), value: number, span: fc.constant(span) }),
  fc.record({ kind: fc.constant('word' as const), value: identifier, span: fc.constant(span) }),
);

/** Marks a node as written in parentheses, as the grammar requires where precedence or flattening demands it. */
function inParens(c: Condition): Condition {
  return { ...c, parenthesized: true };
}

function operandOf(parent: 'and' | 'or' | 'not', c: Condition): Condition {
  if (c.kind === 'and' || c.kind === 'or') {
    // not binds tighter than both; and binds tighter than or; a same-operator child would flatten.
    if (parent === 'not' || parent === 'and' || parent === c.kind) return inParens(c);
  }
  return c;
}

const { condition } = fc.letrec<{ condition: Condition }>((tie) => ({
  condition: fc
    .tuple(
      fc.oneof(
        { depthSize: 'small', withCrossShrink: true },
        fc.record({ kind: fc.constant('flag' as const), name: fc.record({ name: identifier, span: fc.constant(span) }), span: fc.constant(span) }),
        fc.record({
          kind: fc.constant('compare' as const),
          op: fc.constantFrom(...ops),
          name: fc.record({ name: identifier, span: fc.constant(span) }),
          value: literal,
          span: fc.constant(span),
        }),
        tie('condition').map((c): Condition => ({ kind: 'not', operand: operandOf('not', c), span })),
        fc
          .tuple(fc.constantFrom('and' as const, 'or' as const), fc.array(tie('condition'), { minLength: 2, maxLength: 4 }))
          .map(([kind, operands]): Condition => ({ kind, operands: operands.map((o) => operandOf(kind, o)), span })),
      ),
      fc.boolean(),
    )
    .map(([c, extraParens]) => (extraParens ? inParens(c) : c)),
}));

/** Trees as another module might build them: no parentheses marked anywhere. */
const { bare } = fc.letrec<{ bare: Condition }>((tie) => ({
  bare: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    fc.record({ kind: fc.constant('flag' as const), name: fc.record({ name: identifier, span: fc.constant(span) }), span: fc.constant(span) }),
    tie('bare').map((c): Condition => ({ kind: 'not', operand: c, span })),
    fc
      .tuple(fc.constantFrom('and' as const, 'or' as const), fc.array(tie('bare'), { minLength: 2, maxLength: 3 }))
      .map(([kind, operands]): Condition => ({ kind, operands, span })),
  ),
}));

/** Truth of a tree of flags, for the names that `isTrue` holds. */
function evaluate(c: Condition, isTrue: (name: string) => boolean): boolean {
  switch (c.kind) {
    case 'flag':
      return isTrue(c.name.name);
    case 'compare':
      return isTrue(c.name.name);
    case 'not':
      return !evaluate(c.operand, isTrue);
    case 'and':
      return c.operands.every((o) => evaluate(o, isTrue));
    case 'or':
      return c.operands.some((o) => evaluate(o, isTrue));
  }
}

/** Drops offsets, which printing cannot keep. */
function withoutSpans(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(withoutSpans);
  if (value && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).filter(([k]) => !['span', 'unitSpan', 'opSpan'].includes(k)).map(([k, v]) => [k, withoutSpans(v)]));
  }
  return value;
}

describe('printCondition', () => {
  it('prints canonical text', () => {
    const print = (text: string) => {
      const r = parseCondition(text);
      return r.ok ? printCondition(r.condition) : `error: ${r.error.message}`;
    };
    expect(print('TI-210>=238degC')).toBe('TI-210 >= 238 degC');
    expect(print('  a   and (b or   c) ')).toBe('a and (b or c)');
    expect(print('not ((a))')).toBe('not (a)');
    expect(print('x > 1.50e3 kg')).toBe('x > 1500 kg');
  });

  it('adds the parentheses a hand-built tree needs', () => {
    const flag = (name: string): Condition => ({ kind: 'flag', name: { name, span }, span });
    const or: Condition = { kind: 'or', operands: [flag('a'), flag('b')], span };
    expect(printCondition({ kind: 'and', operands: [or, flag('c')], span })).toBe('(a or b) and c');
    expect(printCondition({ kind: 'not', operand: or, span })).toBe('not (a or b)');
    expect(printCondition({ kind: 'or', operands: [or, flag('c')], span })).toBe('(a or b) or c');
  });

  it('round-trips: parsing the printed text gives the same tree', () => {
    fc.assert(
      fc.property(condition, (c) => {
        const text = printCondition(c);
        const result = parseCondition(text);
        if (!result.ok) throw new Error(`'${text}' did not parse: ${result.error.message}`);
        expect(withoutSpans(result.condition)).toEqual(withoutSpans(c));
        expect(printCondition(result.condition)).toBe(text);
      }),
      { numRuns: 500 },
    );
  });
});

describe('printCondition on trees without marked parentheses', () => {
  it('keeps their meaning', () => {
    fc.assert(
      fc.property(bare, fc.func(fc.boolean()), (c, truth) => {
        const result = parseCondition(printCondition(c));
        expect(result.ok).toBe(true);
        if (result.ok) expect(evaluate(result.condition, truth)).toBe(evaluate(c, truth));
      }),
      { numRuns: 500 },
    );
  });
});

describe('parseCondition on any text', () => {
  const pieces = ['a', 'TI-210', ' ', '(', ')', 'and', 'or', 'not', '>=', '==', '<', '!=', '=', '&&', '!', '5', '-3.5', 'degC', 'mg/g', '%', 'e', '.', ',', '"', 'AND', 'done'];
  const soup = fc.array(fc.constantFrom(...pieces), { maxLength: 14 }).map((p) => p.join(''));

  it('never throws, and points inside the text', () => {
    fc.assert(
      fc.property(fc.oneof(fc.string(), soup), (text) => {
        const result = parseCondition(text);
        if (result.ok) {
          expect(result.condition.span.from).toBeGreaterThanOrEqual(0);
          expect(result.condition.span.to).toBeLessThanOrEqual(text.length);
        } else {
          expect(result.error.span.from).toBeGreaterThanOrEqual(0);
          expect(result.error.span.to).toBeLessThanOrEqual(text.length);
          expect(result.error.span.from).toBeLessThanOrEqual(result.error.span.to);
          expect(result.error.hint.length).toBeGreaterThan(0);
        }
      }),
      { numRuns: 2000 },
    );
  });
});
