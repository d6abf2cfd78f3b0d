// One interlock described in two procedures: the same trip in other units or other spacing is one description;
// any other threshold or action is two, and the second file is told which procedure says otherwise.
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';

const base = readFileSync(join(import.meta.dirname, '../fixtures/rules/setpoint-at-trip/valid-base.md'), 'utf8');
const rule = [rules['interlock-inconsistent']];

function withTrip(id: string, trip: string, action: string): string {
  return base.replace('id: FX-K210-001', `id: ${id}`)
    .replace('trips-when: TI-210 >= 255 degC', `trips-when: ${trip}`)
    .replace('action: Closes hot-oil valve XV-2101', `action: ${action}`);
}

function reports(a: string, b: string) {
  return checkSources([{ file: 'a.md', text: a }, { file: 'b.md', text: b }], { today: '2026-12-01', rules: rule }).diagnostics
    .filter((d) => d.rule === 'interlock-inconsistent');
}

describe('interlock described in two procedures', () => {
  it('is one description when the thresholds are equal after conversion and the wording differs only in case, spaces and a full stop', () => {
    // Source: NIST SP 811, Appendix B.8: t/degF = 1.8 t/degC + 32; T/K = t/degC + 273.15.
    fc.assert(fc.property(fc.integer({ min: 50, max: 290 }), fc.constantFrom('degF', 'K'), fc.boolean(), (celsius, unit, dot) => {
      const other = unit === 'degF' ? `${celsius * 1.8 + 32} degF` : `${celsius + 273.15} K`;
      const found = reports(
        withTrip('FX-K210-001', `TI-210 >= ${celsius} degC`, 'Closes hot-oil valve XV-2101'),
        withTrip('FX-K210-002', `TI-210 >= ${other}`, `closes  HOT-OIL valve XV-2101${dot ? '.' : ''}`),
      );
      expect(found).toEqual([]);
    }), { numRuns: 40 });
  });

  it('is two descriptions when the thresholds differ, reported on the second file with the first as related', () => {
    fc.assert(fc.property(fc.integer({ min: 50, max: 290 }), fc.integer({ min: 1, max: 20 }), (celsius, step) => {
      const found = reports(
        withTrip('FX-K210-001', `TI-210 >= ${celsius} degC`, 'Closes hot-oil valve XV-2101'),
        withTrip('FX-K210-002', `TI-210 >= ${celsius + step} degC`, 'Closes hot-oil valve XV-2101'),
      );
      expect(found.map((d) => d.file)).toEqual(['b.md']);
      expect(found[0].message).toContain(`'TI-210 >= ${celsius + step} degC' here`);
      expect(found[0].related?.[0]).toMatchObject({ file: 'a.md' });
    }), { numRuns: 40 });
  });

  it('follows the description most procedures use', () => {
    const same = withTrip('FX-K210-001', 'TI-210 >= 255 degC', 'Closes hot-oil valve XV-2101');
    const result = checkSources([
      { file: 'a.md', text: withTrip('FX-K210-003', 'TI-210 >= 265 degC', 'Closes hot-oil valve XV-2101') },
      { file: 'b.md', text: same },
      { file: 'c.md', text: same.replace('FX-K210-001', 'FX-K210-002') },
    ], { today: '2026-12-01', rules: rule });
    expect(result.diagnostics.filter((d) => d.rule === 'interlock-inconsistent').map((d) => d.file)).toEqual(['a.md']);
  });
});

describe('interlock trips in gauge and absolute pressure', () => {
  const withTrip = (id: string, trip: string) => `---
id: ${id}
title: Hold the vessel
kind: normal
revision: 0
status: draft
signals:
  PI-1: { text: Vessel pressure (absolute), unit: kPaa, range: [0, 600] }
interlocks:
  - { tag: PSHH-1, trips-when: "${trip}", action: Closes XV-1 }
steps:
  - { step: hold, do: Hold the vessel., until: done }
---
`;
  const found = (a: string, b: string) => checkSources([{ file: 'a.md', text: withTrip('FX-A-001', a) }, { file: 'b.md', text: withTrip('FX-B-001', b) }], { today: '2026-12-01' })
    .diagnostics.filter((d) => d.rule === 'interlock-inconsistent').map((d) => d.message);

  it('are one description when equal through the standard atmosphere, and the message names it when they differ', () => {
    // Source: NIST SP 811, Appendix B.8: standard atmosphere = 101.325 kPa, so 148.675 kPag = 250 kPa absolute.
    expect(found('PI-1 >= 250 kPaa', 'PI-1 >= 148.675 kPag')).toEqual([]);
    const differ = found('PI-1 >= 250 kPaa', 'PI-1 >= 250 kPag');
    expect(differ).toHaveLength(1);
    expect(differ[0]).toContain('standard atmosphere, 101.325 kPa');
    expect(found('PI-1 >= 250 kPaa', 'PI-1 >= 260 kPaa')[0]).not.toContain('101.325');
  });
});
