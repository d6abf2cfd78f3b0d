// Indexes a built site for search. Pages are added one by one in sorted order: the index depends on the
// order pages are added, and a folder listing's order differs between file systems (ext4, tmpfs, ...).
import { createHash, webcrypto } from 'node:crypto';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { keepTokensWholeInBytes } from '../render/keep-tokens-whole.ts';
import { siteFiles } from './site-manifest.ts';
import type { HashedFile } from '../render/offline-manifest.ts';

/** Pages sent to the search indexer before waiting for its answers. */
const pagesInFlight = 16;

/** The attribute that marks a page's searchable part. */
const bodyMark = 'data-pagefind-body';

/** True when a page's bytes carry the mark of a searchable part (a page the search index is sent). */
export function marksSearchablePart(page: Buffer): boolean {
  return page.includes(bodyMark, 0, 'latin1');
}

/** A page as it was finished when drawn. */
export interface PageAsDrawn {
  sha256: string;
  size: number;
}

/** What the indexer was sent while the pages were drawn. */
export interface EarlyIndex {
  /** The index the pages were added to; undefined when the build does not index. */
  index?: NonNullable<Awaited<ReturnType<typeof import('pagefind')['createIndex']>>['index']>;
  /** Every page sent, in order, with the SHA-256 of the bytes sent. */
  sent: Array<{ path: string; sha256: string }>;
  /** Sending stopped: a page came out of order, a page could not be read, or the indexer refused one. */
  broken: boolean;
}

/** A page as the final pass left it. */
export interface FinishedPage extends HashedFile {
  /** The page carries the mark of a searchable part. */
  marked: boolean;
  /** Taken as the last build recorded it (an unchanged file it published), not read by this pass. */
  asRecorded?: true;
}

/** A page taken over from the last build, as that build's final pass recorded it. */
export type RecordedPage = Pick<FinishedPage, 'sha256' | 'size' | 'marked'>;

export async function indexSite(dir: string): Promise<void> {
  await finishPages(dir, { index: true });
}

/**
 * The last pass over a built site's pages, each page read once: tags, ids and dates are kept whole on every
 * page, and (with `index`) the pages are indexed for search. Once any page marks its searchable part, pagefind
 * indexes only pages that do (its documented rule), so pages without the mark (tag lists, audit trails, rule
 * pages) are not sent to it at all; when no page has the mark, every page is indexed as before.
 * Returns the SHA-256 and size of every page as it was left, by path in the site: later steps of the same build
 * (the offline copy's list, the site manifest) take them instead of reading every page again.
 * Pages in `finished` (taken over from an earlier build, which kept their tokens whole already) are indexed and
 * hashed as they are: keeping tokens whole a second time could wrap a token the first pass left alone. One the
 * search index is not sent is not even read: its hash and size are the recorded ones (the build has checked that
 * the file is the one recorded; see page-reuse.ts).
 * `early`: the build finished its pages as they were drawn and sent them to the indexer meanwhile (search-feed.ts).
 * A page whose bytes are those of a page finished when drawn is taken as it is. The index they were sent to is
 * written when it was sent exactly the marked pages as published, in order; otherwise (and without `early`) the
 * pages are indexed here, in order, into a new index. `sent` settles once the indexer has every page sent: this
 * pass reads the pages meanwhile. With `early` the caller closes the indexer.
 */
