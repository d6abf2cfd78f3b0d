// Comparisons the register rules share: two conditions or two quantities that mean the same, whatever their units.
import { parseCondition } from './conditions/parse.ts';
import type { Condition } from './conditions/ast.ts';
import { parseQuantity, toBase } from './units.ts';

const keys = new Map<string, string | null>();

/** A canonical key of a condition: same key, same meaning (quantities compared in SI base units). */
export function conditionKey(text: string): string | null {
  // Rules compare the same few conditions across many procedures: each text is read once.
  let key = keys.get(text);
  if (key === undefined) {
    const parsed = parseCondition(text);
    key = parsed.ok ? keyOf(parsed.condition) : null;
    if (keys.size >= 20_000) keys.clear();
    keys.set(text, key);
  }
  return key;
}

function keyOf(c: Condition): string {
  switch (c.kind) {
    case 'compare': {
      const v = c.value;
      const value = v.kind === 'quantity' ? `${round(toBase(v.value, v.unit) ?? Number.NaN)}` : v.kind === 'number' ? String(v.value) : v.value;
      return `${c.name.name}${c.op}${value}`;
    }
    case 'flag':
      return c.name.name;
    case 'not':
      return `not(${keyOf(c.operand)})`;
    default:
      return `${c.kind}(${c.operands.map(keyOf).sort().join(',')})`;
  }
}

function round(n: number): string {
  return Number.isFinite(n) ? String(Number(n.toPrecision(9))) : 'NaN';
}

/** A quantity in SI base units, or null when it does not read as one. */
export function baseOf(text: string | undefined): number | null {
  if (text === undefined) return null;
  const q = parseQuantity(text);
  return q.ok ? toBase(q.value, q.unit) : null;
}

/** Whether two quantity texts are the same amount (e.g. "245 degC" and "518.15 K"). */
export function sameAmount(a: string | undefined, b: string | undefined): boolean {
  if (a === undefined || b === undefined) return a === b;
  const x = baseOf(a);
  const y = baseOf(b);
  if (x === null || y === null) return a.trim() === b.trim();
  return Math.abs(x - y) <= 1e-9 * Math.max(1, Math.abs(x), Math.abs(y));
}

/** Text compared the way a reader would: case, spaces and a final full stop do not matter. */
export function sameWording(a: string | undefined, b: string | undefined): boolean {
  return wording(a) === wording(b);
}

/** Text as sameWording compares it: lower case, spaces collapsed, no final full stop. */
export function wording(s: string | undefined): string {
  return (s ?? '').toLowerCase().replace(/\s+/g, ' ').trim().replace(/\.$/, '');
}
