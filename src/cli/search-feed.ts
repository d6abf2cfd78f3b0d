// `stepwright build` finishes each page as Astro draws it, and sends the marked pages to the search indexer while
// the others are still being drawn: the indexer (a process of its own) works on the second core instead of after
// the pages. Finishing a page keeps its tags, ids and dates whole (render/keep-tokens-whole.ts), as the final pass
// would; Astro writes the page as finished. The pages reach the indexer in the order of a whole index (sorted by
// path; see search-feed-order.ts), the pages taken over from the last build read from its output. The final pass
// (index-site.ts) compares what was sent with the pages as published, and indexes them all again when they differ.
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { keepTokensWholeInBytes } from '../render/keep-tokens-whole.ts';
import { routeMatcher, type DrawnPageListener, type PageToDraw } from '../site/drawn-pages.ts';
import { marksSearchablePart, type EarlyIndex, type PageAsDrawn, type RecordedPage } from './index-site.ts';
import { SearchFeedOrder, type SentPage } from './search-feed-order.ts';

type SearchIndex = NonNullable<EarlyIndex['index']>;

/** Pages sent to the search indexer before waiting for its answers. */
const pagesInFlight = 16;

export interface SearchFeed extends DrawnPageListener {
  /** The pages finished as drawn, by path in the site. */
  readonly drawnPages: ReadonlyMap<string, PageAsDrawn>;
  /** Sends what is left once Astro has drawn every page, and waits until the indexer has every page sent. */
  finish(): Promise<EarlyIndex>;
}

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

/**
 * `index`: whether pages go to the indexer (false: pages are only finished). `lastSite`: the last build's output,
 * where the pages in `taken` (taken over from it, as its record describes them) are read. `mayDraw`: the page
 * folders this build draws again.
 */
export async function startSearchFeed(options: { index: boolean; lastSite: string; taken?: ReadonlyMap<string, RecordedPage>; mayDraw?: string[] }): Promise<SearchFeed> {
  let index: SearchIndex | undefined;
  if (options.index) {
    const pagefind = await import('pagefind');
    const created = await pagefind.createIndex({});
    if (!created.index) throw new Error(`pagefind: ${created.errors.join('; ')}`);
    index = created.index;
  }
  const drawnPages = new Map<string, PageAsDrawn>();
  const sent: EarlyIndex['sent'] = [];
  const takenMarked = [...(options.taken ?? [])].filter(([, page]) => page.marked).map(([path]) => path);
  const order = index ? new SearchFeedOrder<Buffer>(takenMarked, options.mayDraw) : undefined;
  let broken = false;
  const queue: Array<SentPage<Buffer>> = [];
  let inFlight = 0;
  let idle: (() => void) | undefined;

  const pump = () => {
    while (!broken && index && inFlight < pagesInFlight && queue.length) {
      const page = queue.shift()!;
      let bytes = page.drawn;
      if (!bytes) {
        try {
          bytes = readFileSync(join(options.lastSite, ...page.path.split('/')));
        } catch {
          broken = true;
          break;
        }
      }
      sent.push({ path: page.path, sha256: page.drawn ? drawnPages.get(page.path)!.sha256 : sha256(bytes) });
      inFlight++;
      index.addHTMLFile({ sourcePath: page.path, content: bytes.toString('utf8') }).then(
        (added) => { if (added.errors.length) broken = true; },
        () => { broken = true; },
      ).finally(() => {
        inFlight--;
        pump();
      });
    }
    if (inFlight === 0 && (broken || !queue.length)) idle?.();
  };
  const send = (pages: Array<SentPage<Buffer>>) => {
    if (!pages.length) return;
    queue.push(...pages);
    pump();
  };

  // The pages taken over that sort before every folder drawn again go while Astro makes its bundles.
  if (order) send(order.start());
  return {
    drawnPages,
    planned(pages: PageToDraw[]) {
      if (!order) return;
      const routes = [...new Set(pages.map((p) => p.route))].map((route) => ({ route, matches: routeMatcher(route) }));
      send(order.plan(pages, (path) => routes.find((r) => r.matches(path))?.route));
    },
    drawn(page: PageToDraw, bytes: Buffer): Buffer {
      const kept = keepTokensWholeInBytes(bytes);
      const marked = marksSearchablePart(kept);
      drawnPages.set(page.path, { sha256: sha256(kept), size: kept.byteLength });
      if (order) send(order.drawn(page.path, page.route, marked, kept));
      return kept;
    },
    async finish(): Promise<EarlyIndex> {
      if (order) send(order.finish());
      if (inFlight > 0 || (queue.length && !broken)) await new Promise<void>((resolve) => { idle = resolve; pump(); });
      return { index, sent, broken: broken || (order?.broken ?? false) };
    },
  };
}

/** Stops the search indexer's process, if one was started; the build's last step, whether it succeeded or not. */
export async function closeSearchIndexer(): Promise<void> {
  const pagefind = await import('pagefind');
  await pagefind.close();
}
