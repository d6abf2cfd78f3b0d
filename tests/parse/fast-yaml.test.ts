// The quick reading of a front-matter's data must answer exactly as the YAML library that keeps positions would, or
// not answer at all: it is compared with that library on the demo front-matters, on many altered copies of them, and
// on the forms each of its refusals is there for.
import { readFileSync } from 'node:fs';
import { isDeepStrictEqual } from 'node:util';
import fc from 'fast-check';
import { parseDocument } from 'yaml';
import { describe, expect, it } from 'vitest';
import { quickYamlData } from '../../src/parse/fast-yaml.ts';
import { splitFrontMatter } from '../../src/parse/split-front-matter.ts';
import { alteredFrontMatter, demoFiles, frontMatters } from './altered-front-matters.ts';
import { readSource, readSourceParts } from '../../src/parse/read-source.ts';

/** What the positions library reads: its data, or its first error. Read as the checker reads every front-matter. */
function reference(text: string): { data: unknown } | { error: string } {
  const doc = parseDocument(text, { prettyErrors: false, uniqueKeys: true, strict: true });
  return doc.errors.length ? { error: doc.errors[0].message } : { data: doc.toJS({ maxAliasCount: 100 }) ?? null };
}

/** The quick reading either says nothing, or says what the reference reads, and the reference finds no error. */
function agrees(text: string): boolean {
  const quick = quickYamlData(text);
  if (quick === undefined) return true;
  const ref = reference(text);
  return 'data' in ref && isDeepStrictEqual(ref.data, quick.data);
}

/** Bits of YAML that the two libraries read differently, or that make a front-matter wrong, put in by the alterations. */
const pieces = [
  '!', '&a ', '*a', '? ', '- ', ': ', '#', '"', "'", '|', '>', '\t', ' ', '  ', '\n', '[', ']', '{', '}', ',', '%',
  '`', 'null', '~', '0x1F', '0o17', '1_000', '0b101', '.5', '1e3', '+1', 'yes', 'True', 'tRue', '\\', '\r\n', '\r',
  '...', '---', '<<: ', '\u00a0', '\ufeff', '"a\\', ': |-\n  x', 'x: y: z', '- - ', 'a:b', ':', '  |+\n', '"\\x41"',
  "'it''s'", '"\\u00e9"', '  # c', '-1', '0.', '.', '-.inf', '.NaN', '1e', '1E+3', '0o8', '0X1F', 'NULL', "''", '""',
  '\n  ', '\n    ', '\n- ', '\n  - ', 'a: >\n   b\n  c', ' - ', '\u2028', '\u0085', '\x00', '=', "'x\n\n y'", '#x',
  ' #x', '- # c\n  a', '1:', '"a": ', '2026-01-01', '12:30', '0777', '-0', '.e3', '__proto__: 1', '{a: [b]}', '[a, b]: c',
];

describe('quickYamlData', () => {
  it('reads every demo front-matter, and reads it as the positions library does', () => {
    expect(frontMatters.length).toBeGreaterThan(5);
    for (const text of frontMatters) {
      const quick = quickYamlData(text);
      expect(quick).toBeDefined();
      expect(quick!.data).toEqual((reference(text) as { data: unknown }).data);
    }
  });

  it('never answers otherwise than the positions library, on altered demo front-matters (property)', () => {
    let answered = 0;
    fc.assert(fc.property(alteredFrontMatter(pieces), (text) => {
      if (quickYamlData(text)) answered++;
      expect(agrees(text)).toBe(true);
    }), { numRuns: 1000 });
    // Most small alterations are still read quickly: the refusals are not so broad that the quick path is never taken.
    expect(answered).toBeGreaterThan(100);
  });

  it('never answers otherwise than the positions library, on generated YAML (property)', () => {
    const scalar = fc.oneof(fc.constantFrom(...pieces), fc.string({ maxLength: 8 }), fc.constantFrom('a', 'b c', '12', '1.5', 'true', 'x: y'));
    const line = fc.tuple(fc.integer({ min: 0, max: 6 }), fc.constantFrom('', '- ', 'k: ', 'key: ', '- k: ', '"q": ', '- - ', 'k: |', 'k: >-', '-', 'k:', "'s': ", '[', '{k: '), scalar)
      .map(([indent, lead, value]) => ' '.repeat(indent) + lead + value);
    fc.assert(fc.property(fc.array(line, { minLength: 1, maxLength: 8 }), (lines) => {
      expect(agrees(lines.join('\n'))).toBe(true);
    }), { numRuns: 10000 });
  });

  it('reads plain scalars with the YAML 1.2 core schema, not the wider one of YAML 1.1', () => {
    // Source: YAML 1.2.2 specification, 10.3.2 "Tag Resolution" (core schema: null, bool, int base 8/10/16, float).
    expect(quickYamlData('a: ~\nb: Null\nc: true\nd: 0o17\ne: 0x1F\nf: -12\ng: 1.5e3\nh: .inf\ni: -.Inf')?.data).toEqual({
      a: null, b: null, c: true, d: 15, e: 31, f: -12, g: 1500, h: Infinity, i: -Infinity,
    });
    // Forms YAML 1.1 reads as numbers and booleans are strings in 1.2.
    expect(quickYamlData('a: 1_000\nb: 0b101\nc: yes\nd: 0777\ne: 12:30')?.data).toEqual({ a: '1_000', b: '0b101', c: 'yes', d: 777, e: '12:30' });
    expect(Number.isNaN((quickYamlData('a: .nan')?.data as { a: number }).a)).toBe(true);
  });

  it('leaves to the positions library what the two may read differently', () => {
    const refused = [
      'a: !tag b', 'a: &x b\nc: *x', '%YAML 1.2\n---\na: b', '? a\n: b', '[a, b]: c', '{a: 1, [b]: 2}',
      'a:\n- - b\n  - c', 'a:\n  -\n   b', 'a: "b"#c', '---\na: b', 'a:\tb', 'a: b\rc: d', 'a: [b,\n c]', 'a: "b\n c"',
      'null: a', '~: a', '__proto__: a', ': a', 'a:\n - # c\n- b', 'a: |+\n\n  ', 'a: "b\\\n c"',
    ];
    for (const text of refused) expect(quickYamlData(text), text).toBeUndefined();
  });

  it('leaves deep nesting to the positions library, whose reading reports past 200 levels', () => {
    const nested = (levels: number) => `id: a\nx: ${'['.repeat(levels)}1${']'.repeat(levels)}`;
    expect(quickYamlData(nested(20))).toBeDefined();
    expect(quickYamlData(nested(150))).toBeUndefined();
    const source = readSource('deep.md', `---\n${nested(250)}\n---\n`, undefined, 'now');
    expect(source.diagnostics.map((d) => d.message)).toEqual(['The front-matter nests deeper than 200 levels; it was not read.']);
  });

  it('gives no answer for a front-matter with an error, so that the error is the positions library\'s own', () => {
    for (const text of ['a: b\na: c', 'a: [b', 'a: b: c', '  a: b\n c: d', 'a: "b']) {
      expect(quickYamlData(text), text).toBeUndefined();
      expect('error' in reference(text)).toBe(true);
    }
  });

  it('is how a clean demo procedure is read: its parts leave the table of positions to be made when asked for', () => {
    const text = readFileSync(demoFiles[0], 'utf8');
    const parts = readSourceParts(demoFiles[0], text);
    expect(parts.positions).toBeUndefined();
    expect(parts.data).toEqual((reference(splitFrontMatter(text).yaml!) as { data: unknown }).data);
  });
});
