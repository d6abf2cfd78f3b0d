// The last pass over a built site: tags kept whole on every page, and search indexing that sends pagefind only
// the pages it indexes. The index must come out byte for byte as when every page is sent.
import { createHash } from 'node:crypto';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { finishPages } from '../../src/cli/index-site.ts';
import { closeSearchIndexer, startSearchFeed } from '../../src/cli/search-feed.ts';
import { siteFiles } from '../../src/cli/site-manifest.ts';

const made: string[] = [];
afterAll(() => {
  for (const d of made) rmSync(d, { recursive: true, force: true });
});

function writeSite(pages: Record<string, string>): string {
  const dir = mkdtempSync(join(tmpdir(), 'stepwright-finish-'));
  made.push(dir);
  for (const [path, html] of Object.entries(pages)) {
    mkdirSync(join(dir, path, '..'), { recursive: true });
    writeFileSync(join(dir, path), html);
  }
  return dir;
}

const page = (body: string) => `<!doctype html><html lang="en"><head><title>Page</title></head><body>${body}</body></html>`;
const marked = Object.fromEntries(Array.from({ length: 40 }, (_, i) => [
  `procedures/p-${String(i).padStart(2, '0')}/index.html`,
  page(`<main data-pagefind-body><h1>Open valve XV-${2100 + i}</h1><p>Heat kettle K-${i % 5} to ${200 + i} degC.</p></main>`),
]));
const unmarked = Object.fromEntries(Array.from({ length: 12 }, (_, i) => [
  `tags/t-${String(i).padStart(2, '0')}/index.html`,
  page(`<h1>Where TI-${300 + i} is used</h1><p>Listed in ${i} procedures, drain valve unmarked${i}.</p>`),
]));

function indexHashes(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const path of siteFiles(join(dir, 'pagefind'))) out[path] = createHash('sha256').update(readFileSync(join(dir, 'pagefind', path))).digest('hex');
  return out;
}

/** The index as pagefind makes it when every page is sent (how the build indexed before). */
async function indexEveryPage(dir: string): Promise<void> {
  const pagefind = await import('pagefind');
  try {
    const { index } = await pagefind.createIndex({});
    for (const path of siteFiles(dir).filter((p) => p.endsWith('.html'))) await index!.addHTMLFile({ sourcePath: path, content: readFileSync(join(dir, path), 'utf8') });
    await index!.writeFiles({ outputPath: join(dir, 'pagefind') });
  } finally {
    await pagefind.close();
  }
}

describe('finishPages', () => {
  it('gives the same index as sending every page, with only the marked pages sent', async () => {
    const pages = { ...marked, ...unmarked };
    const everyPage = writeSite(pages);
    const onlyMarked = writeSite(pages);
    await indexEveryPage(everyPage);
    await finishPages(onlyMarked, { index: true });
    const hashes = indexHashes(onlyMarked);
    // More pages than are sent at a time: the same index as pages sent and awaited one by one.
    expect(Object.keys(hashes).filter((p) => p.startsWith('fragment/'))).toHaveLength(40);
    // Tags are wrapped on the pages before they are indexed; wrapping changes no indexed word.
    expect(readFileSync(join(onlyMarked, 'procedures/p-03/index.html'), 'utf8')).toContain('<span class="nb">XV-2103</span>');
    expect(hashes).toEqual(indexHashes(everyPage));
  }, 60_000);

  it('indexes every page when no page marks its searchable part', async () => {
    const dir = writeSite(unmarked);
    await finishPages(dir, { index: true });
    expect(siteFiles(join(dir, 'pagefind')).filter((p) => p.startsWith('fragment/'))).toHaveLength(12);
  }, 60_000);

  it('returns the SHA-256 and size of every page as it left it, so that no later step reads the pages again', async () => {
    const dir = writeSite({ ...unmarked, 'procedures/p-00/index.html': marked['procedures/p-00/index.html'] });
    const pages = await finishPages(dir, { index: true });
    const html = siteFiles(dir).filter((p) => p.endsWith('.html'));
    expect([...pages.keys()].sort()).toEqual(html);
    for (const path of html) {
      // The bytes on disk after the pass (tags wrapped), not the bytes Astro wrote.
      const bytes = readFileSync(join(dir, path));
      expect(pages.get(path)).toEqual({ path, sha256: createHash('sha256').update(bytes).digest('hex'), size: bytes.byteLength, marked: path === 'procedures/p-00/index.html' });
    }
    expect(pages.get('tags/t-00/index.html')!.size).toBeGreaterThan(Buffer.byteLength(unmarked['tags/t-00/index.html']));
  }, 60_000);

  it('keeps tags whole without indexing when asked for no index', async () => {
    const dir = writeSite({ 'tags/t-00/index.html': unmarked['tags/t-00/index.html'] });
    await finishPages(dir, { index: false });
    expect(readFileSync(join(dir, 'tags/t-00/index.html'), 'utf8')).toContain('<span class="nb">TI-300</span>');
    expect(siteFiles(dir)).toEqual(['tags/t-00/index.html']);
  });
});

/** Every file of a site, by path, with its SHA-256: pages, search index and all. */
function siteHashes(dir: string): Record<string, string> {
  return Object.fromEntries(siteFiles(dir).map((path) => [path, createHash('sha256').update(readFileSync(join(dir, path))).digest('hex')]));
}

