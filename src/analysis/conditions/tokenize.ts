// Splits condition text into tokens with offsets, and explains symbols borrowed from other languages.
import type { CompareOp, ConditionSyntaxError, Span } from './ast.ts';

export type Keyword = 'and' | 'or' | 'not';

export type Token =
  /** A signal name, or a word value such as `pass`; the parser decides by position. */
  | { type: 'name'; text: string; span: Span }
  | { type: 'keyword'; text: Keyword; span: Span }
  | { type: 'number'; text: string; value: number; span: Span }
  /** The unit written right after a number. */
  | { type: 'unit'; text: string; span: Span }
  | { type: 'op'; text: CompareOp; span: Span }
  | { type: '(' | ')'; text: string; span: Span }
  | { type: 'end'; text: ''; span: Span };

export type TokenizeResult = { ok: true; tokens: Token[] } | { ok: false; error: ConditionSyntaxError };

const keywords = new Set<string>(['and', 'or', 'not']);
const namePattern = /[A-Za-z][A-Za-z0-9_-]*/y;
const numberPattern = /[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?/y;
// Units are read greedily after a number: m3/h, mg/g, %, degC/min, °C.
const unitPattern = /[A-Za-z%°µ][A-Za-z0-9%°µ/^*_·]*/y;
const operators: CompareOp[] = ['==', '!=', '<=', '>=', '<', '>'];

/** Symbols people bring from programming languages or maths, with what to write instead. */
const borrowed: Array<{ text: string; message: string; hint: string }> = [
  { text: '===', message: "'===' is not an operator.", hint: "Write '==' to compare for equality." },
  { text: '!==', message: "'!==' is not an operator.", hint: "Write '!=' for 'is not equal to'." },
  { text: '&&', message: "'&&' is not an operator.", hint: "Write 'and' to join conditions." },
  { text: '||', message: "'||' is not an operator.", hint: "Write 'or' to join conditions." },
  { text: '=>', message: "'=>' is not an operator.", hint: "Did you mean '>=' (at least)?" },
  { text: '=<', message: "'=<' is not an operator.", hint: "Did you mean '<=' (at most)?" },
  { text: '<>', message: "'<>' is not an operator.", hint: "Write '!=' for 'is not equal to'." },
  { text: '&', message: "'&' is not an operator.", hint: "Write 'and' to join conditions." },
  { text: '|', message: "'|' is not an operator.", hint: "Write 'or' to join conditions." },
  { text: '=', message: "'=' is not an operator.", hint: "Write '==' to compare for equality." },
  { text: '!', message: "'!' is not an operator.", hint: "Write 'not' to negate a condition." },
  { text: '≥', message: "'≥' is not an operator.", hint: "Write '>='." },
  { text: '≤', message: "'≤' is not an operator.", hint: "Write '<='." },
  { text: '≠', message: "'≠' is not an operator.", hint: "Write '!='." },
  { text: '"', message: 'Values are written without quotes.', hint: 'Write e.g. lab-result == pass.' },
  { text: "'", message: 'Values are written without quotes.', hint: 'Write e.g. lab-result == pass.' },
  { text: ',', message: "',' is not allowed in a condition.", hint: 'Write decimals with a point (2.5 m3/h) and join conditions with and/or.' },
];

function matchAt(pattern: RegExp, text: string, at: number): string | null {
  pattern.lastIndex = at;
  const m = pattern.exec(text);
  return m ? m[0] : null;
}

export function tokenize(text: string): TokenizeResult {
  const tokens: Token[] = [];
  let i = 0;
  const span = (from: number, to: number): Span => ({ from, to });

  while (i < text.length) {
    const ch = text[i];
    if (/\s/.test(ch)) {
      i++;
      continue;
    }
    if (ch === '(' || ch === ')') {
      tokens.push({ type: ch, text: ch, span: span(i, i + 1) });
      i++;
      continue;
    }
    const op = operators.find((o) => text.startsWith(o, i));
    const misuse = borrowed.find((b) => text.startsWith(b.text, i));
    // Check borrowed symbols first where they share a prefix with a real operator ('===' vs '==', '<>' vs '<').
    if (misuse && (!op || misuse.text.length > op.length)) {
      return { ok: false, error: { message: misuse.message, hint: misuse.hint, span: span(i, i + misuse.text.length) } };
    }
    if (op) {
      tokens.push({ type: 'op', text: op, span: span(i, i + op.length) });
      i += op.length;
      continue;
    }
    const name = matchAt(namePattern, text, i);
    if (name) {
      const token: Token = keywords.has(name)
        ? { type: 'keyword', text: name as Keyword, span: span(i, i + name.length) }
        : { type: 'name', text: name, span: span(i, i + name.length) };
      tokens.push(token);
      i += name.length;
      continue;
    }
    const number = matchAt(numberPattern, text, i);
    if (number) {
      tokens.push({ type: 'number', text: number, value: Number(number), span: span(i, i + number.length) });
      i += number.length;
      let j = i;
      while (j < text.length && /\s/.test(text[j])) j++;
      const unit = matchAt(unitPattern, text, j);
      // "5 and ..." : a keyword after a bare number is not its unit.
      if (unit && !keywords.has(unit)) {
        tokens.push({ type: 'unit', text: unit, span: span(j, j + unit.length) });
        i = j + unit.length;
      }
      continue;
    }
    const shown = String.fromCodePoint(text.codePointAt(i) ?? 0);
    return {
      ok: false,
      error: {
        message: `Unexpected character '${shown}'.`,
        hint: 'A condition holds names, numbers with units, == != < <= > >=, and, or, not and parentheses.',
        span: span(i, i + shown.length),
      },
    };
  }
  tokens.push({ type: 'end', text: '', span: span(text.length, text.length) });
  return { ok: true, tokens };
}
