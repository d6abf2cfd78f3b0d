// Hostile names and shapes: look-alike and invisible characters in signal names, prototype names that must
// not count as declared, and front-matter that looks like a procedure but yields none.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';

const base = readFileSync(join(import.meta.dirname, '../fixtures/rules/front-matter-not-mapping/valid-base.md'), 'utf8');
const today = '2026-12-01';
const check = (text: string) => checkSources([{ file: 'p.md', text }], { today }).diagnostics;
const rulesOf = (text: string) => check(text).map((d) => d.rule);

/** The base procedure with a second signal and a setpoint on it at the interlock's trip (255 degC trips TSHH-210). */
function withSecondSignal(name: string, setpoint = '260 degC'): string {
  return base
    .replace('  TI-210: { text: Kettle temperature, unit: degC, range: [0, 300] }\n', `  TI-210: { text: Kettle temperature, unit: degC, range: [0, 300] }\n  "${name}": { text: Kettle temperature, unit: degC, range: [0, 300] }\n`)
    .replace('    set: { TI-210: 180 degC }', `    set: { "${name}": ${setpoint} }`);
}

describe('look-alike and invisible characters in names', () => {
  it('the base fixture is clean, and the same setpoint on the real name is caught by the safety rules', () => {
    expect(check(base).filter((d) => d.severity === 'error')).toEqual([]);
    const real = base.replace('    set: { TI-210: 180 degC }', '    set: { TI-210: 260 degC }');
    expect(rulesOf(real)).toContain('setpoint-outside-limits');
  });

  for (const [label, name, codePoint] of [
    ['Cyrillic I', 'T\u0406-210', 'U+0406'],
    ['Greek capital iota', 'T\u0399-210', 'U+0399'],
    ['zero-width space after the name', 'TI-210\u200B', 'U+200B'],
    ['right-to-left override', 'TI-\u202E012', 'U+202E'],
    ['fullwidth letter', 'T\uFF29-210', 'U+FF29'],
  ] as const) {
    it(`a second signal with a ${label} is an error that shows ${codePoint}`, () => {
      const found = check(withSecondSignal(name)).filter((d) => d.rule === 'name-format');
      expect(found.length).toBeGreaterThanOrEqual(2); // the declaration and the setpoint
      expect(found.every((d) => d.severity === 'error')).toBe(true);
      expect(found[0].message).toContain(codePoint);
    });
  }

  it('a procedure id with a look-alike letter names the code point', () => {
    const found = check(base.replace('id: FX-K210-001', 'id: FX-K21\u041E-001')).find((d) => d.rule === 'bad-id-format');
    expect(found?.message).toContain('U+041E');
  });

  it('a bidirectional override in prose is a warning at its line and column', () => {
    const text = base.replace('    do: Draw a sample for the lab.', '    do: Draw a sample \u202Efor the lab.');
    const found = check(text).filter((d) => d.rule === 'hidden-character');
    expect(found).toHaveLength(1);
    expect(found[0]).toMatchObject({ severity: 'warning', line: text.split('\n').findIndex((l) => l.includes('\u202E')) + 1, column: 23 });
    expect(found[0].message).toContain('U+202E');
  });
});

describe('names of the object prototype are not declared signals', () => {
  for (const name of ['valueOf', 'toString', 'constructor', 'hasOwnProperty', '__proto__']) {
    it(`a setpoint on '${name}' is undeclared`, () => {
      const text = base.replace('    set: { TI-210: 180 degC }', `    set: { ${name}: 180 degC }`);
      expect(rulesOf(text)).toContain('undeclared-name');
    });
  }
  it('a condition on valueOf is undeclared', () => {
    expect(rulesOf(base.replace('until: TI-210 >= 180 degC', 'until: valueOf >= 180 degC'))).toContain('undeclared-name');
  });
});

describe('a file that looks like a procedure never drops out in silence', () => {
  for (const [label, text] of [
    ['an extra --- line at the top', `---\n${base}`],
    ['empty front-matter', '---\n---\n# Notes\n'],
    ['front-matter that is only a comment', '---\n# nothing here\n---\n'],
    ['a list', '---\n- id: FX-1\n- title: x\n---\n'],
    ['a single value', '---\nFX-K210-001\n---\n'],
    ['a number', '---\n42\n---\n'],
  ] as const) {
    it(`${label} is an error`, () => {
      const found = check(text).filter((d) => d.severity === 'error');
      expect(found.map((d) => d.rule)).toContain('front-matter-not-mapping');
    });
  }
  it('the extra fence is explained', () => {
    const found = check(`---\n${base}`).find((d) => d.rule === 'front-matter-not-mapping');
    expect(found?.hint).toMatch(/extra "---"/);
  });
});

describe('whatever the build can fail on is a check error first', () => {
  it("an equipment tag 'index.html' is an error naming the tag", () => {
    const found = check(base.replace('equipment: [K-210, XV-2101]', 'equipment: [K-210, XV-2101, index.html]')).filter((d) => d.rule === 'name-format');
    expect(found).toHaveLength(1);
    expect(found[0].message).toContain("'index.html'");
  });
  it('a 300-character procedure id is an error naming the limit', () => {
    const found = check(base.replace('id: FX-K210-001', `id: FX-${'A'.repeat(297)}`)).filter((d) => d.rule === 'name-format');
    expect(found).toHaveLength(1);
    expect(found[0].message).toMatch(/300 characters long; the limit is 100/);
  });
  it('a 300-character step id and signal name are errors too', () => {
    const long = base.replace('  - step: sample', `  - step: ${'s'.repeat(300)}`).replace('  lab-result: {', `  ${'L'.repeat(300)}: { text: x, values: [a, b] }\n  lab-result: {`);
    expect(check(long).filter((d) => d.rule === 'name-format')).toHaveLength(2);
  });
});

describe('front-matter out of place is an error, not a note', () => {
  it('front-matter after blank lines', () => {
    const found = check(`\n\n${base}`).find((d) => d.rule === 'front-matter-not-mapping');
    expect(found?.severity).toBe('error');
    expect(found?.message).toMatch(/starts on line 3/);
  });
  it('procedure keys without the opening fence', () => {
    const found = check(base.replace(/^---\n/, '')).find((d) => d.rule === 'front-matter-not-mapping');
    expect(found?.message).toMatch(/does not start with a "---" line/);
  });
  it('a plain note without front-matter is not taken for a procedure', () => {
    expect(check('# Shift notes\n\nThe kettle was cleaned on Monday.\n').map((d) => d.rule)).not.toContain('front-matter-not-mapping');
  });
});
