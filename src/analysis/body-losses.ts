// What the published page leaves out of a narrative body, found in the tree the page is rendered from and judged by
// the steps that decide what the page keeps (body-kept.ts, which the renderer builds on): raw HTML, link and image addresses the sanitizer removes, and link
// definitions and footnotes nothing refers to. The body-not-shown rule reports each one.
import type { FootnoteDefinition, Nodes, Root } from 'mdast';
import type { Element, Root as HastRoot } from 'hast';
import { keptBodyHast } from './body-kept.ts';

export interface Place {
  line: number;
  column: number;
  endLine: number;
  endColumn: number;
}

export type BodyLoss =
  /** A raw HTML node (block or inline) other than a closed comment: the renderer drops every one. */
  | { kind: 'html'; at: Place; html: string }
  /** A link or image whose address the sanitizer removes (the text or alt is shown without it). */
  | { kind: 'address'; at: Place; of: 'link' | 'image'; url: string }
  /** A link definition no link refers to, or a later one of the same label (the first wins): its address is not shown. */
  | { kind: 'definition'; at: Place; label: string; url: string; firstLine?: number }
  /** A footnote nothing shown refers to, or a later one of the same label: its text is not shown. */
  | { kind: 'footnote'; at: Place; label: string; firstLine?: number };

type Positioned = { position?: { start: { line: number; column: number }; end: { line: number; column: number } } };

function placeOf(node: Positioned): Place | undefined {
  const p = node.position;
  return p && { line: p.start.line, column: p.start.column, endLine: p.end.line, endColumn: p.end.column };
}

/** The key the renderer looks definitions and footnotes up by (mdast-util-to-hast: the identifier, upper-cased). */
const keyOf = (identifier: string) => identifier.toUpperCase();

/**
 * Whether the HTML is nothing but closed comments (and white space): those are the author's own notes, meant to be
 * hidden, and not a loss. A comment that is never closed hides the rest of its block, or of the body; it counts.
 */
export function onlyComments(html: string): boolean {
  let rest = html.trim();
  if (rest === '') return false;
  while (rest.startsWith('<!--')) {
    // Source: CommonMark Spec 0.31.2, section 6.6 Raw HTML: `<!-->` and `<!--->` are whole comments too.
    const end = rest.startsWith('<!-->') ? 5 : rest.startsWith('<!--->') ? 6 : rest.indexOf('-->', 4) + 3;
    if (end < 3) return false;
    rest = rest.slice(end).trim();
  }
  return rest === '';
}

function anyAddress(node: HastRoot | Element): boolean {
  for (const child of node.children) {
    if (child.type !== 'element') continue;
    const { href, src } = child.properties;
    if ((typeof href === 'string' && href !== '') || (typeof src === 'string' && src !== '')) return true;
    if (anyAddress(child)) return true;
  }
  return false;
}

/**
 * Whether the page keeps an address for a link or an image: the renderer itself is given a body holding that one
 * link (or image) and asked whether any address comes out.
 */
export function addressKept(of: 'link' | 'image', url: string): boolean {
  if (url === '') return true;
  const key = `${of} ${url}`;
  let kept = keptAddresses.get(key);
  if (kept === undefined) {
    // A manual links to the same few addresses again and again; the answer depends on nothing else.
    if (keptAddresses.size >= 2000) keptAddresses.clear();
    kept = askRenderer(of, url);
    keptAddresses.set(key, kept);
  }
  return kept;
}

const keptAddresses = new Map<string, boolean>();

function askRenderer(of: 'link' | 'image', url: string): boolean {
  const inline = of === 'image' ? { type: 'image' as const, url, alt: 'x' } : { type: 'link' as const, url, children: [{ type: 'text' as const, value: 'x' }] };
  return anyAddress(keptBodyHast({ type: 'root', children: [{ type: 'paragraph', children: [inline] }] }));
}

