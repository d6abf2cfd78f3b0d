// Renders a procedure's narrative body (mdast) to safe HTML: raw HTML is dropped, links and attributes sanitized.
import type { Root } from 'mdast';
import type { Element, Root as HastRoot } from 'hast';
import { toHast } from 'mdast-util-to-hast';
import { sanitize, defaultSchema } from 'hast-util-sanitize';
import { toHtml } from 'hast-util-to-html';

/**
 * Procedure text comes from many hands, so nothing in it may run or restyle the page: `allowDangerousHtml`
 * stays off (raw HTML nodes are dropped), and the sanitizer keeps only plain document elements.
 * Headings move down `shift` levels so the body sits under the page's own section heading.
 */
export function renderBodyHtml(body: Root, shift = 1): string {
  const hast = toHast(body, { allowDangerousHtml: false }) as HastRoot;
  const clean = sanitize(hast, { ...defaultSchema, clobberPrefix: 'body-' }) as HastRoot;
  shiftHeadings(clean, shift);
  return toHtml(clean);
}

function shiftHeadings(node: HastRoot | Element, shift: number): void {
  for (const child of node.children) {
    if (child.type !== 'element') continue;
    const m = /^h([1-6])$/.exec(child.tagName);
    if (m) child.tagName = `h${Math.min(6, Number(m[1]) + shift)}`;
    shiftHeadings(child, shift);
  }
}
