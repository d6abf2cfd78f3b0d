// Where the manual's pages live. A plant may host the manual under a sub-path (an intranet folder, a project
// pages site): every link a page makes goes through `siteUrl`, with the base the site is built with, so
// nothing points outside that path. Pages take the base from `src/site/lib/url.ts`; views built here take it
// as an argument.

import { normalizeBase, parseBase, rootBase, type SiteBase } from '../model/site-base.ts';

export { normalizeBase, parseBase, rootBase, type SiteBase };

/**
 * A page or file of the manual under the base: `siteUrl('/manual/', '/tags/')` is "/manual/tags/".
 * `path` is written from the manual's root, with a leading slash; a fragment-only link ("#step-3") is
 * returned as it is.
 */
export function siteUrl(base: SiteBase, path: string): string {
  if (path.startsWith('#')) return path;
  if (!path.startsWith('/')) throw new Error(`siteUrl: '${path}' must start with '/' (a path from the manual's root).`);
  return `${base}${path.slice(1)}`;
}

/** The paths of the manual's pages, from its root (pass them through `siteUrl`). */
export const pagePath = {
  home: () => '/',
  procedure: (slug: string) => `/procedures/${slug}/`,
  tag: (slug: string) => `/tags/${slug}/`,
  /** Part `number` of a tag's where-used list (render/tag-parts.ts): the first part is the tag's own page. */
  tagPart: (slug: string, number: number) => (number <= 1 ? `/tags/${slug}/` : `/tags/${slug}/${number}/`),
  rule: (id: string) => `/rules/${id}/`,
  search: () => '/search/',
  offline: () => '/offline/',
};

/** The folder in the site that holds a page and the pages under it: a page path without its slashes ("procedures/r-101"). */
export function pageFolder(path: string): string {
  return path.replace(/^\/+|\/+$/g, '');
}

/**
 * Links in a built page that start with "/" but leave the base (a page that forgot `siteUrl`).
 * Looks at href, src, action and srcset attributes and at `import('/…')` in inline scripts.
 */
export function linksOutsideBase(html: string, base: SiteBase): string[] {
  if (base === rootBase) return [];
  const out = new Set<string>();
  const attribute = /\s(?:href|src|action|poster|data)\s*=\s*(?:"([^"]*)"|'([^']*)'|([^\s>"']+))/gi;
  for (const m of html.matchAll(attribute)) {
    const value = (m[1] ?? m[2] ?? m[3] ?? '').trim();
    if (leavesBase(value, base)) out.add(value);
  }
  for (const m of html.matchAll(/\ssrcset\s*=\s*(?:"([^"]*)"|'([^']*)')/gi)) {
    for (const candidate of (m[1] ?? m[2] ?? '').split(',')) {
      const url = candidate.trim().split(/\s+/)[0] ?? '';
      if (leavesBase(url, base)) out.add(url);
    }
  }
  for (const m of html.matchAll(/\bimport\(\s*(["'`])([^"'`]*)\1\s*\)/g)) if (leavesBase(m[2], base)) out.add(m[2]);
  return [...out].sort();
}

function leavesBase(url: string, base: SiteBase): boolean {
  const decoded = url.replace(/&amp;/g, '&');
  if (!decoded.startsWith('/') || decoded.startsWith('//')) return false;
  return !(decoded + (decoded.endsWith('/') ? '' : '/')).startsWith(base);
}
