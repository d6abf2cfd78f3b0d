// The table of positions made from js-yaml's reading must answer every position exactly as the table of `yaml`'s
// document does, or not be made at all: compared path by path (value and key, and paths that lead nowhere) on the
// demo front-matters, on many altered copies of them, on generated YAML, and on the forms it leaves to `yaml`.
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { parseDocument } from 'yaml';
import { describe, expect, it } from 'vitest';
import { quickPositionTable } from '../../src/parse/quick-positions.ts';
import { locateIn, positionTable, type PathKey, type PositionTable } from '../../src/parse/yaml-positions.ts';
import { splitFrontMatter } from '../../src/parse/split-front-matter.ts';
import { alteredFrontMatter, demoFiles, frontMatters } from './altered-front-matters.ts';
import { readSource } from '../../src/parse/read-source.ts';

function reference(text: string): PositionTable | undefined {
  const doc = parseDocument(text, { prettyErrors: false, uniqueKeys: true, strict: true });
  return doc.errors.length ? undefined : positionTable(doc);
}

/** Every path into the table's nodes, each with a missing key and an index past the end after it. */
function paths(table: PositionTable): PathKey[][] {
  const out: PathKey[][] = [[], ['absent']];
  const walk = (id: number, path: PathKey[]) => {
    if (id < 0) return;
    const at = id * 6;
    const [kind, first, count] = [table.cells[at + 3], table.cells[at + 4], table.cells[at + 5]];
    for (let i = 0; i < count; i++) {
      const step = kind === 1 ? table.keys[table.links[first + 3 * i]] : i;
      const path2 = [...path, step];
      out.push(path2, [...path2, 'absent'], [...path2, 0], [...path, count + 2]);
      walk(kind === 1 ? table.links[first + 3 * i + 2] : table.links[first + i], path2);
    }
  };
  walk(table.root, []);
  return out;
}

/** What a source shows for a path: start, end without trailing white space, and style, of the node and its key. */
function shown(text: string, table: PositionTable, path: PathKey[], part: 'key' | 'value'): string {
  const { node, key } = locateIn(table, path, part);
  const show = (n: typeof node) => {
    if (!n?.r) return n ? `no range ${n.t}` : 'none';
    let end = n.r[1];
    while (end > n.r[0] && /\s/.test(text[end - 1] ?? '')) end--;
    return `${n.r[0]}-${end} ${n.t}`;
  };
  return `${show(node)} / ${show(key)}`;
}

/** Undefined when the quick table agrees with `yaml`'s on every path (or is not made); else the first difference. */
function difference(text: string): string | undefined {
  const quick = quickPositionTable(text);
  if (!quick) return undefined;
  const ref = reference(text);
  if (!ref) return 'made a table where yaml finds an error';
  for (const path of [...paths(ref), ...paths(quick)]) {
    for (const part of ['value', 'key'] as const) {
      const [a, b] = [shown(text, ref, path, part), shown(text, quick, path, part)];
      if (a !== b) return `${JSON.stringify(path)} ${part}: yaml ${a}, quick ${b}`;
    }
  }
  return undefined;
}

const pieces = [
  '!', '&a ', '*a', '? ', '- ', ': ', '#', '"', "'", '|', '>', '\t', ' ', '  ', '\n', '[', ']', '{', '}', ',', '%',
  'null', '~', '0x1F', '1_000', '.5', '1e3', 'True', '\\', '\r\n', '\r', '...', '---', '<<: ', '\u00a0', '\ufeff',
  '\u0085', '\u2028', ': |-\n  x', 'x: y: z', '- - ', 'a:b', ':', '  |+\n', "'it''s'", '"\\u00e9"', '  # c', '-.inf',
  '.NaN', "''", '""', '\n  ', '\n    ', '\n- ', '\n  - ', 'a: >\n   b\n  c', ' - ', '#x', ' #x', '- # c\n  a', '1:',
  '"a": ', '12:30', '{a: [b]}', '[a, b]: c', '{a}', '{a: }', '[a: b]', 'k:  # c\n', '\n# c\n', '\n\n', 'k:\n',
];