export async function finishPages(dir: string, options: { index: boolean; finished?: ReadonlyMap<string, RecordedPage>; early?: { drawn: ReadonlyMap<string, PageAsDrawn>; sent: Promise<EarlyIndex>; indexed?: (how: 'as-sent' | 'again') => void } }): Promise<Map<string, FinishedPage>> {
  const pages = new Map<string, FinishedPage>();
  const digests: Array<Promise<void>> = [];
  const drawn = [...(options.early?.drawn.values() ?? [])];
  const drawnSums = new Set(drawn.map((p) => p.sha256));
  const drawnSizes = new Set(drawn.map((p) => p.size));
  let read = 0;
  for (const path of siteFiles(dir).filter((p) => p.endsWith('.html'))) {
    // Now and then the pages still going to the indexer get their turn.
    if (++read % pagesInFlight === 0) await new Promise((resolve) => setImmediate(resolve));
    const recorded = options.finished?.get(path);
    if (recorded && !recorded.marked) {
      pages.set(path, { path, sha256: recorded.sha256, size: recorded.size, marked: false, asRecorded: true });
      continue;
    }
    const file = join(dir, ...path.split('/'));
    const page = readFileSync(file);
    if (!recorded && drawnSizes.has(page.byteLength)) {
      // A page finished when drawn is known by its bytes, wherever Astro wrote it: finishing it twice would wrap
      // its tokens twice.
      const sha256 = createHash('sha256').update(page).digest('hex');
      if (drawnSums.has(sha256)) {
        pages.set(path, { path, sha256, size: page.byteLength, marked: marksSearchablePart(page) });
        continue;
      }
    }
    const kept = recorded ? page : keepTokensWholeInBytes(page);
    if (kept !== page) writeFileSync(file, kept);
    // Hashed on the thread pool while this thread goes on with the next page; all are in before the pages are returned.
    const hashed: FinishedPage = { path, sha256: '', size: kept.byteLength, marked: marksSearchablePart(kept) };
    pages.set(path, hashed);
    digests.push(webcrypto.subtle.digest('SHA-256', kept).then((digest) => { hashed.sha256 = Buffer.from(digest).toString('hex'); }));
  }
  await Promise.all(digests);
  // The indexer still takes the last pages sent while this pass reads the pages.
  const sent = await options.early?.sent;
  if (!options.index) return pages;
  const marked = [...pages.values()].filter((p) => p.marked);
  const asSent = sent !== undefined && !sent.broken && sent.index !== undefined && marked.length > 0 && marked.length === sent.sent.length
    && marked.every((p, i) => p.path === sent.sent[i].path && p.sha256 === sent.sent[i].sha256);
  options.early?.indexed?.(asSent ? 'as-sent' : 'again');
  if (asSent) {
    await pagesIndexer(sent.index).write(dir);
    return pages;
  }
  // Indexed from the pages as published: the marked ones, or every page when none is marked. A mention of the
  // attribute in a page's text only sends one page more: pagefind still decides.
  await sent?.index?.deleteIndex();
  const pagefind = await import('pagefind');
  try {
    const created = await pagefind.createIndex({});
    if (!created.index) throw new Error(`pagefind: ${created.errors.join('; ')}`);
    const indexer = pagesIndexer(created.index);
    for (const page of marked.length ? marked : [...pages.values()]) await indexer.add(page.path, readFileSync(join(dir, ...page.path.split('/')), 'utf8'));
    await indexer.write(dir);
  } finally {
    if (!options.early) await pagefind.close();
  }
  return pages;
}

type SearchIndex = NonNullable<EarlyIndex['index']>;

/**
 * Adds pages to an index without waiting for each answer, a few at a time, so that it indexes while the next
 * pages are read. It takes its requests one by one in the order they arrive, so the index is the same as with
 * every page awaited in turn. The first failure is kept and thrown when the pages in flight are collected (never
 * left unhandled).
 */
function pagesIndexer(index: SearchIndex | undefined) {
  const pending: Array<Promise<void>> = [];
  let failure: Error | undefined;
  const settle = async () => {
    await Promise.all(pending.splice(0));
    if (failure) throw failure;
  };
  return {
    async add(path: string, content: string) {
      pending.push(index!.addHTMLFile({ sourcePath: path, content }).then(
        (added) => { if (added.errors.length) failure ??= new Error(`pagefind: ${path}: ${added.errors.join('; ')}`); },
        (error: unknown) => { failure ??= error instanceof Error ? error : new Error(String(error)); },
      ));
      if (pending.length >= pagesInFlight) await settle();
    },
    async write(dir: string) {
      await settle();
      const written = await index!.writeFiles({ outputPath: join(dir, 'pagefind') });
      if (written.errors.length) throw new Error(`pagefind: ${written.errors.join('; ')}`);
    },
  };
}
