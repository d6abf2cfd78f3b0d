// A source lets go of its YAML document once the checks are done with it; every position asked for afterwards
// must be the one it gave before (the document is read again from the same text).
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readSource, type ParsedSource, type PathKey } from '../../src/parse/read-source.ts';

/** Every path to a value of the front-matter's data, objects and arrays included. */
function paths(data: unknown, prefix: PathKey[] = []): PathKey[][] {
  const out: PathKey[][] = [prefix];
  if (Array.isArray(data)) data.forEach((v, i) => out.push(...paths(v, [...prefix, i])));
  else if (data && typeof data === 'object') for (const [k, v] of Object.entries(data)) out.push(...paths(v, [...prefix, k]));
  return out;
}

function positions(source: ParsedSource): string[] {
  return paths(source.data).flatMap((p) => [
    JSON.stringify(source.rangeOf(p)), JSON.stringify(source.rangeOf(p, 'key')), JSON.stringify(source.rangeInScalar(p, 1, 3)),
  ]);
}

function markdownFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? markdownFiles(path) : name.endsWith('.md') ? [path] : [];
  });
}

const root = join(import.meta.dirname, '..', '..');

describe('releasing the YAML document', () => {
  it('gives the same positions afterwards for every value of the demo procedures', () => {
    const files = markdownFiles(join(root, 'procedures'));
    expect(files.length).toBeGreaterThan(5);
    for (const file of files) {
      const source = readSource(file, readFileSync(file, 'utf8'));
      const before = positions(source);
      expect(before.length).toBeGreaterThan(50);
      source.release();
      expect(positions(source)).toEqual(before);
      // The document itself is there again when asked for.
      expect(source.doc?.toJS()).toEqual(source.data);
    }
  });

  it('gives the same positions afterwards for any front-matter', () => {
    const scalar = fc.oneof(fc.string({ maxLength: 12 }), fc.integer(), fc.boolean(), fc.constant(null));
    const value = fc.letrec((tie) => ({
      node: fc.oneof({ depthSize: 'small' }, scalar, fc.array(tie('node'), { maxLength: 4 }), fc.dictionary(fc.string({ minLength: 1, maxLength: 6 }), tie('node'), { maxKeys: 4 })),
    })).node;
    fc.assert(fc.property(fc.dictionary(fc.string({ minLength: 1, maxLength: 8 }), value, { maxKeys: 6 }), fc.boolean(), (data, flow) => {
      const yaml = flow ? JSON.stringify(data) : toBlockYaml(data);
      const source = readSource('p.md', `---\n${yaml}\n---\n\nBody.\n`);
      // The generated text is read as written: the property is about real documents, not unreadable ones.
      expect(source.diagnostics).toEqual([]);
      expect(source.data).toEqual(JSON.parse(JSON.stringify(data)));
      const before = positions(source);
      source.release();
      expect(positions(source)).toEqual(before);
    }), { numRuns: 200 });
  });

  it('is harmless for a file without front-matter', () => {
    const source = readSource('notes.md', '# Notes\n\nNo front-matter here.\n');
    const before = JSON.stringify(source.rangeOf(['id']));
    source.release();
    expect(JSON.stringify(source.rangeOf(['id']))).toBe(before);
    expect(source.doc).toBeNull();
  });
});

/** Block-style YAML with every string double-quoted (JSON strings are valid YAML double-quoted scalars). */
function toBlockYaml(value: unknown, indent = ''): string {
  if (Array.isArray(value)) {
    if (!value.length) return '[]';
    return value.map((v) => `\n${indent}- ${toBlockYaml(v, `${indent}  `).replace(/^\n\s*/, '')}`).join('');
  }
  if (value && typeof value === 'object') {
    const entries = Object.entries(value);
    if (!entries.length) return '{}';
    return entries.map(([k, v]) => `\n${indent}${JSON.stringify(k)}: ${toBlockYaml(v, `${indent}  `)}`).join('');
  }
  return JSON.stringify(value);
}
