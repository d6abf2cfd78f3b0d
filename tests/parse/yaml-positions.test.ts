// The table of a front-matter's nodes answers every position exactly as a walk over the YAML document itself does:
// the same node for any path (missing keys and items, odd path segments, null values, aliases, every scalar style).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isMap, isNode, isPair, isScalar, isSeq, parseDocument, YAMLSeq, type Node, type Pair } from 'yaml';
import { locateIn, positionTable } from '../../src/parse/yaml-positions.ts';
import { readSource, type PathKey } from '../../src/parse/read-source.ts';

/** The walk over the document that positions were taken from before the table (the reference). */
function locateInDocument(contents: unknown, path: readonly PathKey[], part: 'key' | 'value'): { node: Node | null; key: Node | null } {
  let current: unknown = contents;
  let lastKey: Node | null = null;
  for (const segment of path) {
    if (isMap(current)) {
      const pair = current.items.find((p) => (isScalar(p.key) ? String(p.key.value) : String(p.key)) === String(segment));
      if (!pair) break;
      lastKey = isNode(pair.key) ? pair.key : null;
      current = pair.value;
      if (current === null) { current = pair.key; break; }
    } else if (isSeq(current)) {
      const item = current.items[Number(segment)];
      if (item === undefined) break;
      lastKey = null;
      current = item;
    } else break;
  }
  return { node: isNode(current) ? current : null, key: part === 'key' ? lastKey : null };
}

function nodeRange(node: Node | Pair | null | undefined): [number, number] | null {
  if (!node) return null;
  if (isPair(node)) return null;
  const range = (node as Node).range;
  return range ? [range[0], range[1]] : null;
}

/** What a position lookup answers: the range and the scalar style of the node found (and of its key). */
function answerOfDocument(text: string, path: PathKey[], part: 'key' | 'value') {
  const doc = parseDocument(text, { prettyErrors: false, uniqueKeys: true, strict: true });
  const { node, key } = locateInDocument(doc.contents, path, part);
  const found = part === 'key' && key ? key : node;
  const quoted = isScalar(node) && (node.type === 'QUOTE_DOUBLE' || node.type === 'QUOTE_SINGLE');
  const block = isScalar(node) && (node.type === 'BLOCK_LITERAL' || node.type === 'BLOCK_FOLDED');
  return { range: nodeRange(found), scalar: isScalar(node) && !!node.range, quoted, block };
}

function answerOfTable(text: string, path: PathKey[], part: 'key' | 'value') {
  const table = positionTable(parseDocument(text, { prettyErrors: false, uniqueKeys: true, strict: true }));
  const { node, key } = locateIn(table, path, part);
  const found = part === 'key' && key ? key : node;
  return { range: found?.r ?? null, scalar: !!node && node.t !== 0 && !!node.r, quoted: node?.t === 2, block: node?.t === 3 };
}

const scalarText = fc.oneof(
  fc.constantFrom('plain', '"double"', "'single'", '|\n  block\n  text', '>\n  folded', '~', 'null', '', '12', '-0', '1.0', '&a anchored', '*a', '[1, 2]', '{a: 1}'),
  fc.string({ maxLength: 8 }).map((s) => JSON.stringify(s)),
);
const keyText = fc.constantFrom('a', 'b', '0', '1', '01', 'null', '"quoted key"', '? complex', 'steps', 'do');

/** Block YAML of random shape, keys repeated and missing values included. */
const yamlText: fc.Arbitrary<string> = fc.letrec((tie) => ({
  value: fc.oneof({ depthSize: 'small' }, scalarText.map((s) => ({ inline: s })), tie('map'), tie('seq')),
  map: fc.array(fc.tuple(keyText, tie('value')), { maxLength: 4 }).map((pairs) => ({ block: pairs.map(([k, v]) => [`${k}:`, v] as const) })),
  seq: fc.array(tie('value'), { maxLength: 4 }).map((items) => ({ block: items.map((v) => ['-', v] as const) })),
})).value.map((tree) => render(tree as Tree, ''));

type Tree = { inline: string } | { block: ReadonlyArray<readonly [string, Tree]> };
function render(tree: Tree, indent: string): string {
  if ('inline' in tree) return tree.inline;
  if (!tree.block.length) return '{}';
  return tree.block.map(([lead, v]) => {
    if ('inline' in v) return `\n${indent}${lead} ${v.inline.replace(/\n/g, `\n${indent}`)}`;
    return `\n${indent}${lead}${render(v, `${indent}  `)}`;
  }).join('');
}

