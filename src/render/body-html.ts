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
  keepImagesLocal(clean);
  return toHtml(clean);
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
