// Checks a parsed condition against the declared signals: names exist, units convert, words are allowed values.
import { closest, distance } from 'fastest-levenshtein';
import { checkUnit, unitDimension } from '../units.ts';
import type { Condition, Literal, NameRef, Span } from './ast.ts';
import { builtInNames } from './ast.ts';
import { comparisonsIn, namesIn, type Comparison } from './parse.ts';
import { printLiteral } from './print.ts';

/** What a condition may know about a signal; the model's Signal fits. */
export interface SignalDeclaration {
  unit?: string;
  range?: [number, number];
  values?: Array<string | number | boolean>;
}

export type ResolveProblemKind = 'undeclared-name' | 'unit-mismatch' | 'unknown-unit' | 'bad-value' | 'missing-unit';

export interface ResolveProblem {
  kind: ResolveProblemKind;
  /** Offsets into the condition text. */
  span: Span;
  message: string;
  hint: string;
}

const orderingOps = new Set(['<', '<=', '>', '>=']);

function isBoolean(signal: SignalDeclaration): boolean {
  return !!signal.values?.length && signal.values.every((v) => v === true || v === false || v === 'true' || v === 'false');
}

function showValues(values: Array<string | number | boolean>): string {
  return values.map(String).join(', ');
}

function suggestName(name: string, declared: string[]): string {
  const candidates = [...declared, ...builtInNames];
  const sameLetters = candidates.find((c) => c.toLowerCase() === name.toLowerCase());
  if (sameLetters) return `Did you mean ${sameLetters}? Names are case-sensitive.`;
  if (candidates.length) {
    const near = closest(name, candidates);
    if (distance(name, near) <= Math.max(1, Math.floor(name.length / 3))) return `Did you mean ${near}?`;
  }
  const shown = declared.slice(0, 6).join(', ');
  return declared.length ? `Declare it under signals, or use a declared name (${shown}${declared.length > 6 ? ', ...' : ''}).` : 'Declare it under signals with its text and unit or values.';
}

function problem(kind: ResolveProblemKind, span: Span, message: string, hint: string): ResolveProblem {
  return { kind, span, message, hint };
}

/** The unit problem of a quantity literal compared with a signal in `unit` (a `dimension` quantity). */
function checkQuantity(literal: Extract<Literal, { kind: 'quantity' }>, name: string, unit: string, dimension: string | null, inUnit = true): ResolveProblem | null {
  const unitSpan = literal.unitSpan ?? literal.span;
  const unknown = checkUnit(literal.unit, dimension === null ? undefined : { unit, name });
  if (unknown) return problem('unknown-unit', unitSpan, unknown.message, unknown.hint);
  if (dimension === null) return null; // The signal's own unit is reported where it is declared.
  const found = unitDimension(literal.unit);
  if (found === dimension) return null;
  // "238 C" reads as coulombs in SI; people mean degrees.
  const meant = literal.unit === 'C' || literal.unit === 'F' ? ` Write deg${literal.unit} for degrees.` : '';
  return problem(
    'unit-mismatch',
    unitSpan,
    `${name} is a ${dimension}${inUnit ? ` in ${unit}` : ''}, but ${literal.unit} is a unit of ${found}.`,
    `Write the value in ${unit} or another ${dimension} unit, e.g. ${name} >= ${literal.value} ${unit}.${meant}`,
  );
}

function checkComparison(c: Comparison, signal: SignalDeclaration): ResolveProblem | null {
  const name = c.name.name;
  const literal = c.value;
  const shown = printLiteral(literal);

  if (signal.unit) {
    const dimension = unitDimension(signal.unit);
    if (literal.kind === 'quantity') return checkQuantity(literal, name, signal.unit, dimension);
    if (literal.kind === 'number') {
      return problem('missing-unit', literal.span, `'${shown}' has no unit; ${name} is measured in ${signal.unit}.`, `Write ${name} ${c.op} ${shown} ${signal.unit}.`);
    }
    if (!signal.values?.includes(literal.value)) {
      return problem('bad-value', literal.span, `${name} is measured in ${signal.unit}; '${shown}' is not a number.`, `Compare it with a number and unit, e.g. ${name} ${c.op} 100 ${signal.unit}.`);
    }
    return null;
  }

  if (literal.kind === 'quantity') {
    const unknown = checkUnit(literal.unit);
    if (unknown) return problem('unknown-unit', literal.unitSpan ?? literal.span, unknown.message, unknown.hint);
    return problem('unit-mismatch', literal.unitSpan ?? literal.span, `${name} has no unit, but '${shown}' has one.`, `Write the value without ${literal.unit}, or declare a unit for ${name}.`);
  }
  if (!signal.values) return null; // Nothing declared about the domain: nothing to hold the value against.

  const allowed = signal.values;
  const matches =
    literal.kind === 'word'
      ? allowed.includes(literal.value) || (literal.value === 'true' && allowed.includes(true)) || (literal.value === 'false' && allowed.includes(false))
      : allowed.includes(literal.value) || allowed.includes(String(literal.value));
  if (!matches) {
    const near = literal.kind === 'word' ? allowed.map(String).find((v) => v.toLowerCase() === literal.value.toLowerCase()) : undefined;
    const hint = near ? `Did you mean ${near}? Values are case-sensitive.` : `Write one of: ${showValues(allowed)}.`;
    return problem('bad-value', literal.span, `'${shown}' is not a value of ${name} (${showValues(allowed)}).`, hint);
  }
  if (literal.kind === 'word' && orderingOps.has(c.op)) {
    return problem('bad-value', c.opSpan ?? c.span, `'${c.op}' cannot compare ${name} with the word '${shown}'; words have no order.`, `Use == or !=, e.g. ${name} == ${shown}.`);
  }
  return null;
}

