// Evaluates a condition for known values of some signals, in three-valued logic (true, false, unknown).
import type { CompareOp, Condition, Literal } from './conditions/ast.ts';
import { toBase } from './units.ts';

export type Truth = true | false | 'unknown';

/** A known value: a number in SI base units, or an enumerated value. */
export type KnownValue = { kind: 'number'; base: number } | { kind: 'word'; value: string };

export function evaluateCondition(condition: Condition, known: ReadonlyMap<string, KnownValue>): Truth {
  switch (condition.kind) {
    case 'compare': {
      const value = known.get(condition.name.name);
      if (!value) return 'unknown';
      return compareKnown(value, condition.op, condition.value);
    }
    case 'flag': {
      const value = known.get(condition.name.name);
      if (!value || value.kind !== 'word') return 'unknown';
      return value.value === 'true';
    }
    case 'not': {
      const inner = evaluateCondition(condition.operand, known);
      return inner === 'unknown' ? 'unknown' : !inner;
    }
    case 'and': {
      let result: Truth = true;
      for (const c of condition.operands) {
        const v = evaluateCondition(c, known);
        if (v === false) return false;
        if (v === 'unknown') result = 'unknown';
      }
      return result;
    }
    case 'or': {
      let result: Truth = false;
      for (const c of condition.operands) {
        const v = evaluateCondition(c, known);
        if (v === true) return true;
        if (v === 'unknown') result = 'unknown';
      }
      return result;
    }
  }
}

export function literalToBase(literal: Literal): number | null {
  if (literal.kind === 'quantity') {
    const base = toBase(literal.value, literal.unit);
    return base === null || Number.isNaN(base) ? null : base;
  }
  if (literal.kind === 'number') return literal.value;
  return null;
}

function compareKnown(value: KnownValue, op: CompareOp, literal: Literal): Truth {
  if (value.kind === 'word') {
    if (literal.kind !== 'word') return 'unknown';
    if (op === '==') return value.value === literal.value;
    if (op === '!=') return value.value !== literal.value;
    return 'unknown';
  }
  const threshold = literalToBase(literal);
  if (threshold === null) return 'unknown';
  return compareNumbers(value.base, op, threshold);
}

export function compareNumbers(a: number, op: CompareOp, b: number): boolean {
  switch (op) {
    case '==': return a === b;
    case '!=': return a !== b;
    case '<': return a < b;
    case '<=': return a <= b;
    case '>': return a > b;
    case '>=': return a >= b;
  }
}
