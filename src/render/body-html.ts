// Renders a procedure's narrative body (mdast) to safe HTML: raw HTML is dropped, links and attributes sanitized.
// What this leaves out of the page is listed by body-losses.ts, from the same steps, for the body-not-shown rule.
import type { Root } from 'mdast';
import type { Element, ElementContent, Root as HastRoot, Text } from 'hast';
import { toHast } from 'mdast-util-to-hast';
import { sanitize, defaultSchema, type Schema } from 'hast-util-sanitize';
import { toHtml } from 'hast-util-to-html';

/**
 * What the sanitizer keeps: the schema of plain document elements that GitHub uses for user content, with `tel:`
 * links besides (an emergency number that a tablet can call is worth keeping as a link).
 */
export const bodySchema: Schema = {
  ...defaultSchema,
  protocols: { ...defaultSchema.protocols, href: [...(defaultSchema.protocols?.href ?? []), 'tel'] },
};

/**
 * Procedure text comes from many hands, so nothing in it may run or restyle the page: `allowDangerousHtml`
 * stays off (raw HTML nodes are dropped), and the sanitizer keeps only plain document elements.
 * Headings move down `shift` levels so the body sits under the page's own section heading. `idPrefix` starts every
 * id the body makes (its footnotes); two bodies on one page need two prefixes.
 */
export function renderBodyHtml(body: Root, shift = 1, idPrefix = 'body-'): string {
  return toHtml(bodyHast(body, shift, idPrefix));
}

/** The body as the page's HTML tree: every step of renderBodyHtml but the last. */
export function bodyHast(body: Root, shift = 1, idPrefix = 'body-'): HastRoot {
  const hast = toHast(body, {
    allowDangerousHtml: false,
    // Ids are prefixed once, by the sanitizer; footnoteLinks then points the footnotes' links at them.
    clobberPrefix: '',
    footnoteLabel: 'Footnotes',
    // A visible heading: the printed copy and a screen reader both need to know what the numbered notes are.
    footnoteLabelProperties: {},
  }) as HastRoot;
  const clean = sanitize(hast, { ...bodySchema, clobberPrefix: idPrefix }) as HastRoot;
  shiftHeadings(clean, shift);
  keepImagesLocal(clean);
  footnoteLinks(clean, idPrefix);
  presentTables(clean);
  presentTaskMarks(clean);
  return clean;
}

/**
 * An image from another host would be fetched the moment the page opens (a tracking beacon, or a hang on an
 * offline plant network), so it becomes a plain link the reader may choose to follow.
 */
function keepImagesLocal(node: HastRoot | Element): void {
  node.children = node.children.map((child) => {
    if (child.type !== 'element') return child;
    const src = typeof child.properties?.src === 'string' ? child.properties.src.trim() : '';
    if (child.tagName === 'img' && /^([a-z][a-z0-9+.-]*:|[\\/]{2})/i.test(src)) {
      const alt = typeof child.properties.alt === 'string' && child.properties.alt ? child.properties.alt : src;
      const link: Element = { type: 'element', tagName: 'a', properties: { href: src, className: ['external-image'] }, children: [{ type: 'text', value: `Image: ${alt}` }] };
      return /^https?:/i.test(src) ? link : { type: 'text', value: `Image: ${alt}` };
    }
    keepImagesLocal(child);
    return child;
  });
}

function shiftHeadings(node: HastRoot | Element, shift: number): void {
  for (const child of node.children) {
    if (child.type !== 'element') continue;
    const m = /^h([1-6])$/.exec(child.tagName);
    if (m) child.tagName = `h${Math.min(6, Number(m[1]) + shift)}`;
    shiftHeadings(child, shift);
  }
}

function* elements(node: HastRoot | Element): Generator<Element> {
  for (const child of node.children) {
    if (child.type !== 'element') continue;
    yield child;
    yield* elements(child);
  }
}

/**
 * The sanitizer prefixes ids (so that text cannot take the name of one of the page's own), but not the `#` links to
 * them: a footnote's link and its way back follow their target to its new id.
 */
function footnoteLinks(root: HastRoot, idPrefix: string): void {
  if (!idPrefix) return;
  const ids = new Set<string>();
  for (const el of elements(root)) if (typeof el.properties.id === 'string') ids.add(el.properties.id);
  if (ids.size === 0) return;
  for (const el of elements(root)) {
    const href = el.tagName === 'a' ? el.properties.href : undefined;
    if (typeof href === 'string' && href.startsWith('#') && ids.has(idPrefix + href.slice(1))) el.properties.href = `#${idPrefix}${href.slice(1)}`;
  }
}

function textOf(node: ElementContent): string {
  if (node.type === 'text') return node.value;
  return node.type === 'element' ? node.children.map(textOf).join('') : '';
}

/**
 * A table sits in a scroll area of its own, named after its columns, so that a wide one scrolls sideways on a tablet
 * (and says so) instead of widening the page; its header cells head their columns for a screen reader.
 */
function presentTables(node: HastRoot | Element): void {
  node.children = node.children.map((child): typeof child => {
    if (child.type !== 'element') return child;
    presentTables(child);
    if (child.tagName !== 'table') return child;
    const head = child.children.find((c): c is Element => c.type === 'element' && c.tagName === 'thead');
    const headers: string[] = [];
    for (const cell of head ? elements(head) : []) {
      if (cell.tagName !== 'th') continue;
      cell.properties.scope = 'col';
      headers.push(textOf(cell).trim());
    }
    const named = headers.filter(Boolean);
    return {
      type: 'element', tagName: 'div',
      properties: { className: ['scroll-x', 'body-table'], role: 'region', tabIndex: 0, ariaLabel: named.length ? `Table: ${named.join(', ')}` : 'Table' },
      children: [child],
    };
  });
}

/**
 * A task list's box is shown as a mark, not as a form control: the page is read, not filled in (placekeeping is
 * the steps' own), and a disabled box reads as something broken. The mark says in words whether it is done.
 */
function presentTaskMarks(node: HastRoot | Element): void {
  node.children = node.children.map((child): typeof child => {
    if (child.type !== 'element') return child;
    if (child.tagName === 'input' && child.properties.type === 'checkbox') {
      const done = Boolean(child.properties.checked);
      const mark: Text = { type: 'text', value: done ? '☑' : '☐' };
      return { type: 'element', tagName: 'span', properties: { className: ['task-mark'], role: 'img', ariaLabel: done ? 'Done' : 'Not done' }, children: [mark] };
    }
    presentTaskMarks(child);
    return child;
  });
}
