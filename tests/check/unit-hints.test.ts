// One unit hint wherever a quantity is written: a unit written apart ("6 bar g") is told to be one word, a
// suggestion is only of the signal's dimension, and a limit gets the same suggestion as a condition.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseCondition } from '../../src/analysis/conditions/parse.ts';
import { unitHint } from '../../src/analysis/units.ts';
import { checkSources } from '../../src/check/run-checks.ts';

const base = readFileSync(join(import.meta.dirname, '../fixtures/rules/setpoint-at-trip/valid-base.md'), 'utf8')
  .replace('  TI-210: { text: Kettle temperature, unit: degC, range: [0, 300] }', '  TI-210: { text: Kettle temperature, unit: degC, range: [0, 300] }\n  PI-201: { text: Kettle pressure, unit: barg, range: [0, 10] }');

function diagnostics(text: string, rule: string) {
  return checkSources([{ file: 'p.md', text }], { today: '2026-12-01' }).diagnostics.filter((d) => d.rule === rule);
}

describe('unit hints', () => {
  it('tells to write a unit written apart as one word, in a condition', () => {
    for (const [written, meant] of [['6 bar g', 'barg'], ['6 kPa(g)', 'kPag'], ['6 kPa (g)', 'kPag'], ['6 psi g', 'psig'], ['6 deg C', 'degC'], ['6 bar(a)', 'bara']]) {
      const parsed = parseCondition(`PI-201 >= ${written} and XV-1 == open`);
      expect(parsed.ok).toBe(false);
      if (parsed.ok) continue;
      expect(parsed.error.message).toMatch(/written apart/);
      expect(parsed.error.hint).toMatch(new RegExp(`^Write ${meant}:`));
      expect(parsed.error.hint).not.toMatch(/Join conditions/);
    }
  });

  it("keeps the join hint when what follows a quantity is not part of a unit", () => {
    const parsed = parseCondition('TI-210 >= 5 degC x');
    expect(!parsed.ok && parsed.error.hint).toMatch(/Join conditions/);
  });

  it("suggests only a unit of the signal's dimension", () => {
    const [found] = diagnostics(base.replace('until: TI-210 <= 60 degC', 'until: PI-201 >= 5 C'), 'unknown-unit');
    expect(found.message).toMatch(/'C' is not a unit/);
    expect(found.hint).not.toMatch(/Did you mean degC/);
    expect(found.hint).toMatch(/PI-201 is a pressure in barg/);
    // On a temperature the same spelling means degC.
    const [temperature] = diagnostics(base.replace('until: TI-210 <= 60 degC', 'until: TI-210 <= 60 C'), 'unknown-unit');
    expect(temperature.hint).toBe('Did you mean degC?');
  });

  it('gives a limit the same suggestion as a condition', () => {
    const [limit] = diagnostics(base.replace('low: 15 degC', 'low: 9 °C'), 'unknown-unit');
    const [condition] = diagnostics(base.replace('until: TI-210 <= 60 degC', 'until: TI-210 <= 60 °C'), 'unknown-unit');
    expect(limit.hint).toBe('Did you mean degC?');
    expect(condition.hint).toBe(limit.hint);
    const [apart] = diagnostics(base.replace('low: 15 degC', 'low: 9 deg C'), 'unknown-unit');
    expect(apart?.hint ?? '').toMatch(/^Write degC:/);
  });

  it('names the unit a spelling would be when it does not fit the signal', () => {
    expect(unitHint('C', { unit: 'barg', name: 'PI-201' })).toMatch(/'C' would be degC, a unit of temperature, which does not fit PI-201/);
    expect(unitHint('°F', { unit: 'K' })).toBe('Did you mean degF?');
    expect(unitHint('valueOf', { unit: 'kg' })).toMatch(/mass/);
  });
});
