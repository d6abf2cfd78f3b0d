import { describe, expect, it } from 'vitest';
import type { Condition, Span } from '../../../src/analysis/conditions/ast.ts';
import { comparisonsIn, namesIn, parseCondition } from '../../../src/analysis/conditions/parse.ts';

function parsed(text: string): Condition {
  const result = parseCondition(text);
  if (!result.ok) throw new Error(`did not parse: ${text}: ${result.error.message}`);
  return result.condition;
}

function slice(text: string, span: Span): string {
  return text.slice(span.from, span.to);
}

/** The shape of a tree with names only, to compare structure briefly. */
function shape(c: Condition): unknown {
  const mark = c.parenthesized ? '()' : '';
  switch (c.kind) {
    case 'flag':
      return c.name.name + mark;
    case 'compare':
      return `${c.name.name}${c.op}${c.value.kind === 'quantity' ? `${c.value.value}[${c.value.unit}]` : c.value.value}${mark}`;
    case 'not':
      return { [`not${mark}`]: shape(c.operand) };
    default:
      return { [c.kind + mark]: c.operands.map(shape) };
  }
}

describe('parseCondition', () => {
  it('reads a comparison with exact positions', () => {
    const text = 'TI-210 >= 238 degC';
    const c = parsed(text);
    expect(c.kind).toBe('compare');
    if (c.kind !== 'compare') return;
    expect(c.op).toBe('>=');
    expect(slice(text, c.name.span)).toBe('TI-210');
    expect(slice(text, c.opSpan!)).toBe('>=');
    expect(c.value).toMatchObject({ kind: 'quantity', value: 238, unit: 'degC' });
    expect(slice(text, c.value.span)).toBe('238 degC');
    if (c.value.kind === 'quantity') expect(slice(text, c.value.unitSpan!)).toBe('degC');
    expect(c.span).toEqual({ from: 0, to: text.length });
  });

  it.each([
    ['acid-value <= 12 mg/g', 12, 'mg/g'],
    ['FQ-211 >= 600 kg', 600, 'kg'],
    ['x > 15 %', 15, '%'],
    ['x < 2.5 m3/h', 2.5, 'm3/h'],
    ['x >= 40 L/min', 40, 'L/min'],
    ['TI-210 > -5 degC', -5, 'degC'],
    ['PI-210<=60mmHg', 60, 'mmHg'],
    ['x > 1.5e3 kg/h', 1500, 'kg/h'],
    ['elapsed >= 90 min', 90, 'min'],
  ])('reads the quantity in %s', (text, value, unit) => {
    const [cmp] = comparisonsIn(parsed(text));
    expect(cmp.value).toMatchObject({ kind: 'quantity', value, unit });
    if (cmp.value.kind === 'quantity') expect(slice(text, cmp.value.unitSpan!)).toBe(unit);
  });

  it('reads words, bare numbers and flags', () => {
    expect(comparisonsIn(parsed('lab-result == pass'))[0].value).toMatchObject({ kind: 'word', value: 'pass' });
    expect(comparisonsIn(parsed('agitator-on != false'))[0].value).toMatchObject({ kind: 'word', value: 'false' });
    expect(comparisonsIn(parsed('count == 3'))[0].value).toMatchObject({ kind: 'number', value: 3 });
    expect(comparisonsIn(parsed('x > 5 and y'))[0].value).toMatchObject({ kind: 'number', value: 5 });
    expect(parsed('done')).toMatchObject({ kind: 'flag', name: { name: 'done', span: { from: 0, to: 4 } } });
  });

  it('binds not tighter than and, and and tighter than or', () => {
    expect(shape(parsed('a or b and c'))).toEqual({ or: ['a', { and: ['b', 'c'] }] });
    expect(shape(parsed('not a and b'))).toEqual({ and: [{ not: 'a' }, 'b'] });
    expect(shape(parsed('not not a'))).toEqual({ not: { not: 'a' } });
    expect(shape(parsed('not x == pass or y'))).toEqual({ or: [{ not: 'x==pass' }, 'y'] });
  });

  it('flattens chains of one operator, but not across parentheses', () => {
    expect(shape(parsed('a and b and c and d'))).toEqual({ and: ['a', 'b', 'c', 'd'] });
    expect(shape(parsed('a or b or c'))).toEqual({ or: ['a', 'b', 'c'] });
    expect(shape(parsed('(a and b) and c'))).toEqual({ and: [{ 'and()': ['a', 'b'] }, 'c'] });
    expect(shape(parsed('not (a or b)'))).toEqual({ not: { 'or()': ['a', 'b'] } });
    expect(shape(parsed('((a))'))).toEqual('a()');
  });

  it('gives nodes spans that cover what was written, parentheses included', () => {
    const text = 'PI-210 <= 60 mmHg and (agitator-on == true or done)';
    const c = parsed(text);
    expect(c.kind).toBe('and');
    if (c.kind !== 'and') return;
    expect(slice(text, c.operands[0].span)).toBe('PI-210 <= 60 mmHg');
    expect(slice(text, c.operands[1].span)).toBe('(agitator-on == true or done)');
    expect(c.span).toEqual({ from: 0, to: text.length });
    const n = parsed('  not  done ');
    expect(n.span).toEqual({ from: 2, to: 11 });
  });

  it('lists names and comparisons in reading order', () => {
    const text = 'TI-210 >= 238 degC and not (lab-result == pass or done) and TI-210 < 250 degC';
    const c = parsed(text);
    expect(namesIn(c).map((n) => n.name)).toEqual(['TI-210', 'lab-result', 'done', 'TI-210']);
    expect(namesIn(c).map((n) => slice(text, n.span))).toEqual(['TI-210', 'lab-result', 'done', 'TI-210']);
    expect(comparisonsIn(c).map((x) => x.op)).toEqual(['>=', '==', '<']);
  });

  // Each case: text, the exact text the error points at, its start.
  it.each([
    ['TI-210 >=', '>=', 7],
    ['TI-210 >= and done', '>=', 7],
    ['a && b', '&&', 2],
    ['a || b', '||', 2],
    ['!done', '!', 0],
    ['a = 5', '=', 2],
    ['a => 5 kg', '=>', 2],
    ['a =< 5 kg', '=<', 2],
    ['a <> 5', '<>', 2],
    ['a === 5', '===', 2],
    ['(a and b', '(', 0],
    ['a and b)', ')', 7],
    ['a AND b', 'AND', 2],
    ['agitator on', 'on', 9],
    ['TI-210 238 degC', '238', 7],
    ['238 degC <= TI-210', '238', 0],
    ['a < 5 < 10', '<', 6],
    ['a and', 'and', 2],
    ['not', 'not', 0],
    ['()', ')', 1],
    ['a >= >= 5', '>= >=', 2],
    ['x == "pass"', '"', 5],
    ['x >= 2,5 kg', ',', 6],
    ['a not b', 'not', 2],
    ['a # b', '#', 2],
    ['a and or b', 'or', 6],
    ['x ≥ 5 degC', '≥', 2],
  ])('reports %j at the exact place', (text, at, from) => {
    const result = parseCondition(text);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.error.span.from).toBe(from);
    expect(slice(text, result.error.span)).toBe(at);
    expect(result.error.message.length).toBeGreaterThan(0);
    expect(result.error.hint.length).toBeGreaterThan(0);
  });

  it('says what to write instead', () => {
    const hintFor = (text: string) => {
      const r = parseCondition(text);
      return r.ok ? '' : r.error.hint;
    };
    expect(hintFor('a && b')).toContain("'and'");
    expect(hintFor('a || b')).toContain("'or'");
    expect(hintFor('a => 5 kg')).toContain("'>='");
    expect(hintFor('238 degC <= TI-210')).toContain('TI-210 >= 238 degC');
    expect(hintFor('TI-210 >=')).toContain('TI-210 >= 238 degC');
  });

  it('reports an empty condition over its whole text', () => {
    for (const text of ['', '   ']) {
      const result = parseCondition(text);
      expect(result.ok).toBe(false);
      if (!result.ok) expect(result.error.span).toEqual({ from: 0, to: text.length });
    }
  });
});
