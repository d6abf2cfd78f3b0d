// Prints a condition in canonical form; parentheses where written or where the meaning needs them.
import type { Condition, Literal } from './ast.ts';

function printNumber(value: number): string {
  // String() is exact for doubles and the tokenizer reads its exponent form back; keep the sign of -0.
  return Object.is(value, -0) ? '-0' : String(value);
}

export function printLiteral(literal: Literal): string {
  if (literal.kind === 'quantity') return `${printNumber(literal.value)} ${literal.unit}`;
  if (literal.kind === 'number') return printNumber(literal.value);
  return literal.value;
}

/** Whether `child` must be wrapped to keep its meaning (and its own node) under `parent`. */
function needsParentheses(child: Condition, parent: Condition['kind']): boolean {
  if (child.kind !== 'and' && child.kind !== 'or') return false;
  if (parent === 'not') return true;
  // An unwrapped chain of the same operator would be read back as one flat node.
  return parent === child.kind || parent === 'and';
}

function wrap(text: string, parenthesized: boolean | undefined): string {
  return parenthesized ? `(${text})` : text;
}

function printInner(c: Condition): string {
  switch (c.kind) {
    case 'compare':
      return `${c.name.name} ${c.op} ${printLiteral(c.value)}`;
    case 'flag':
      return c.name.name;
    case 'not':
      return `not ${printChild(c.operand, 'not')}`;
    case 'and':
    case 'or':
      return c.operands.map((o) => printChild(o, c.kind)).join(` ${c.kind} `);
  }
}

function printChild(child: Condition, parent: Condition['kind']): string {
  return wrap(printInner(child), child.parenthesized || needsParentheses(child, parent));
}

export function printCondition(condition: Condition): string {
  return wrap(printInner(condition), condition.parenthesized);
}
