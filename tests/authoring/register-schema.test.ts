// The published JSON Schema of a plant register file: up to date with the zod schema, accepts the demo register,
// and rejects what the checker reports as register-invalid.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import Ajv from 'ajv';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { registerJsonSchemaText } from '../../src/model/json-schema.ts';
import { buildRegister } from '../../src/model/register.ts';
import { readYamlSource } from '../../src/parse/read-yaml-source.ts';

const root = join(import.meta.dirname, '..', '..');
const committed = readFileSync(join(root, 'schema', 'register.schema.json'), 'utf8');
const validate = new Ajv({ allErrors: true, allowUnionTypes: true }).compile(JSON.parse(committed));

/** The checker's verdict on one register file: the register-invalid messages it gives. */
function checkerProblems(text: string): string[] {
  const file = 'register/plant.yaml';
  return buildRegister('register', [{ file, source: readYamlSource(file, text) }]).diagnostics
    .filter((d) => d.rule === 'register-invalid').map((d) => d.message);
}
const dataOf = (text: string) => readYamlSource('register/plant.yaml', text).data;

describe('schema/register.schema.json', () => {
  it('is the file `npm run schema` writes from src/model/register-schema.ts (run it when this fails)', () => {
    expect(committed).toBe(registerJsonSchemaText());
  });

  const demo = readdirSync(join(root, 'register')).filter((n) => n.endsWith('.yaml')).sort();
  it('finds the demo register', () => expect(demo.length).toBeGreaterThan(0));
  it.each(demo)('accepts register/%s, as the checker does', (name) => {
    const text = readFileSync(join(root, 'register', name), 'utf8');
    const ok = validate(dataOf(text));
    expect(validate.errors ?? []).toEqual([]);
    expect(ok).toBe(true);
    expect(checkerProblems(text)).toEqual([]);
  });

  it.each([
    ['a misspelt key', 'signals:\n  TI-1: { txt: Tank temperature, unit: degC }\n'],
    ['a relief device without its set pressure', 'relief-devices:\n  PSV-1: { signal: PI-1 }\n'],
    ['an unknown section', 'instruments:\n  TI-1: { text: Tank temperature }\n'],
    ['a range that is not two numbers', 'signals:\n  TI-1: { text: Tank temperature, unit: degC, range: [0] }\n'],
    ['a latch that is not yes or no', 'safety-functions:\n  TSHH-1: { trips-when: TI-1 >= 90 degC, closes: [XV-1], latches: sometimes }\n'],
    ['a hazard with an unknown level', 'equipment:\n  K-1: { text: Kettle, hazards: [{ level: severe, hazard: Hot surface }] }\n'],
    ['a bypass without allowed', 'safety-functions:\n  TSHH-1: { trips-when: TI-1 >= 90 degC, closes: [XV-1], bypass: { procedure: U2-X-001 } }\n'],
  ])('rejects %s, as the checker does', (_what, text) => {
    expect(validate(dataOf(text))).toBe(false);
    expect(checkerProblems(text)).not.toEqual([]);
  });

  it('agrees with the checker on generated signal and relief entries', () => {
    const word = fc.constantFrom('Tank temperature', '', 'degC', 'kPag', 12, true);
    const signal = fc.record({
      text: word, unit: word, range: fc.constantFrom([0, 100], [0], ['a', 'b'], 5),
      values: fc.constantFrom([], ['open', 'closed'], 'open'), limits: fc.constantFrom({ high: '90 degC' }, { hi: 1 }, 'high'),
      bogus: fc.constant(1),
    }, { requiredKeys: [] });
    const relief = fc.record({ 'set-pressure': word, signal: word, protects: fc.constantFrom(['K-1'], 'K-1', []) }, { requiredKeys: [] });
    fc.assert(fc.property(fc.dictionary(fc.constantFrom('TI-1', 'PI-2'), signal), fc.dictionary(fc.constantFrom('PSV-1'), relief), (signals, reliefs) => {
      const data = JSON.parse(JSON.stringify({ signals, 'relief-devices': reliefs }));
      const text = JSON.stringify(data);
      expect(validate(data), text).toBe(checkerProblems(text).length === 0);
    }), { numRuns: 300 });
  });
});
