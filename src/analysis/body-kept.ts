// What of a procedure's narrative body reaches the published page: the body's mdast as an HTML tree with raw HTML
// dropped, the sanitizer's choice of elements, attributes and link schemes, remote images turned into links, and
// footnote links following their prefixed ids. The page's renderer (render/body-html.ts) adds only presentation on
// top; the body-not-shown rule (through body-losses.ts) judges from this same tree what the page leaves out.
import type { Root } from 'mdast';
import type { Element, Root as HastRoot } from 'hast';
import { toHast } from 'mdast-util-to-hast';
import { sanitize, defaultSchema, type Schema } from 'hast-util-sanitize';

/**
 * What the sanitizer keeps: the schema of plain document elements that GitHub uses for user content, with `tel:`
 * links besides (an emergency number that a tablet can call is worth keeping as a link).
 */
export const bodySchema: Schema = {
  ...defaultSchema,
  protocols: { ...defaultSchema.protocols, href: [...(defaultSchema.protocols?.href ?? []), 'tel'] },
};

/**
 * The body as the page keeps it, before presentation: procedure text comes from many hands, so nothing in it may run
 * or restyle the page: `allowDangerousHtml` stays off (raw HTML nodes are dropped), and the sanitizer keeps only
 * plain document elements. `idPrefix` starts every id the body makes (its footnotes); two bodies on one page need two
 * prefixes.
 */
export function keptBodyHast(body: Root, idPrefix = 'body-'): HastRoot {
  const hast = toHast(body, {
    allowDangerousHtml: false,
    // Ids are prefixed once, by the sanitizer; footnoteLinks then points the footnotes' links at them.
    clobberPrefix: '',
    footnoteLabel: 'Footnotes',
    // A visible heading: the printed copy and a screen reader both need to know what the numbered notes are.
    footnoteLabelProperties: {},
  }) as HastRoot;
  const clean = sanitize(hast, { ...bodySchema, clobberPrefix: idPrefix }) as HastRoot;
  keepImagesLocal(clean);
  footnoteLinks(clean, idPrefix);
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

export function* elements(node: HastRoot | Element): Generator<Element> {
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
