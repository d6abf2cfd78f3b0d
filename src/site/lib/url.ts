// Links in the manual's pages. The manual may be served under a sub-path (`base:` in the configuration,
// `--base` on build, dev and serve), so a page never writes a root-absolute link itself:
//   <a href={url('/tags/')}>          a page of the manual, written from the manual's root
//   <a href={p.url}>                  view URLs (procedures, tags, rules, revisions) already carry the base
// A build under a base fails when a page links outside it.
import { normalizeBase, siteUrl, pagePath, type SiteBase } from '../../render/site-url.ts';

/** The base the site is being built with: "/" or e.g. "/manual/". */
export const base: SiteBase = normalizeBase((import.meta as { env?: { BASE_URL?: string } }).env?.BASE_URL);

/** A page or file of the manual, from its root: url('/search/') → "/manual/search/" under /manual/. */
export function url(path: string): string {
  return siteUrl(base, path);
}

export { pagePath };
