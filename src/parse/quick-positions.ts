// The table of positions of a front-matter (yaml-positions.ts), made from js-yaml's reading instead of a whole
// document of `yaml` nodes: several times faster, for the front-matters the quick reading answers for (fast-yaml.ts).
// js-yaml tells where it starts and stops composing each node; the table needs where each node is written, which
// follows from those places and the text:
// - a node starts at the first character after the spaces, line breaks and comments where its composing started
//   (an empty value: after the spaces only, where `yaml` places it);
// - a scalar ends where js-yaml stopped reading it, a flow collection after its closing bracket, a block collection
//   where its last entry ends (a position is always shown without the spaces after it);
// - a sequence's item that is a plain scalar or a flow collection is composed twice, one inside the other: taken once.
// Where the events do not make a table the same way (`tests/parse/quick-positions.test.ts` compares every path with
// `yaml`'s own table), the answer is "not here" (undefined) and the table is made from `yaml`'s document as before.
import { quickYamlData, type ComposeListener } from './fast-yaml.ts';
import { trimTrailingSpace, type PositionTable } from './yaml-positions.ts';

/** A node as js-yaml composed it. */
interface Composed {
  open: number;
  close: number;
  kind: 'scalar' | 'mapping' | 'sequence' | null;
  result: unknown;
  children: Composed[];
}

/** The same cells as yaml-positions.ts: start, end, style, kind, first link, link count. */
const cellWidth = 6;
const leafKind = 0;
const mapKind = 1;
const seqKind = 2;

/** Thrown inside: the events do not make a table here. */
class NotHere extends Error {}

/** The table of positions of `text` as `positionTable(parseDocument(text))` makes it, or undefined (not made here). */
export function quickPositionTable(text: string): PositionTable | undefined {
  // A next-line character (U+0085) ends a plain scalar for js-yaml, and not for `yaml`; js-yaml drops a byte-order
  // mark at the start, which shifts all its places.
  if (/[\u0085\ufeff]/.test(text)) return undefined;
  const root: Composed = { open: 0, close: 0, kind: null, result: null, children: [] };
  const stack: Composed[] = [root];
  const listener: ComposeListener = (event, state) => {
    if (event === 'open') {
      const node: Composed = { open: state.position, close: -1, kind: null, result: null, children: [] };
      stack[stack.length - 1].children.push(node);
      stack.push(node);
    } else {
      const node = stack.pop()!;
      node.close = state.position;
      node.kind = state.kind;
      node.result = state.result;
    }
  };
  try {
    if (!quickYamlData(text, listener)) return undefined;
    if (stack.length !== 1 || root.children.length > 1) return undefined;
    return tableOf(text, root.children[0]);
  } catch {
    return undefined;
  }
}

/** A node composed inside one that took it as its own result (a sequence's item, say): the inner one is the node. */
function unwrap(node: Composed): Composed {
  let current = node;
  while (current.children.length === 1 && current.kind !== null && current.children[0].kind === current.kind && current.children[0].result === current.result) {
    current = current.children[0];
  }
  if (current.kind === 'scalar' && current.children.length > 0) throw new NotHere();
  return current;
}

function isSpace(c: string | undefined): boolean {
  return c === ' ' || c === '\t';
}

/** Where a node whose composing started at `from` is written: past spaces, line breaks and comments. */
function contentStart(text: string, from: number): number {
  let i = from;
  for (;;) {
    while (isSpace(text[i])) i++;
    const c = text[i];
    if (c === '#' && (i === 0 || isSpace(text[i - 1]) || text[i - 1] === '\n' || text[i - 1] === '\r')) {
      while (i < text.length && text[i] !== '\n' && text[i] !== '\r') i++;
    } else if (c === '\n' || c === '\r') {
      i++;
    } else {
      return i;
    }
  }
}

/** An end without the white space before it (js-yaml reads the text with a line break added at its end). */
function trimmedEnd(text: string, start: number, end: number): number {
  return trimTrailingSpace(text, start, Math.min(end, text.length));
}