function checkBuiltIn(c: Comparison): ResolveProblem | null {
  const literal = c.value;
  const shown = printLiteral(literal);
  if (c.name.name === 'elapsed') {
    if (literal.kind === 'quantity') return checkQuantity(literal, 'elapsed', 'min', 'time', false);
    if (literal.kind === 'number') return problem('missing-unit', literal.span, `'${shown}' has no unit; elapsed is a time.`, `Write e.g. elapsed ${c.op} ${shown} min.`);
    return problem('bad-value', literal.span, `elapsed is a time; '${shown}' is not one.`, 'Compare it with a time, e.g. elapsed >= 90 min.');
  }
  // done is a yes/no flag.
  if (literal.kind === 'word' && (literal.value === 'true' || literal.value === 'false') && !orderingOps.has(c.op)) return null;
  return problem('bad-value', literal.span, `done is true or false; '${c.op} ${shown}' does not apply.`, 'Write done on its own, or done == false.');
}

function checkFlag(name: NameRef, signal: SignalDeclaration | undefined): ResolveProblem | null {
  if (!signal && name.name === 'done') return null;
  if (!signal && name.name === 'elapsed') return problem('bad-value', name.span, 'elapsed is a time, not a yes/no signal.', 'Compare it with a time, e.g. elapsed >= 90 min.');
  if (!signal || isBoolean(signal) || (!signal.unit && !signal.values)) return null;
  if (signal.unit) {
    return problem('bad-value', name.span, `${name.name} is measured in ${signal.unit}, so it is not true or false on its own.`, `Compare it, e.g. ${name.name} >= 100 ${signal.unit}.`);
  }
  const first = String(signal.values?.[0]);
  return problem('bad-value', name.span, `${name.name} takes the values ${showValues(signal.values ?? [])}, so it is not true or false on its own.`, `Compare it, e.g. ${name.name} == ${first}.`);
}

/** Problems with the names and values of a parsed condition, in reading order. */
export function resolveCondition(condition: Condition, signals: Readonly<Record<string, SignalDeclaration>>): ResolveProblem[] {
  const declared = Object.keys(signals);
  const isDeclared = (name: string) => Object.hasOwn(signals, name);
  const isBuiltIn = (name: string) => (builtInNames as readonly string[]).includes(name);
  const problems: ResolveProblem[] = [];

  for (const ref of namesIn(condition)) {
    if (isDeclared(ref.name) || isBuiltIn(ref.name)) continue;
    problems.push(problem('undeclared-name', ref.span, `'${ref.name}' is not a declared signal.`, suggestName(ref.name, declared)));
  }
  visitFlags(condition, (name) => {
    const found = isDeclared(name.name) ? checkFlag(name, signals[name.name]) : isBuiltIn(name.name) ? checkFlag(name, undefined) : null;
    if (found) problems.push(found);
  });
  for (const c of comparisonsIn(condition)) {
    const name = c.name.name;
    // A declared signal named like a built-in wins: the procedure said what it means.
    const found = isDeclared(name) ? checkComparison(c, signals[name]) : isBuiltIn(name) ? checkBuiltIn(c) : null;
    if (found) problems.push(found);
  }
  return problems.sort((a, b) => a.span.from - b.span.from || a.span.to - b.span.to);
}

function visitFlags(condition: Condition, each: (name: NameRef) => void): void {
  if (condition.kind === 'flag') each(condition.name);
  if (condition.kind === 'not') visitFlags(condition.operand, each);
  if (condition.kind === 'and' || condition.kind === 'or') for (const o of condition.operands) visitFlags(o, each);
}
