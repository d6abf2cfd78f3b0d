// A signal's range written high end first is reported once, and the messages that show a range show it low end first.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';

const base = readFileSync(join(import.meta.dirname, '../fixtures/rules/setpoint-at-trip/valid-base.md'), 'utf8');
const reversed = base.replace('TI-210: { text: Kettle temperature, unit: degC, range: [0, 300] }', 'TI-210: { text: Kettle temperature, unit: degC, range: [300, 0] }');

function check(text: string) {
  return checkSources([{ file: 'p.md', text }], { today: '2026-12-01' }).diagnostics;
}

describe('a reversed range', () => {
  it('is reported with the range to write', () => {
    const found = check(reversed).filter((d) => d.rule === 'invalid-value');
    expect(found).toHaveLength(1);
    expect(found[0].message).toBe('The range of TI-210 runs backwards ([300, 0]): a range is written [low, high].');
    expect(found[0].hint).toMatch(/^Write the low end first: \[0, 300\]/);
    expect(check(base).filter((d) => d.rule === 'invalid-value')).toEqual([]);
  });

  it('is shown low end first in the messages that judge against it', () => {
    const text = reversed.replace('until: TI-210 >= 180 degC', 'until: TI-210 >= 350 degC');
    const [outside] = check(text).filter((d) => d.rule === 'threshold-outside-range');
    expect(outside.message).toContain('(0..300 degC)');
    expect(outside.message).not.toContain('300..0');
  });
});
