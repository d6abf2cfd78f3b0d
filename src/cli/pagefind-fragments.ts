// Reads which page each search-index fragment describes, so a tablet keeps a page's fragment exactly when it
// keeps the page (search then finds, offline, what the tablet holds).
import { gunzipSync } from 'node:zlib';
import type { BuiltFile } from '../render/offline-manifest.ts';

const signature = 'pagefind_dcd';

/**
 * Fragment path → page URL relative to the manual's root (e.g. "procedures/x/"). The index is built from the
 * site's files by their paths in the site folder, so every URL in a fragment starts at "/" whatever base the
 * site is served under (the search page puts the base in front when it shows a result); the base is not
 * looked for here. A fragment that cannot be read is left out of the map: the tablet then keeps it with the
 * frame every page needs, which costs bytes, never a result.
 */
export function fragmentPages(files: BuiltFile[]): Map<string, string> {
  const base = '/';
  const pages = new Map<string, string>();
  for (const file of files) {
    if (!/^pagefind\/fragment\/[^/]+\.pf_fragment$/.test(file.path)) continue;
    try {
      let text = gunzipSync(file.bytes).toString('utf8');
      if (text.startsWith(signature)) text = text.slice(signature.length);
      const url = (JSON.parse(text) as { url?: unknown }).url;
      if (typeof url !== 'string' || !url.startsWith(base)) continue;
      pages.set(file.path, url.slice(base.length).replace(/^$/, './'));
    } catch {
      // Not a fragment this version of pagefind wrote: kept as part of the frame (see above).
    }
  }
  return pages;
}
