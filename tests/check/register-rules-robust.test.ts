// Whatever a register file holds, the register and consistency rules finish and point at a place: no rule gives
// up with "could not finish", and every report names a line in a file that exists.
import fc from 'fast-check';
import { stringify } from 'yaml';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { buildRegister } from '../../src/model/register.ts';
import { readYamlSource } from '../../src/parse/read-yaml-source.ts';

const procedure = readFileSync(join(import.meta.dirname, '../fixtures/rules/register-entry-invalid/valid-base.md'), 'utf8');
const tags = ['TI-210', 'PI-210', 'lab-result', 'ESD-210', 'TSHH-210', 'PSV-210', 'K-210', 'X'];
const words = fc.constantFrom('255 degC', '250 kPag', '90 kPaa', '10 C', 'abc', '', '1e400 K', '-5 degF', '3 barg', '12', 'TI-210 >= 255 degC',
  'TI-210 >= 255 degC or PI-210 <= 5 kPag', 'PI-210 >=', 'lab-result == pass', 'X and', 'percent', 'degC', 'kPaG');
const value = fc.oneof(words, fc.integer(), fc.boolean(), fc.constant(null), fc.array(fc.oneof(words, fc.constantFrom(...tags)), { maxLength: 3 }),
  fc.tuple(fc.integer({ min: -500, max: 500 }), fc.integer({ min: -500, max: 500 })));
const entry = fc.dictionary(fc.constantFrom('text', 'unit', 'range', 'values', 'equipment', 'trips-when', 'starts', 'closes', 'set-pressure', 'signal', 'protects', 'area', 'params', 'action'), value, { maxKeys: 5 });
const withLevels = fc.record({ limits: fc.dictionary(fc.constantFrom('low', 'high', 'consequence', 'correction'), value, { maxKeys: 4 }), alarms: fc.dictionary(fc.constantFrom('low', 'high'), value, { maxKeys: 2 }) }, { requiredKeys: [] });
const section = (kind: fc.Arbitrary<Record<string, unknown>>) => fc.dictionary(fc.constantFrom(...tags), kind, { maxKeys: 4 });
const registerData = fc.record({
  signals: section(fc.tuple(entry, withLevels).map(([a, b]) => ({ ...a, ...b }))),
  'safety-functions': section(entry),
  'relief-devices': section(entry),
  equipment: section(entry),
  areas: section(entry),
}, { requiredKeys: [] });

describe('register rules on any register', () => {
  it('finish and report at real places', () => {
    fc.assert(fc.property(registerData, (data) => {
      const text = stringify(data);
      const register = buildRegister('register', [{ file: 'register/plant.yaml', source: readYamlSource('register/plant.yaml', text) }]);
      const result = checkSources([{ file: 'a.md', text: procedure }], { today: '2026-12-01', register });
      const lines = text.split('\n').length;
      for (const d of result.diagnostics) {
        expect(d.message, d.rule).not.toMatch(/could not finish|fault in Stepwright/);
        expect(['a.md', 'register/plant.yaml']).toContain(d.file);
        expect(d.line).toBeGreaterThanOrEqual(1);
        if (d.file === 'register/plant.yaml') expect(d.line).toBeLessThanOrEqual(lines);
      }
    }), { numRuns: 150 });
  });
});
