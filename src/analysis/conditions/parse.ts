// Recursive-descent parser for transition and trip conditions: not binds tighter than and, and than or.
import type { CompareOp, Condition, ConditionParseResult, ConditionSyntaxError, Literal, NameRef, Span } from './ast.ts';
import { tokenize, type Keyword, type Token } from './tokenize.ts';
import { unitHint, unitSpellingFor } from '../units.ts';

const exampleHint = 'Write a condition such as TI-210 >= 238 degC or lab-result == pass.';
const valueHint = 'Write a number with its unit, e.g. TI-210 >= 238 degC, or a word, e.g. lab-result == pass.';
/** Deepest nesting of '(' and 'not' read; deeper conditions are a syntax error, never a stack overflow. */
export const maxConditionNesting = 64;
/** Most tokens read in one condition. */
export const maxConditionTokens = 2000;
const mirrored: Record<CompareOp, CompareOp> = { '==': '==', '!=': '!=', '<': '>', '<=': '>=', '>': '<', '>=': '<=' };

/** Thrown inside the parser only; parseCondition turns it into a value. */
interface SyntaxProblem {
  syntaxProblem: ConditionSyntaxError;
}

function fail(message: string, hint: string, span: Span): never {
  throw { syntaxProblem: { message, hint, span } } satisfies SyntaxProblem;
}

function isSyntaxProblem(caught: unknown): caught is SyntaxProblem {
  return typeof caught === 'object' && caught !== null && 'syntaxProblem' in caught;
}

function quote(token: Token): string {
  return token.type === 'end' ? 'the end of the condition' : `'${token.text}'`;
}

export function parseCondition(text: string): ConditionParseResult {
  const lexed = tokenize(text);
  if (!lexed.ok) return lexed;
  if (lexed.tokens.length > maxConditionTokens + 1) {
    return { ok: false, error: { message: `The condition has ${lexed.tokens.length - 1} parts; the limit is ${maxConditionTokens}.`, hint: 'Split the decision into several steps or branches; a condition an operator reads is short.', span: { from: 0, to: text.length } } };
  }
  if (lexed.tokens.length === 1) {
    return { ok: false, error: { message: 'The condition is empty.', hint: exampleHint, span: { from: 0, to: text.length } } };
  }
  try {
    return { ok: true, condition: parseTokens(lexed.tokens) };
  } catch (caught) {
    if (isSyntaxProblem(caught)) return { ok: false, error: caught.syntaxProblem };
    throw caught;
  }
}

