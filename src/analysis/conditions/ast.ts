// The syntax tree of a transition or trip condition, with offsets into the condition text.

/** Offsets [from, to) into the condition string. */
export interface Span {
  from: number;
  to: number;
}

export type CompareOp = '==' | '!=' | '<' | '<=' | '>' | '>=';

export interface NameRef {
  name: string;
  span: Span;
}

export type Literal =
  /** `unitSpan` covers the unit alone, when the literal came from text. */
  | { kind: 'quantity'; value: number; unit: string; span: Span; unitSpan?: Span }
  | { kind: 'number'; value: number; span: Span }
  | { kind: 'word'; value: string; span: Span };

export type Condition =
  /** `opSpan` covers the operator, when the comparison came from text. */
  | { kind: 'compare'; op: CompareOp; name: NameRef; value: Literal; span: Span; opSpan?: Span; parenthesized?: boolean }
  | { kind: 'and' | 'or'; operands: Condition[]; span: Span; parenthesized?: boolean }
  | { kind: 'not'; operand: Condition; span: Span; parenthesized?: boolean }
  /** A name on its own: a boolean signal, or the built-in `done`. */
  | { kind: 'flag'; name: NameRef; span: Span; parenthesized?: boolean };

export interface ConditionSyntaxError {
  message: string;
  hint: string;
  span: Span;
}

export type ConditionParseResult = { ok: true; condition: Condition } | { ok: false; error: ConditionSyntaxError };

/** Names every condition may use without declaring them. */
export const builtInNames = ['done', 'elapsed'] as const;
