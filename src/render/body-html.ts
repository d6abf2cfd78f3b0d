// Renders a procedure's narrative body (mdast) to safe HTML for the page: what is kept is decided in
// analysis/body-kept.ts (the same tree body-not-shown judges); this adds only presentation: headings moved under the
// page's own, tables in named scroll areas, task-list marks.
import type { Root } from 'mdast';
import type { Element, ElementContent, Root as HastRoot, Text } from 'hast';
import { toHtml } from 'hast-util-to-html';
import { elements, keptBodyHast } from '../analysis/body-kept.ts';

export { bodySchema } from '../analysis/body-kept.ts';

/**
 * The body as HTML. Headings move down `shift` levels so the body sits under the page's own section heading.
 * `idPrefix` starts every id the body makes (its footnotes); two bodies on one page need two prefixes.
 */
export function renderBodyHtml(body: Root, shift = 1, idPrefix = 'body-'): string {
  return toHtml(bodyHast(body, shift, idPrefix));
}

/** The body as the page's HTML tree: every step of renderBodyHtml but the last. */
export function bodyHast(body: Root, shift = 1, idPrefix = 'body-'): HastRoot {
  const clean = keptBodyHast(body, idPrefix);
  shiftHeadings(clean, shift);
  presentTables(clean);
  presentTaskMarks(clean);
  return clean;
}

function shiftHeadings(node: HastRoot | Element, shift: number): void {
  for (const child of node.children) {
    if (child.type !== 'element') continue;
    const m = /^h([1-6])$/.exec(child.tagName);
    if (m) child.tagName = `h${Math.min(6, Number(m[1]) + shift)}`;
    shiftHeadings(child, shift);
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
