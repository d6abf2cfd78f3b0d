// What reading a file found is kept between runs as bytes (partsToBytes): a source made from those bytes must
// answer exactly as a source read from the text does — its data, its markdown tree, its reading problems and every
// position — whatever the text holds, readable or not.
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { partsFromBytes, partsToBytes, readSource, readSourceParts, type ParsedSource, type PathKey } from '../../src/parse/read-source.ts';

function paths(data: unknown, prefix: PathKey[] = []): PathKey[][] {
  const out: PathKey[][] = [prefix];
  if (Array.isArray(data)) data.forEach((v, i) => out.push(...paths(v, [...prefix, i])));
  else if (data && typeof data === 'object') for (const [k, v] of Object.entries(data)) out.push(...paths(v, [...prefix, k]));
  return out;
}

/** Everything a source answers: data (with the values JSON cannot hold told apart), tree, problems, positions. */
function answers(source: ParsedSource): unknown {
  const exact = (_key: string, value: unknown) => (typeof value === 'number' && !Number.isFinite(value) ? `number:${value}` : Object.is(value, -0) ? 'number:-0' : value === undefined ? 'undefined' : value);
  return {
    data: JSON.stringify(source.data, exact),
    ownKeys: paths(source.data).map((p) => p.join('/')),
    body: source.body,
    bodyText: source.bodyText,
    bodyStartLine: source.bodyStartLine,
    diagnostics: source.diagnostics,
    positions: paths(source.data).flatMap((p) => [source.rangeOf(p), source.rangeOf(p, 'key'), source.rangeInScalar(p, 1, 3)]),
  };
}

/** A source made from the kept bytes of the text's parts. */
function fromKept(file: string, text: string): ParsedSource {
  const parts = partsFromBytes(partsToBytes(readSourceParts(file, text)));
  expect(parts).toBeDefined();
  return readSource(file, text, parts);
}

function markdownFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? markdownFiles(path) : name.endsWith('.md') ? [path] : [];
  });
}

describe('parts kept between runs', () => {
  it('make the same source as the text for every demo procedure', () => {
    const files = markdownFiles(join(import.meta.dirname, '..', '..', 'procedures'));
    expect(files.length).toBeGreaterThan(5);
    for (const file of files) {
      const text = readFileSync(file, 'utf8');
      expect(answers(fromKept(file, text))).toEqual(answers(readSource(file, text)));
    }
  });

  it('make the same source for texts that YAML reads into values JSON cannot hold, and for unreadable ones', () => {
    const texts = [
      '---\nid: A\nlimits: [.inf, -.inf, .nan, -0]\n__proto__: { polluted: true }\nempty: ~\n---\n\nBody.\n',
      '---\nid: [unclosed\n---\n\nBody.\n',
      '---\nid: A\nid: B\n---\n',
      'No front-matter at all.\n',
      '---\nid: A\n',
      `---\n${'['.repeat(300)}${']'.repeat(300)}\n---\n`,
      '---\n- a list\n- not a mapping\n---\n',
      `---\nid: A\n---\n${'> '.repeat(200)}deep\n`,
    ];
    for (const text of texts) expect(answers(fromKept('odd.md', text))).toEqual(answers(readSource('odd.md', text)));
    // Own keys named like a prototype stay plain data.
    expect(Object.getPrototypeOf(fromKept('odd.md', texts[0]).data)).toBe(Object.prototype);
  });

  it('make the same source for any front-matter and body', () => {
    const scalar = fc.oneof(fc.string({ maxLength: 12 }), fc.integer(), fc.double(), fc.boolean(), fc.constant(null));
    const value = fc.letrec((tie) => ({
      node: fc.oneof({ depthSize: 'small' }, scalar, fc.array(tie('node'), { maxLength: 4 }), fc.dictionary(fc.string({ minLength: 1, maxLength: 6 }), tie('node'), { maxKeys: 4 })),
    })).node;
    fc.assert(fc.property(fc.dictionary(fc.string({ minLength: 1, maxLength: 8 }), value, { maxKeys: 6 }), fc.string({ maxLength: 80 }), (data, body) => {
      const text = `---\n${JSON.stringify(data)}\n---\n\n${body}\n`;
      expect(answers(fromKept('p.md', text))).toEqual(answers(readSource('p.md', text)));
    }), { numRuns: 200 });
  });

  it('are refused when the bytes are not parts', () => {
    expect(partsFromBytes(new Uint8Array([1, 2, 3]))).toBeUndefined();
    expect(partsFromBytes(new Uint8Array())).toBeUndefined();
    const good = partsToBytes(readSourceParts('p.md', '---\nid: A\n---\n'));
    expect(partsFromBytes(good.subarray(0, good.length - 3))).toBeUndefined();
  });
});