describe('quickPositionTable', () => {
  it('makes the table of every demo front-matter, answering every path as yaml\'s table does', () => {
    expect(frontMatters.length).toBeGreaterThan(5);
    for (const text of frontMatters) {
      expect(quickPositionTable(text)).toBeDefined();
      expect(difference(text)).toBeUndefined();
    }
  });

  it('never answers a path otherwise than yaml\'s table, on altered demo front-matters (property)', () => {
    let made = 0;
    fc.assert(fc.property(alteredFrontMatter(pieces), (text) => {
      if (quickPositionTable(text)) made++;
      expect(difference(text)).toBeUndefined();
    }), { numRuns: 600 });
    // Most small alterations still get the quick table: what it leaves to yaml is not everything.
    expect(made).toBeGreaterThan(100);
  });

  it('never answers a path otherwise than yaml\'s table, on generated YAML (property)', () => {
    const scalar = fc.oneof(fc.constantFrom(...pieces), fc.string({ maxLength: 8 }), fc.constantFrom('a', 'b c', '12', '1.5', 'true', 'x: y'));
    const line = fc.tuple(fc.integer({ min: 0, max: 6 }), fc.constantFrom('', '- ', 'k: ', 'key: ', '- k: ', '"q": ', 'k: |', 'k: >-', 'k:', "'s': ", '[', '{k: ', '# c', 'k: # c', '{a, b: c}', '- [', '- {k: '), scalar)
      .map(([indent, lead, value]) => ' '.repeat(indent) + lead + value);
    fc.assert(fc.property(fc.array(line, { minLength: 1, maxLength: 8 }), (lines) => {
      expect(difference(lines.join('\n'))).toBeUndefined();
    }), { numRuns: 3000 });
  });

  it('places empty values, quoted, block and multi-line scalars, and flow collections as yaml does', () => {
    const text = 'id: A-1  # c\ntitle: "Quoted \\"t\\""\nempty:\nlist:\n  - one\n  - two: 2\n    three: [[b, c], a]\nblock: |\n  line one\n\nplain: multi\n  line\nf: {a}\nlast: 3\n';
    const table = quickPositionTable(text)!;
    expect(table).toBeDefined();
    expect(difference(text)).toBeUndefined();
    // Spot checks against the text itself.
    const at = (path: PathKey[]) => locateIn(table, path, 'value').node!;
    expect(text.slice(...at(['title']).r!)).toBe('"Quoted \\"t\\""');
    expect(at(['title']).t).toBe(2);
    expect(at(['block']).t).toBe(3);
    expect(text.slice(...at(['list', 1, 'three', 0, 1]).r!)).toBe('c');
    expect(text.slice(...at(['plain']).r!)).toBe('multi\n  line');
    expect(at(['empty']).r).toEqual([text.indexOf('empty:') + 6, text.indexOf('empty:') + 6]);
  });

  it('leaves to yaml the forms whose places it cannot tell the same way', () => {
    const left = [
      // A comment after a collection's last entry, which an indented comment belongs to for yaml.
      'a:\n  - k: true\n    # c\nb: 1',
      // A collection that ends with an empty value (yaml ends it after what follows).
      'a: 1\nb: # c\n',
      // A mapping of one pair inside a flow sequence, which js-yaml makes without composing a mapping.
      'a: [b: c]',
      // A next-line character, which ends a plain scalar for js-yaml only.
      'a: b\u0085c',
      // A byte-order mark at the start, which js-yaml drops (its places are then one short).
      '\ufeff\n  k: # c\n      s: a',
      // What the quick reading itself leaves to yaml: an error, an anchor.
      'a: [b', 'a: &x b',
    ];
    for (const text of left) expect(quickPositionTable(text), JSON.stringify(text)).toBeUndefined();
    expect(quickPositionTable('# only a comment\n')).toEqual({ count: 0, cells: new Int32Array(0), links: new Int32Array(0), keys: [], root: -1 });
  });

  it('is what a source read quickly answers its positions from', () => {
    const text = readFileSync(demoFiles[0], 'utf8');
    const source = readSource(demoFiles[0], text);
    const yaml = splitFrontMatter(text).yaml!;
    const offset = text.indexOf(yaml);
    const { node } = locateIn(reference(yaml)!, ['title'], 'value');
    const before = text.slice(0, offset + node!.r![0]).split('\n');
    expect(source.rangeOf(['title'])).toMatchObject({ line: before.length, column: before.at(-1)!.length + 1 });
  });
});
