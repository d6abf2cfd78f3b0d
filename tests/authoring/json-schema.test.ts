// The published JSON Schema: up to date with the zod schema, accepts the demo manual, rejects bad front-matter.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import Ajv from 'ajv';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { procedureJsonSchemaText } from '../../src/model/json-schema.ts';
import { validateFrontMatter } from '../../src/model/validate.ts';
import { readSource } from '../../src/parse/read-source.ts';
import { findProcedureFiles } from '../../src/cli/read-procedure-files.ts';

const root = join(import.meta.dirname, '..', '..');
const committed = readFileSync(join(root, 'schema', 'procedure.schema.json'), 'utf8');
const validate = new Ajv({ allErrors: true, allowUnionTypes: true }).compile(JSON.parse(committed));
const frontMatterOf = (file: string) => readSource(file, readFileSync(file, 'utf8')).data;

describe('schema/procedure.schema.json', () => {
  it('is the file `npm run schema` writes from src/model/schema.ts (run it when this fails)', () => {
    expect(committed).toBe(procedureJsonSchemaText());
  });

  const demo = findProcedureFiles([join(root, 'procedures')], root).filter((f) => !f.missing);
  it('finds the demo manual', () => expect(demo.length).toBeGreaterThan(0));
  it.each(demo.map((f) => [f.file, f.absolute]))('accepts the front-matter of %s', (_file, absolute) => {
    const ok = validate(frontMatterOf(absolute));
    expect(validate.errors ?? []).toEqual([]);
    expect(ok).toBe(true);
  });

  const badDir = join(root, 'tests', 'fixtures', 'authoring', 'schema');
  const bad = readdirSync(badDir).filter((n) => n.startsWith('invalid-'));
  it.each(bad)('rejects %s, as the checker does', (name) => {
    const data = frontMatterOf(join(badDir, name));
    expect(validate(data)).toBe(false);
    expect(validateFrontMatter(data)).not.toEqual([]);
  });
  it.each(readdirSync(badDir).filter((n) => n.startsWith('valid-')))('accepts %s, as the checker does', (name) => {
    const data = frontMatterOf(join(badDir, name));
    expect(validate(data), JSON.stringify(validate.errors)).toBe(true);
    expect(validateFrontMatter(data)).toEqual([]);
  });

  it('agrees with the zod schema on generated steps', () => {
    const word = fc.constantFrom('heat-up', 'Heat', 'cool', 'x_1', '', '2a', 'U2-K210-INERT-001', 'u2-k');
    const step = fc.record({
      step: word, do: fc.oneof(word, fc.array(word, { maxLength: 2 })),
      until: fc.option(word, { nil: undefined }), expect: fc.option(fc.oneof(word, fc.integer()), { nil: undefined }),
      call: fc.option(fc.oneof(word, fc.record({ procedure: word, revision: fc.option(fc.integer({ min: -1, max: 3 }), { nil: undefined }) })), { nil: undefined }),
      bogus: fc.option(fc.constant(1), { nil: undefined }),
    }, { requiredKeys: [] });
    const branch = fc.record({
      when: fc.option(word, { nil: undefined }), goto: fc.option(word, { nil: undefined }),
      repeat: fc.option(fc.record({ expected: fc.double({ min: -1, max: 4, noNaN: true }), max: fc.integer({ min: -1, max: 4 }) }, { requiredKeys: [] }), { nil: undefined }),
    }, { requiredKeys: [] });
    const item = fc.oneof(step, fc.record({ choose: fc.array(branch, { maxLength: 2 }) }));
    fc.assert(fc.property(fc.array(item, { maxLength: 3 }), (steps) => {
      const data = JSON.parse(JSON.stringify({ id: 'U2-X-001', title: 'Test', kind: 'normal', revision: 0, status: 'draft', steps }));
      expect(validate(data)).toBe(validateFrontMatter(data).length === 0);
    }), { numRuns: 500 });
  });
});