function parseTokens(tokens: Token[]): Condition {
  let at = 0;
  let depth = 0;
  const enter = (token: Token) => {
    if (++depth > maxConditionNesting) {
      fail(`The condition nests brackets and 'not' more than ${maxConditionNesting} levels deep.`, 'Remove the extra brackets; a condition an operator reads needs only a few levels.', token.span);
    }
  };
  const peek = (offset = 0): Token => tokens[Math.min(at + offset, tokens.length - 1)];
  const take = (): Token => {
    const token = peek();
    if (token.type !== 'end') at++;
    return token;
  };
  const isKeyword = (word: Keyword): boolean => {
    const token = peek();
    return token.type === 'keyword' && token.text === word;
  };

  function parseChain(kind: 'and' | 'or', operand: () => Condition): Condition {
    const first = operand();
    if (!isKeyword(kind)) return first;
    const operands = [first];
    while (isKeyword(kind)) {
      take();
      operands.push(operand());
    }
    return { kind, operands, span: { from: first.span.from, to: operands[operands.length - 1].span.to } };
  }

  const parseOr = (): Condition => parseChain('or', parseAnd);
  const parseAnd = (): Condition => parseChain('and', parseNot);

  function parseNot(): Condition {
    if (!isKeyword('not')) return parsePrimary();
    const keyword = take();
    enter(keyword);
    const operand = parseNot();
    depth--;
    return { kind: 'not', operand, span: { from: keyword.span.from, to: operand.span.to } };
  }

  function parsePrimary(): Condition {
    const token = peek();
    if (token.type === '(') return parseGroup();
    if (token.type === 'name') return parseNamed();
    return missingCondition(token);
  }

  function parseGroup(): Condition {
    const open = take();
    enter(open);
    const inner = parseOr();
    depth--;
    const close = peek();
    if (close.type === 'end') fail("This '(' is never closed.", "Add ')' where the group ends.", open.span);
    if (close.type !== ')') unexpectedAfterCondition(close);
    take();
    return { ...inner, span: { from: open.span.from, to: close.span.to }, parenthesized: true };
  }

  function parseNamed(): Condition {
    const token = take();
    const name: NameRef = { name: token.text, span: token.span };
    const op = peek();
    if (op.type !== 'op') return { kind: 'flag', name, span: token.span };
    take();
    const value = parseLiteral(name, op);
    return { kind: 'compare', op: op.text, name, value, span: { from: token.span.from, to: value.span.to }, opSpan: op.span };
  }

  function parseLiteral(name: NameRef, op: Token): Literal {
    const token = peek();
    if (token.type === 'number') {
      take();
      const unit = peek();
      if (unit.type !== 'unit') return { kind: 'number', value: token.value, span: token.span };
      take();
      return { kind: 'quantity', value: token.value, unit: unit.text, span: { from: token.span.from, to: unit.span.to }, unitSpan: unit.span };
    }
    if (token.type === 'name') {
      take();
      return { kind: 'word', value: token.text, span: token.span };
    }
    if (token.type === 'op') {
      fail(`'${op.text}' is followed by another operator '${token.text}'.`, `Write one operator, e.g. ${name.name} >= 238 degC.`, { from: op.span.from, to: token.span.to });
    }
    fail(`Expected a value after '${op.text}'.`, valueHint, op.span);
  }

  /** Where a condition must start but this token cannot start one. */
  function missingCondition(token: Token): never {
    const before = at > 0 ? tokens[at - 1] : null;
    if (token.type === 'number') {
      // "238 degC <= TI-210": show the same comparison the right way round.
      const unit = peek(1).type === 'unit' ? peek(1) : null;
      const op = peek(unit ? 2 : 1);
      const name = peek(unit ? 3 : 2);
      if (op.type === 'op' && name.type === 'name') {
        const value = unit ? `${token.text} ${unit.text}` : token.text;
        fail('A comparison starts with the signal name, not the value.', `Put the name first: ${name.text} ${mirrored[op.text]} ${value}.`, token.span);
      }
      fail(`Expected a signal name, found the number '${token.text}'.`, exampleHint, token.span);
    }
    if (token.type === 'op') fail(`Expected a signal name before '${token.text}'.`, 'Start with the name of a signal, e.g. TI-210 >= 238 degC.', token.span);
    if (token.type === 'end' && before) fail(`Expected a condition after '${before.text}'.`, exampleHint, before.span);
    fail(`Expected a condition before ${quote(token)}.`, exampleHint, token.span);
  }

  /** Where a whole condition has been read and only and/or/')'/end may follow. */
  function unexpectedAfterCondition(token: Token): never {
    const before = tokens[at - 1];
    if (token.type === ')') fail("This ')' has no matching '('.", "Remove it, or add '(' where the group starts.", token.span);
    if (token.type === 'name' && ['and', 'or', 'not'].includes(token.text.toLowerCase())) {
      fail(`'${token.text}' must be written in lower case.`, `Write '${token.text.toLowerCase()}'.`, token.span);
    }
    if (token.type === 'name' && before.type === 'name') {
      fail(
        `Expected an operator, 'and' or 'or' after '${before.text}', found '${token.text}'.`,
        `Names have no spaces: join the words with '-', e.g. ${before.text}-${token.text}; or compare, e.g. ${before.text} == ${token.text}.`,
        token.span,
      );
    }
    if (token.type === 'number' && before.type === 'name') {
      const unit = peek(1).type === 'unit' ? ` ${peek(1).text}` : '';
      fail(`Expected a comparison operator between '${before.text}' and '${token.text}'.`, `Write e.g. ${before.text} >= ${token.text}${unit}.`, token.span);
    }
    if (before.type === 'unit') {
      // "6 bar g", "6 kPa(g)", "6 deg C": a unit written apart, which the tokens split after its first part.
      const group = token.type === '(' && peek(1).type === 'name' && peek(2).type === ')' ? [token, peek(1), peek(2)] : token.type === 'name' ? [token] : [];
      const written = group.length ? `${before.text}${token.type === '(' ? '' : ' '}${group.map((t) => t.text).join('')}` : '';
      const meant = written ? unitSpellingFor(written, { near: false }) : null;
      if (meant) {
        fail(`The unit '${written}' is written apart.`, unitHint(written), { from: before.span.from, to: group[group.length - 1].span.to });
      }
    }
    if (token.type === 'op') {
      fail('Comparisons cannot be chained.', "Compare one name at a time and join with 'and', e.g. TI-210 >= 200 degC and TI-210 <= 240 degC.", token.span);
    }
    if (token.type === 'keyword' && token.text === 'not') {
      fail("'not' cannot follow a condition.", "Join with 'and' or 'or' first, e.g. a and not b.", token.span);
    }
    fail(`Expected 'and', 'or' or the end of the condition, found ${quote(token)}.`, "Join conditions with 'and' or 'or'.", token.span);
  }

  const condition = parseOr();
  const next = peek();
  if (next.type !== 'end') unexpectedAfterCondition(next);
  return condition;
}

export type Comparison = Extract<Condition, { kind: 'compare' }>;

function visit(condition: Condition, each: (c: Condition) => void): void {
  each(condition);
  if (condition.kind === 'and' || condition.kind === 'or') for (const o of condition.operands) visit(o, each);
  if (condition.kind === 'not') visit(condition.operand, each);
}

/** Every name the condition uses, in reading order, repeats included (built-ins too). */
export function namesIn(condition: Condition): NameRef[] {
  const names: NameRef[] = [];
  visit(condition, (c) => {
    if (c.kind === 'compare' || c.kind === 'flag') names.push(c.name);
  });
  return names;
}

/** Every comparison in reading order. */
export function comparisonsIn(condition: Condition): Comparison[] {
  const found: Comparison[] = [];
  visit(condition, (c) => {
    if (c.kind === 'compare') found.push(c);
  });
  return found;
}
