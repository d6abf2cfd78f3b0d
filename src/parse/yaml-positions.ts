// Where each value of a front-matter is written, kept as a small table of the YAML document's nodes: their
// ranges, their styles, and how maps and sequences lead to them. A check asks for positions long after reading;
// the table answers exactly as the document would (the same walk over the same nodes), costs a fraction of its
// memory, and is plain data that can be sent from a reading thread.
import { isMap, isNode, isScalar, isSeq, type Document } from 'yaml';

/** One step of a path into a front-matter: a map's key or a sequence's index. */
export type PathKey = string | number;

/** A node: its range (null without one), its scalar style, and for a map or a sequence where its parts lead. */
export interface PositionNode {
  /** [start, end) in the YAML text, or null. */
  r: [number, number] | null;
  /** 0 not a scalar, 1 a plain scalar, 2 a quoted one, 3 a block scalar. */
  t: 0 | 1 | 2 | 3;
  /** A map's pairs: the key as text, the key node (-1: none), the value node (-1: not a node; -2: the value is null). */
  m?: Array<[string, number, number]>;
  /** A sequence's items (-1: not a node). */
  s?: number[];
}

export interface PositionTable {
  nodes: PositionNode[];
  /** The document's top node (-1 when it has none). */
  root: number;
}

function style(node: unknown): PositionNode['t'] {
  if (!isScalar(node)) return 0;
  if (node.type === 'QUOTE_DOUBLE' || node.type === 'QUOTE_SINGLE') return 2;
  if (node.type === 'BLOCK_LITERAL' || node.type === 'BLOCK_FOLDED') return 3;
  return 1;
}

/** The table of a parsed document (walked without recursion: a front-matter may nest deeply). */
export function positionTable(doc: Document.Parsed): PositionTable {
  const nodes: PositionNode[] = [];
  const pending: Array<[unknown, number]> = [];
  const idOf = (node: unknown): number => {
    if (!isNode(node)) return -1;
    nodes.push({ r: null, t: 0 });
    pending.push([node, nodes.length - 1]);
    return nodes.length - 1;
  };
  const root = idOf(doc.contents);
  while (pending.length) {
    const [node, id] = pending.pop()!;
    const entry = nodes[id];
    const range = (node as { range?: [number, number, number] }).range;
    entry.r = range ? [range[0], range[1]] : null;
    entry.t = style(node);
    if (isMap(node)) {
      entry.m = node.items.map((pair) => [
        isScalar(pair.key) ? String(pair.key.value) : String(pair.key),
        idOf(pair.key),
        pair.value === null ? -2 : idOf(pair.value),
      ]);
    } else if (isSeq(node)) {
      entry.s = node.items.map((item) => idOf(item));
    }
  }
  return { nodes, root };
}

/**
 * The node at a path, as far as the path leads (a missing key or item stops at the last node found), and, with
 * part 'key', the key it was reached by: the walk a check has always made over the document itself.
 */
export function locateIn(table: PositionTable, path: readonly PathKey[], part: 'key' | 'value'): { node: PositionNode | null; key: PositionNode | null } {
  let current = table.root;
  let lastKey = -1;
  for (const segment of path) {
    const entry = current >= 0 ? table.nodes[current] : undefined;
    if (entry?.m) {
      const pair = entry.m.find(([key]) => key === String(segment));
      if (!pair) break;
      lastKey = pair[1];
      if (pair[2] === -2) {
        current = pair[1];
        break;
      }
      current = pair[2];
    } else if (entry?.s) {
      const item = entry.s[Number(segment)];
      if (item === undefined) break;
      lastKey = -1;
      current = item;
    } else break;
  }
  return { node: current >= 0 ? table.nodes[current] : null, key: part === 'key' && lastKey >= 0 ? table.nodes[lastKey] : null };
}
