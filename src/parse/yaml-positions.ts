// Where each value of a front-matter is written, kept as a small table of the YAML document's nodes: their
// ranges, their styles, and how maps and sequences lead to them. A check asks for positions long after reading;
// the table answers exactly as the document would (the same walk over the same nodes), costs a fraction of its
// memory, and is plain data that can be sent from a reading thread.
import { isMap, isNode, isScalar, isSeq, type Document } from 'yaml';

/** One step of a path into a front-matter: a map's key or a sequence's index. */
export type PathKey = string | number;

/** A node as a lookup answers it: its range (null without one) and its scalar style. */
export interface PositionNode {
  /** [start, end) in the YAML text, or null. */
  r: [number, number] | null;
  /** 0 not a scalar, 1 a plain scalar, 2 a quoted one, 3 a block scalar. */
  t: 0 | 1 | 2 | 3;
}

/**
 * The nodes in flat arrays of numbers, which a reading thread sends in one copy and which hold no object per node: a
 * large manual keeps one table per file for as long as its check runs.
 */
export interface PositionTable {
  /** How many nodes. */
  count: number;
  /** Per node, `cellWidth` numbers: start and end (-1 without a range), style, kind, where its parts start in `links`, how many. */
  cells: Int32Array;
  /** A map's pairs, three numbers each: the key's text (an index into `keys`), the key node (-1: none), the value node
   * (-1: not a node; -2: the value is null). A sequence's items, one number each (-1: not a node). */
  links: Int32Array;
  /** The maps' keys as text. */
  keys: string[];
  /** The document's top node (-1 when it has none). */
  root: number;
}

const cellWidth = 6;
const leaf = 0;
const mapKind = 1;
const seqKind = 2;

function style(node: unknown): PositionNode['t'] {
  if (!isScalar(node)) return 0;
  if (node.type === 'QUOTE_DOUBLE' || node.type === 'QUOTE_SINGLE') return 2;
  if (node.type === 'BLOCK_LITERAL' || node.type === 'BLOCK_FOLDED') return 3;
  return 1;
}

/** The table of a parsed document (walked without recursion: a front-matter may nest deeply). */
export function positionTable(doc: Document.Parsed): PositionTable {
  const cells: number[] = [];
  const links: number[] = [];
  const keys: string[] = [];
  const pending: Array<[unknown, number]> = [];
  const idOf = (node: unknown): number => {
    if (!isNode(node)) return -1;
    const id = cells.length / cellWidth;
    cells.push(-1, -1, 0, leaf, 0, 0);
    pending.push([node, id]);
    return id;
  };
  const root = idOf(doc.contents);
  while (pending.length) {
    const [node, id] = pending.pop()!;
    const at = id * cellWidth;
    const range = (node as { range?: [number, number, number] }).range;
    if (range) {
      cells[at] = range[0];
      cells[at + 1] = range[1];
    }
    cells[at + 2] = style(node);
    if (isMap(node)) {
      // The parts' ids are taken first (each takes a cell), then written in one run of `links`.
      const pairs = node.items.map((pair) => [
        keys.push(isScalar(pair.key) ? String(pair.key.value) : String(pair.key)) - 1,
        idOf(pair.key),
        pair.value === null ? -2 : idOf(pair.value),
      ]);
      cells[at + 3] = mapKind;
      cells[at + 4] = links.length;
      cells[at + 5] = pairs.length;
      for (const pair of pairs) links.push(pair[0], pair[1], pair[2]);
    } else if (isSeq(node)) {
      const items = node.items.map((item) => idOf(item));
      cells[at + 3] = seqKind;
      cells[at + 4] = links.length;
      cells[at + 5] = items.length;
      for (const item of items) links.push(item);
    }
  }
  return { count: cells.length / cellWidth, cells: Int32Array.from(cells), links: Int32Array.from(links), keys, root };
}

function nodeAt(table: PositionTable, id: number): PositionNode {
  const at = id * cellWidth;
  const start = table.cells[at];
  return { r: start < 0 ? null : [start, table.cells[at + 1]], t: table.cells[at + 2] as PositionNode['t'] };
}

/**
 * The node at a path, as far as the path leads (a missing key or item stops at the last node found), and, with
 * part 'key', the key it was reached by: the walk a check has always made over the document itself.
 */
export function locateIn(table: PositionTable, path: readonly PathKey[], part: 'key' | 'value'): { node: PositionNode | null; key: PositionNode | null } {
  const { cells, links, keys } = table;
  let current = table.root;
  let lastKey = -1;
  for (const segment of path) {
    if (current < 0) break;
    const at = current * cellWidth;
    const kind = cells[at + 3];
    const first = cells[at + 4];
    const count = cells[at + 5];
    if (kind === mapKind) {
      const wanted = String(segment);
      let pair = -1;
      for (let i = 0; i < count; i++) {
        if (keys[links[first + 3 * i]] === wanted) {
          pair = first + 3 * i;
          break;
        }
      }
      if (pair < 0) break;
      lastKey = links[pair + 1];
      if (links[pair + 2] === -2) {
        current = links[pair + 1];
        break;
      }
      current = links[pair + 2];
    } else if (kind === seqKind) {
      const index = Number(segment);
      // What an array index would find: a whole number within the items ('01' and '1.0' read as 1, as they always have).
      if (!Number.isInteger(index) || index < 0 || index >= count) break;
      lastKey = -1;
      current = links[first + index];
    } else break;
  }
  return { node: current >= 0 ? nodeAt(table, current) : null, key: part === 'key' && lastKey >= 0 ? nodeAt(table, lastKey) : null };
}

/** An end in the YAML text moved back over the white space before it: where a shown position ends. */
export function trimTrailingSpace(text: string, start: number, end: number): number {
  let e = end;
  while (e > start && /\s/.test(text[e - 1] ?? '')) e--;
  return e;
}