function tableOf(text: string, top: Composed | undefined): PositionTable {
  const cells: number[] = [];
  const links: number[] = [];
  const keys: string[] = [];
  const pending: Array<[Composed, number]> = [];
  const idOf = (node: Composed): number => {
    const id = cells.length / cellWidth;
    cells.push(-1, -1, 0, leafKind, 0, 0);
    pending.push([node, id]);
    return id;
  };
  // An empty front-matter (or one of comments only) has no top node.
  if (!top || top.kind === null) {
    if (top?.children.length) throw new NotHere();
    return { count: 0, cells: new Int32Array(0), links: new Int32Array(0), keys, root: -1 };
  }
  const root = idOf(unwrap(top));
  // Ends are worked out after every node's children: a block collection ends where its last entry does.
  const ends: Array<[number, Composed]> = [];
  const emptyAt = new Set<number>();
  while (pending.length) {
    const [node, id] = pending.pop()!;
    const at = id * cellWidth;
    if (node.kind === null) {
      // An empty value: `yaml` places it after the spaces that follow its key's colon.
      let start = node.open;
      while (isSpace(text[start])) start++;
      cells[at] = start;
      cells[at + 1] = start;
      cells[at + 2] = 1;
      emptyAt.add(id);
      if (node.children.length) throw new NotHere();
      continue;
    }
    const start = contentStart(text, node.open);
    cells[at] = start;
    const first = text[start];
    if (node.kind === 'scalar') {
      cells[at + 1] = trimmedEnd(text, start, node.close);
      cells[at + 2] = first === '"' || first === "'" ? 2 : first === '|' || first === '>' ? 3 : 1;
    } else if (node.kind === 'mapping') {
      const children = node.children;
      const flow = first === '{';
      const pairs: Array<[number, number, number]> = [];
      for (let i = 0; i < children.length;) {
        const key = unwrap(children[i]);
        if (key.kind !== 'scalar' || (key.result !== null && typeof key.result === 'object')) throw new NotHere();
        let value: Composed | undefined;
        // In a flow mapping, a key with no colon after it has no value at all ("{a}"); in a block mapping every key has one.
        if (!flow || text[contentStartOnLine(text, key.close)] === ':') value = children[i + 1];
        if (value === undefined && !flow) throw new NotHere();
        pairs.push([keys.push(String(key.result)) - 1, idOf(key), value === undefined ? -2 : idOf(unwrap(value))]);
        i += value === undefined ? 1 : 2;
      }
      // A pair js-yaml makes without composing a mapping for it ("[a: b]") is not made here.
      if (pairs.length !== Object.keys(node.result as object).length) throw new NotHere();
      cells[at + 3] = mapKind;
      cells[at + 4] = links.length;
      cells[at + 5] = pairs.length;
      for (const pair of pairs) links.push(...pair);
      ends.push([id, node]);
    } else {
      // An item js-yaml makes of several nodes ("[a: b]", a mapping of one pair) is not made here.
      if (node.children.length !== (node.result as unknown[]).length) throw new NotHere();
      const items = node.children.map((child) => idOf(unwrap(child)));
      cells[at + 3] = seqKind;
      cells[at + 4] = links.length;
      cells[at + 5] = items.length;
      links.push(...items);
      ends.push([id, node]);
    }
  }
  // Collections from the innermost out (their ids grow inwards): a block collection ends with its last entry.
  for (let k = ends.length - 1; k >= 0; k--) {
    const [id, node] = ends[k];
    const at = id * cellWidth;
    const start = cells[at];
    if (text[start] === '[' || text[start] === '{') {
      cells[at + 1] = trimmedEnd(text, start, node.close);
    } else {
      const kind = cells[at + 3];
      const first = cells[at + 4];
      const count = cells[at + 5];
      const last = count === 0 ? -1 : kind === mapKind ? lastOfPair(links, first + 3 * (count - 1)) : links[first + count - 1];
      // One that ends with an empty value: `yaml` ends it after what follows that value (a comment, say).
      if (last < 0 || emptyAt.has(last)) throw new NotHere();
      const end = cells[last * cellWidth + 1];
      // A comment after its last entry may be part of it for `yaml` (an indented one is): not made here.
      if (text.slice(end, node.close).includes('#')) throw new NotHere();
      cells[at + 1] = end;
    }
  }
  return { count: cells.length / cellWidth, cells: Int32Array.from(cells), links: Int32Array.from(links), keys, root };
}

function lastOfPair(links: number[], pair: number): number {
  return links[pair + 2] >= 0 ? links[pair + 2] : links[pair + 1];
}

/** The first character after spaces (on the same line) from `from`. */
function contentStartOnLine(text: string, from: number): number {
  let i = from;
  while (isSpace(text[i])) i++;
  return i;
}
