// A transition or trip condition read in plant words, from the signals' own texts: `XV-2107 == closed` reads
// "Charge chute valve XV-2107 closed", `TI-210 >= 205 degC` reads "Kettle temperature TI-210 at or above 205 degC".
// The tag expression stays next to it on the page; these words never replace it.
import type { Condition, Literal } from '../analysis/conditions/ast.ts';
import { parseCondition } from '../analysis/conditions/parse.ts';
import { printLiteral } from '../analysis/conditions/print.ts';

export interface SignalText {
  text: string;
  unit?: string;
}

const comparisons: Record<string, string> = {
  '>=': 'at or above', '<=': 'at or below', '>': 'above', '<': 'below', '==': 'at', '!=': 'not at',
};

/** Tags look like `TI-210`, `XV-2107`, `FSLL-224`: upper-case letters and digits. Other names are internal keys. */
function looksLikeTag(name: string): boolean {
  return /[A-Z]/.test(name) && /\d/.test(name) && !/[a-z]/.test(name);
}

/** "Kettle temperature TI-210": the signal's text with its tag, unless the text already names it. */
function subject(name: string, signals: Readonly<Record<string, SignalText>>): string | undefined {
  const signal = signals[name];
  if (!signal?.text?.trim()) return undefined;
  const text = signal.text.trim();
  return looksLikeTag(name) && !text.includes(name) ? `${text} ${name}` : text;
}

function isYes(literal: Literal): boolean | undefined {
  if (literal.kind !== 'word') return undefined;
  const v = literal.value.toLowerCase();
  if (v === 'true' || v === 'yes' || v === 'on') return true;
  if (v === 'false' || v === 'no' || v === 'off') return false;
  return undefined;
}

function words(c: Condition, signals: Readonly<Record<string, SignalText>>, top: boolean): string | undefined {
  switch (c.kind) {
    case 'flag': {
      if (c.name.name === 'done') return 'the actions of this step are done';
      const s = subject(c.name.name, signals);
      return s;
    }
    case 'not': {
      const inner = words(c.operand, signals, false);
      if (inner === undefined) return undefined;
      if (c.operand.kind === 'flag') return `${inner}: no`;
      return `not (${inner})`;
    }
    case 'and':
    case 'or': {
      const parts = c.operands.map((o) => words(o, signals, false));
      if (parts.some((p) => p === undefined)) return undefined;
      const joined = parts.join(c.kind === 'and' ? ', and ' : ', or ');
      return top ? joined : `(${joined})`;
    }
    case 'compare': {
      const name = c.name.name;
      if (name === 'elapsed') {
        const amount = printLiteral(c.value);
        if (c.op === '>=' || c.op === '>') return `${amount} in this step`;
        if (c.op === '<' || c.op === '<=') return `less than ${amount} in this step`;
        return `${amount} in this step (${c.op})`;
      }
      const s = subject(name, signals);
      if (s === undefined) return undefined;
      const yes = isYes(c.value);
      if (yes !== undefined && (c.op === '==' || c.op === '!=')) {
        const positive = (c.op === '==') === yes;
        return positive ? s : `${s}: no`;
      }
      if (c.value.kind === 'word') return c.op === '!=' ? `${s} not ${c.value.value}` : c.op === '==' ? `${s} ${c.value.value}` : `${s} ${comparisons[c.op]} ${c.value.value}`;
      return `${s} ${comparisons[c.op]} ${printLiteral(c.value)}`;
    }
  }
}

/**
 * The condition in plant words, or undefined when it cannot be read (a syntax error) or names a signal with no
 * text: the page then shows the expression alone rather than a half-translated sentence.
 */
export function conditionInWords(expression: string, signals: Readonly<Record<string, SignalText>>): string | undefined {
  const parsed = parseCondition(expression);
  if (!parsed.ok) return undefined;
  const text = words(parsed.condition, signals, true);
  if (text === undefined) return undefined;
  return text.charAt(0).toUpperCase() + text.slice(1);
}