/** Everything of `body` the page built from it will not show, in the order written. */
export function bodyLosses(body: Root): BodyLoss[] {
  // First pass: the definitions (the first of each label is the one used), footnotes and what refers to them.
  const definitions = new Map<string, { line?: number; url: string }>();
  const footnotes = new Map<string, FootnoteDefinition>();
  const laterDefinitions: Array<{ node: Nodes & { type: 'definition' }; first?: number }> = [];
  const laterFootnotes: Array<{ node: FootnoteDefinition; first?: number }> = [];
  const linkUses: Array<{ key: string; of: 'link' | 'image'; within: FootnoteDefinition | undefined }> = [];
  /** Footnote labels referred to from the body outside footnotes, and from within each footnote. */
  const fromText = new Set<string>();
  const fromFootnote = new Map<FootnoteDefinition, Set<string>>();
  const collect = (node: Nodes, within: FootnoteDefinition | undefined) => {
    if (node.type === 'definition') {
      const key = keyOf(node.identifier);
      const first = definitions.get(key);
      if (first) laterDefinitions.push({ node, first: first.line });
      else definitions.set(key, { line: node.position?.start.line, url: node.url });
    } else if (node.type === 'footnoteDefinition') {
      const key = keyOf(node.identifier);
      const first = footnotes.get(key);
      if (first) laterFootnotes.push({ node, first: first.position?.start.line });
      else footnotes.set(key, node);
    } else if (node.type === 'linkReference' || node.type === 'imageReference') {
      linkUses.push({ key: keyOf(node.identifier), of: node.type === 'imageReference' ? 'image' : 'link', within });
    } else if (node.type === 'footnoteReference') {
      const key = keyOf(node.identifier);
      if (within) {
        const set = fromFootnote.get(within) ?? new Set<string>();
        set.add(key);
        fromFootnote.set(within, set);
      } else {
        fromText.add(key);
      }
    }
    if ('children' in node) {
      const inside = node.type === 'footnoteDefinition' ? node : within;
      for (const child of node.children) collect(child, inside);
    }
  };
  collect(body, undefined);

  // A footnote is shown when the text refers to it, or a shown footnote does (the renderer lists them as it meets them).
  const shown = new Set<string>();
  const queue = [...fromText];
  while (queue.length > 0) {
    const key = queue.pop()!;
    if (shown.has(key)) continue;
    shown.add(key);
    const footnote = footnotes.get(key);
    for (const next of (footnote && fromFootnote.get(footnote)) ?? []) queue.push(next);
  }
  const unshownFootnotes = new Set<Nodes>(laterFootnotes.map((l) => l.node));
  for (const [key, node] of footnotes) if (!shown.has(key)) unshownFootnotes.add(node);
  // A link is shown unless it is written in a footnote that is not.
  const uses = new Map<string, Set<'link' | 'image'>>();
  for (const use of linkUses) {
    if (use.within && unshownFootnotes.has(use.within)) continue;
    const set = uses.get(use.key) ?? new Set<'link' | 'image'>();
    set.add(use.of);
    uses.set(use.key, set);
  }

  // Second pass: in the order written.
  const losses: BodyLoss[] = [];
  const later = new Map<Nodes, number | undefined>([...laterDefinitions.map((l) => [l.node, l.first] as const), ...laterFootnotes.map((l) => [l.node, l.first] as const)]);
  const visit = (node: Nodes) => {
    const at = placeOf(node);
    if (node.type === 'footnoteDefinition' && unshownFootnotes.has(node)) {
      // Reported whole: what is inside it is not shown either way.
      if (at) losses.push({ kind: 'footnote', at, label: node.label ?? node.identifier, ...firstLine(later.get(node)) });
      return;
    }
    if (at && node.type === 'html' && !onlyComments(node.value)) losses.push({ kind: 'html', at, html: node.value });
    if (at && (node.type === 'link' || node.type === 'image') && !addressKept(node.type, node.url)) losses.push({ kind: 'address', at, of: node.type, url: node.url });
    if (at && node.type === 'definition') {
      const label = node.label ?? node.identifier;
      const used = uses.get(keyOf(node.identifier));
      if (later.has(node) || !used) losses.push({ kind: 'definition', at, label, url: node.url, ...firstLine(later.get(node)) });
      else for (const use of ['link', 'image'] as const) {
        if (used.has(use) && !addressKept(use, node.url)) losses.push({ kind: 'address', at, of: use, url: node.url });
      }
    }
    if ('children' in node) for (const child of node.children) visit(child);
  };
  visit(body);
  return losses;
}

function firstLine(line: number | undefined): { firstLine?: number } {
  return line === undefined ? {} : { firstLine: line };
}