const segment = fc.oneof(fc.constantFrom<PathKey>('a', 'b', '0', '1', '01', 'null', 'quoted key', 'steps', 'x', '', ' 1 ', '1.0', 0, 1, 2, -1, 1.5), fc.nat(5));

describe('the table of positions', () => {
  it('finds the node the document walk finds, for any document and any path (property)', () => {
    fc.assert(fc.property(yamlText, fc.array(segment, { maxLength: 5 }), fc.constantFrom<'key' | 'value'>('key', 'value'), (text, path, part) => {
      expect(answerOfTable(text, path, part)).toEqual(answerOfDocument(text, path, part));
    }), { numRuns: 3000 });
  });

  it('finds every value of a demo-like procedure where the document does', () => {
    const text = 'id: U2-K210-001\nsteps:\n  - step: charge\n    do: "Open XV-2101"\n    until: TI-210 >= 80 degC\n  - choose:\n      - when: ok\n        goto: charge\n      - otherwise:\nnote: |\n  text\n';
    const doc = parseDocument(text);
    const paths: PathKey[][] = [[], ['id'], ['steps'], ['steps', 0], ['steps', 0, 'do'], ['steps', 1, 'choose', 1, 'otherwise'], ['steps', 1, 'choose', 0, 'goto'], ['note'], ['nowhere', 1], ['steps', 9]];
    for (const path of paths) for (const part of ['key', 'value'] as const) expect(answerOfTable(text, path, part), path.join('.')).toEqual(answerOfDocument(text, path, part));
    expect(doc.errors).toEqual([]);
  });

  it('walks a document nested deeper than a source may be, as the parser placed it', () => {
    // Twice the 200 levels a source may nest (deeper sources are refused before they are walked, read-source.ts).
    // Not 1,000: the YAML parser itself recurses, and ran out of stack at 370 to 770 levels of this text (measured
    // with 0 to 6,000 frames already on the stack), so at 1,000 the test passed or failed with what ran before it.
    const depth = 400;
    const text = `${'['.repeat(depth)}1${']'.repeat(depth)}`;
    const doc = parseDocument(text, { prettyErrors: false });
    expect(doc.errors.map((e) => e.message)).toEqual([]);
    const table = positionTable(doc);
    expect(table.count).toBe(depth + 1);
    expect(locateIn(table, Array(depth).fill(0), 'value').node?.t).toBe(1);
  });

  it('walks and searches a document of 50,000 levels without running out of stack', () => {
    // Built node by node (the parser would not reach such a depth): a walk that called itself for every level
    // would run out of stack long before.
    const depth = 50_000;
    const doc = parseDocument('1');
    let inner: Node = doc.contents as Node;
    inner.range = [depth, depth + 1, depth + 1];
    for (let level = depth - 1; level >= 0; level--) {
      const seq = new YAMLSeq();
      seq.items.push(inner);
      seq.range = [level, 2 * depth + 1 - level, 2 * depth + 1 - level];
      inner = seq;
    }
    doc.contents = inner as typeof doc.contents;
    const table = positionTable(doc);
    expect(table.count).toBe(depth + 1);
    const found = locateIn(table, Array(depth).fill(0), 'value');
    expect(found.node?.t).toBe(1);
  });


  it('answers the same when the table is made as the file is read, when a position is first asked for, or again after it was let go (property)', () => {
    // Whole files: front-matter (valid or not) and a body; ranges in the file, scalars' inner ranges included.
    const file = fc.tuple(yamlText, fc.constantFrom('', 'Body text.\n', '# Notes\n\nMore.\n'), fc.constantFrom('---\n', '\n---\n', ''))
      .map(([yaml, body, lead]) => `${lead}---\n${yaml.replace(/^\n/, '')}\n---\n${body}`);
    fc.assert(fc.property(file, fc.array(fc.array(segment, { maxLength: 4 }), { minLength: 1, maxLength: 4 }), fc.nat(6), (text, paths, from) => {
      const now = readSource('p.md', text, undefined, 'now');
      const later = readSource('p.md', text, undefined, 'when-asked');
      expect(later.data).toEqual(now.data);
      expect(later.diagnostics).toEqual(now.diagnostics);
      const answers = (source: typeof now) => paths.map((path) => [source.rangeOf(path, 'key'), source.rangeOf(path, 'value'), source.rangeInScalar(path, from, from + 2)]);
      const first = answers(now);
      expect(answers(later)).toEqual(first);
      // Let go after positions were given (as a site build does after its check): made again, the same.
      now.release();
      expect(answers(now)).toEqual(first);
    }), { numRuns: 1500 });
  });
});