/**
 * A build that finishes its pages as they are drawn: each page goes through the feed in `order` (an index into the
 * planned pages), written as the feed hands it back, as Astro writes it. Returns how the final pass indexed.
 * `written`: files in the site before the drawing (pages taken over, or pages Astro wrote without the hook);
 * `told`: the path the feed is told for a page (Astro's own by default); `hook: false`: Astro never lists the pages.
 */
async function drawAndFinish(pages: Record<string, string>, plan: Array<{ path: string; route: string }>, order: number[], options: {
  alter?: string; taken?: Parameters<typeof startSearchFeed>[0]['taken']; lastSite?: string; mayDraw?: string[];
  written?: Record<string, string>; told?: (path: string) => string; hook?: false;
} = {}) {
  const dir = writeSite(options.written ?? {});
  const told = options.told ?? ((path: string) => path);
  const feed = await startSearchFeed({ index: true, lastSite: options.lastSite ?? dir, taken: options.taken, mayDraw: options.mayDraw });
  let how: string | undefined;
  try {
    if (options.hook !== false) feed.planned(plan.map((p) => ({ ...p, path: told(p.path) })));
    for (const i of order) {
      const { path, route } = plan[i];
      const bytes = feed.drawn({ path: told(path), route }, Buffer.from(pages[path]));
      mkdirSync(join(dir, path, '..'), { recursive: true });
      writeFileSync(join(dir, path), bytes);
    }
    const sent = feed.finish();
    // Another page than the one handed back (as drawn, not finished) in its place: the final pass finishes it.
    if (options.alter) writeFileSync(join(dir, options.alter), pages[options.alter].replace('Heat', 'Warm'));
    await finishPages(dir, { index: true, finished: options.taken, early: { drawn: feed.drawnPages, sent, indexed: (h) => { how = h; } } });
  } finally {
    await closeSearchIndexer();
  }
  return { dir, how };
}

describe('finishPages after pages were sent to the index while drawn', () => {
  const pages = { ...marked, ...unmarked };
  const plan = Object.keys(pages).map((path) => ({ path, route: path.startsWith('procedures/') ? '/procedures/[slug]' : '/tags/[tag]' }));
  const reference = async (site: Record<string, string>) => {
    const dir = writeSite(site);
    await finishPages(dir, { index: true });
    return siteHashes(dir);
  };

  it('publishes the same pages and the same index as finishing them afterwards, and uses the index it sent', async () => {
    // Drawn route after route, each in reverse order: the feed holds pages back until those before them are drawn.
    const order = plan.map((_, i) => i).reverse();
    const drawn = await drawAndFinish(pages, plan, order);
    expect(drawn.how).toBe('as-sent');
    expect(siteHashes(drawn.dir)).toEqual(await reference(pages));
  });

  it('indexes every page again, to the same index, when a marked page came too late for the order', async () => {
    // A marked page from a route that had drawn none: sent pages already sort after it.
    const late = 'procedures/a-late/index.html';
    const withLate = { ...pages, [late]: page('<main data-pagefind-body><h1>Drain tank T-5</h1></main>') };
    const latePlan = [...plan, { path: late, route: '/procedures/late' }];
    const order = [...plan.map((_, i) => i), plan.length];
    const drawn = await drawAndFinish(withLate, latePlan, order);
    expect(drawn.how).toBe('again');
    expect(siteHashes(drawn.dir)).toEqual(await reference(withLate));
  });

  it('finishes a page and indexes again when the page written is not the one handed back', async () => {
    const altered = 'procedures/p-07/index.html';
    const drawn = await drawAndFinish(pages, plan, plan.map((_, i) => i), { alter: altered });
    expect(drawn.how).toBe('again');
    expect(siteHashes(drawn.dir)).toEqual(await reference({ ...pages, [altered]: pages[altered].replace('Heat', 'Warm') }));
  });

  it('never finishes a page twice, even when the feed was told another path than the one written', async () => {
    const drawn = await drawAndFinish(pages, plan, plan.map((_, i) => i), { told: (path) => path.replace('p-03/index.html', 'p-03/other.html') });
    expect(drawn.how).toBe('again');
    expect(siteHashes(drawn.dir)).toEqual(await reference(pages));
  });

  it('finishes and indexes every page when none came through the feed (an Astro without the prerenderer hook)', async () => {
    const drawn = await drawAndFinish(pages, plan, [], { written: pages, hook: false });
    expect(drawn.how).toBe('again');
    expect(siteHashes(drawn.dir)).toEqual(await reference(pages));
  });

  it('sends the pages taken over from the last build in order with the drawn ones', async () => {
    // The last build: every page finished; this build draws only p-20 and the tags again.
    const last = writeSite(pages);
    const lastPages = await finishPages(last, { index: false });
    const drawnAgain = (path: string) => !path.startsWith('procedures/') || path === 'procedures/p-20/index.html';
    const taken = new Map([...lastPages].filter(([path]) => !drawnAgain(path)).map(([path, p]) => [path, { sha256: p.sha256, size: p.size, marked: p.marked }]));
    const partPlan = plan.filter((p) => drawnAgain(p.path));
    const drawn = await drawAndFinish(pages, partPlan, partPlan.map((_, i) => i), {
      taken, lastSite: last,
      written: Object.fromEntries([...taken.keys()].map((path) => [path, readFileSync(join(last, path), 'utf8')])),
      // The folders drawn again, known before Astro lists the pages.
      mayDraw: partPlan.map((p) => p.path.slice(0, p.path.lastIndexOf('/'))),
    });
    expect(drawn.how).toBe('as-sent');
    expect(siteHashes(drawn.dir)).toEqual(await reference(pages));
  });
});
