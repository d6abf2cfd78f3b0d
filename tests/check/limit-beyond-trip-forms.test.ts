// A trip is judged by the values at which it trips: the same trip written another way (`a >= x`, `not (a < x)`,
// the threshold in another unit) gives the same findings, and a trip that cannot be read as values is said so.
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';

const base = readFileSync(join(import.meta.dirname, '../fixtures/rules/setpoint-at-trip/valid-base.md'), 'utf8');
const rule = [rules['limit-beyond-trip']];

function procedure(limitHigh: number, limitLow: number, trip: string): string {
  return base
    .replace(/low: 15 degC, high: 245 degC/, `low: ${limitLow} degC, high: ${limitHigh} degC`)
    .replace('trips-when: TI-210 >= 255 degC', `trips-when: ${trip}`);
}

/** The findings, with the trip condition as written left out of the messages (it is shown as the author wrote it). */
function findings(text: string, trip = '') {
  return checkSources([{ file: 'p.md', text }], { today: '2026-12-01', rules: rule }).diagnostics
    .filter((d) => d.rule === 'limit-beyond-trip')
    .map((d) => `${d.line} ${d.severity} ${trip ? d.message.replace(`(${trip})`, '(the trip)') : d.message}`);
}

// Source: NIST SP 811, Appendix B.8: t/degF = 1.8 t/degC + 32; T/K = t/degC + 273.15.
const degF = (c: number) => `${(c * 9) / 5 + 32} degF`;
const kelvin = (c: number) => `${((c * 100 + 27315) / 100).toFixed(2)} K`;

describe('limit-beyond-trip reads a trip as the values at which it trips', () => {
  it('gives the same findings for the same high trip written in several ways', () => {
    // Multiples of 5 degC are whole degF, so each form states the same threshold exactly.
    fc.assert(fc.property(fc.integer({ min: 4, max: 58 }).map((k) => k * 5), fc.integer({ min: 20, max: 290 }), (trip, high) => {
      const forms = [
        `TI-210 >= ${trip} degC`,
        `not (TI-210 < ${trip} degC)`,
        `TI-210 >= ${degF(trip)}`,
        `not (TI-210 < ${kelvin(trip)})`,
        `TI-210 >= ${trip} degC or TI-210 >= ${trip + 10} degC`,
        `not (not (TI-210 >= ${trip} degC))`,
      ];
      const each = forms.map((form) => findings(procedure(high, 15, form), form));
      for (const found of each) expect(found).toEqual(each[0]);
      expect(each[0].length).toBe(high >= trip ? 1 : 0);
    }), { numRuns: 25 });
  });

  it('gives the same findings for the same low trip written in several ways', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 40 }).map((k) => k * 5), fc.integer({ min: 0, max: 200 }), (trip, low) => {
      const forms = [`TI-210 <= ${trip} degC`, `not (TI-210 > ${trip} degC)`, `TI-210 <= ${degF(trip)}`];
      const each = forms.map((form) => findings(procedure(260, low, form), form));
      for (const found of each) expect(found).toEqual(each[0]);
      expect(each[0].length).toBe(low <= trip ? 1 : 0);
    }), { numRuns: 20 });
  });

  it('reports a limit inside a band trip, whichever unit the band is written in', () => {
    // 356 degF = 180 degC; 572 degF = 300 degC.
    expect(findings(procedure(200, 15, 'TI-210 >= 356 degF and TI-210 <= 300 degC'))).toHaveLength(1);
    expect(findings(procedure(200, 15, 'TI-210 >= 180 degC and TI-210 <= 572 degF'))).toHaveLength(1);
    expect(findings(procedure(170, 15, 'TI-210 >= 180 degC and TI-210 <= 300 degC'))).toEqual([]);
  });

  it('says, as info, that it did not judge a trip whose condition cannot be read as values', () => {
    const found = checkSources([{ file: 'p.md', text: procedure(245, 15, 'TI-210 >= 255 kPag') }], { today: '2026-12-01', rules: rule }).diagnostics
      .filter((d) => d.rule === 'limit-beyond-trip');
    expect(found).toHaveLength(1);
    expect(found[0].severity).toBe('info');
    expect(found[0].message).toMatch(/was not compared/);
  });

  it('says, as info, that a trip acting on a signal only together with another condition was not judged there', () => {
    // Below the high limit or above it, a trip gated by another signal sets no level of its own: never an error,
    // always the one info line, on the signal it names.
    fc.assert(fc.property(fc.integer({ min: 20, max: 290 }), fc.constantFrom('lab-result == fail', 'PI-210 >= 2 bar'), (trip, gate) => {
      const found = checkSources([{ file: 'p.md', text: procedure(245, 15, `TI-210 >= ${trip} degC and ${gate}`) }], { today: '2026-12-01', rules: rule }).diagnostics
        .filter((d) => d.rule === 'limit-beyond-trip');
      const onTemperature = found.filter((d) => /acts on TI-210( and PI-210)? only when the rest of its condition holds/.test(d.message));
      expect(found.map((d) => d.severity)).toEqual(['info']);
      expect(onTemperature).toHaveLength(1);
    }), { numRuns: 20 });
    // The same trip without the gate is judged, and says nothing when it is clear of the limit.
    expect(findings(procedure(245, 15, 'TI-210 >= 255 degC'))).toEqual([]);
  });
});
