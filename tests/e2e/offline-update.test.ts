// The offline copy at plant scale: two publications of a generated manual of 150 procedures (1,000 in `npm run
// bench`), the second with one procedure changed. A tablet (headless Chromium) updates from the first to the second;
// the test server's request log shows what it fetched. The network drops halfway through an update; a tablet keeps
// chosen areas only.
import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { launchChromium } from './floor-fixture.ts';
import { serveSite, type SiteServer } from './static-server.ts';
import { seriousViolations } from './accessibility-scan.ts';
import { proceduresPerTagPart } from '../../src/render/tag-parts.ts';
import { changedId, changedTitle, ensureGeneratedBuilds, procedureCount, type GeneratedManual } from './offline-builds.ts';
import { updateCost, type OfflineFileList, type UpdateCost } from '../../src/render/offline-manifest.ts';

vi.setConfig({ testTimeout: 180_000, hookTimeout: 20 * 60_000 });

interface Status {
  copy: null | { version: string; files: number; keptFiles: number };
  page: string | null;
  latest: null | { version: string };
  download: null | { active: boolean; files: number; done: number; failed: string | null };
  choice: { mode: string; areas: string[] };
}

async function status(page: Page): Promise<Status | null> {
  return page.evaluate(async () => {
    const r = await fetch('/__offline/status.json', { cache: 'no-store' });
    return r.ok && (r.headers.get('content-type') ?? '').includes('json') ? r.json() : null;
  });
}

async function waitForCopy(page: Page, version: string): Promise<void> {
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null, undefined, { timeout: 60_000 });
  await expect.poll(async () => {
    const s = await status(page);
    return s?.copy?.version === version && !s.download ? 'saved' : JSON.stringify(s?.download ?? s?.copy?.version ?? null);
  }, { timeout: 150_000, interval: 500 }).toBe('saved');
}

/** Pagefind search from the page's own search screen; the result links' text (id and title). */
async function searchTitles(page: Page, term: string): Promise<string[]> {
  await page.locator('#search-status').evaluate((el) => { el.textContent = ''; });
  await page.locator('#search-input').fill(term);
  await page.locator('#search-form button[type="submit"]').click();
  await expect.poll(() => page.locator('#search-status').textContent(), { timeout: 20_000 }).toMatch(/found/);
  return page.locator('#search-results a').allTextContents();
}

let built: GeneratedManual;
let listA: OfflineFileList;
let listB: OfflineFileList;
let cost: UpdateCost;
let browser: Browser;
let server: SiteServer;
const changedSlug = changedId.toLowerCase();

beforeAll(async () => {
  built = await ensureGeneratedBuilds();
  listA = JSON.parse(await readFile(join(built.a, 'offline-files.json'), 'utf8'));
  listB = JSON.parse(await readFile(join(built.b, 'offline-files.json'), 'utf8'));
  cost = updateCost(listA, listB);
  browser = await launchChromium();
});
afterAll(async () => { await browser?.close(); await server?.close(); });

describe('two publications of a generated manual', () => {
  it(`has ${procedureCount} procedures, and the second build reports what the update costs`, async () => {
    expect(listA.files.filter((f) => /^procedures\/[^/]+\/$/.test(f.url))).toHaveLength(procedureCount);
    const report = await readFile(join(built.b, '..', 'b-build.txt'), 'utf8');
    expect(report).toContain(`Update from the previous build: ${cost.fetched} file${cost.fetched === 1 ? '' : 's'} to download`);
    expect(report).toMatch(/^Offline copy: [\d,]+ files, [\d.]+ MB/m);
  });

  it('changes only the changed procedure\'s pages, the pages that list it and some search-index parts', () => {
    const pages = cost.urls.filter((u) => !u.startsWith('pagefind/'));
    const index = cost.urls.filter((u) => u.startsWith('pagefind/'));
    // The changed procedure's own pages, the procedure list (its title changed) and tag pages listing it.
    for (const url of pages) expect(url).toMatch(new RegExp(`^(procedures/${changedSlug}/.*|\\./|tags/.*)$`));
    expect(pages).toContain(`procedures/${changedSlug}/`);
    expect(pages).toContain('./');
    // No other procedure page changed: pages carry no build-wide counter or date.
    expect(pages.filter((u) => u.startsWith('procedures/') && !u.startsWith(`procedures/${changedSlug}/`))).toEqual([]);
    // Pagefind: the changed page's fragment (no other page's), the entry and meta files, and index chunks. The
    // index stores word positions, so words added near the top of a page change every chunk holding a later word
    // of that page: measured, not assumed small.
    const chunks = listB.files.filter((f) => f.url.startsWith('pagefind/index/'));
    const changedChunks = index.filter((u) => u.startsWith('pagefind/index/')).length;
    const indexBytes = chunks.reduce((n, f) => n + f.bytes, 0);
    console.log(`update ${cost.fetched} files, ${cost.fetchedBytes} bytes: ${pages.length} pages, ${index.length} search files `
      + `(${changedChunks} of ${chunks.length} index chunks, index ${indexBytes} bytes); ${cost.removed} removed`);
    expect(index.filter((u) => u.startsWith('pagefind/fragment/'))).toHaveLength(1);
    for (const url of index) expect(url).toMatch(/^pagefind\/(fragment\/|index\/|pagefind-entry\.json$|pagefind\.[\w-]+\.pf_meta$)/);
    expect(cost.fetched).toBeLessThan(listB.files.length / 20);
  });

  it('lists a tag every procedure uses in parts, and the update takes the one part of each tag that lists the change', async () => {
    // Every generated procedure uses the same tags: each tag's list is cut in parts, the first being the tag's page.
    const partCount = Math.ceil(procedureCount / proceduresPerTagPart);
    const parts = listB.files.map((f) => /^tags\/([^/]+)\/(\d+)\/$/.exec(f.url)).filter((m) => m !== null);
    expect(parts.length).toBeGreaterThan(0);
    for (const [, , number] of parts) expect(Number(number)).toBeLessThanOrEqual(partCount);
    const changedTags = cost.urls.filter((u) => u.startsWith('tags/'));
    expect(changedTags.length).toBeGreaterThan(0);
    const slugs = changedTags.map((u) => /^tags\/([^/]+)\/(?:\d+\/)?$/.exec(u)?.[1]);
    expect(slugs).not.toContain(undefined);
    // One part per tag, and it is the part that lists the changed procedure with its new title.
    expect(new Set(slugs).size).toBe(changedTags.length);
    for (const url of changedTags) {
      const html = await readFile(join(built.b, url, 'index.html'), 'utf8');
      expect(html).toContain(`data-procedure="${changedId}"`);
      expect(html).toContain(`${changedTitle}, second edition`);
    }
  });

  it('shows a part with links to every part of the list, the one shown marked, and no serious accessibility finding', async () => {
    const partCount = Math.ceil(procedureCount / proceduresPerTagPart);
    const site = await serveSite(built.b);
    // No offline copy here: the tablet tests below save one.
    const context = await browser.newContext({ serviceWorkers: 'block' });
    const page = await context.newPage();
    try {
      const slug = /^tags\/([^/]+)\//.exec(cost.urls.find((u) => u.startsWith('tags/'))!)![1];
      await page.goto(`${site.url}/tags/${slug}/2/`);
      await expect.poll(() => page.locator('h1').textContent()).toMatch(new RegExp(`where used, part 2 of ${partCount}$`));
      const nav = page.locator('nav.list-parts');
      await expect.poll(() => nav.locator('li').count()).toBe(partCount);
      await expect.poll(() => nav.locator('[aria-current="page"]').textContent()).toBe(`${proceduresPerTagPart + 1}–${2 * proceduresPerTagPart}`);
      expect(await page.locator('ul.where-used > li').evaluateAll((items) => items.map((li) => li.getAttribute('data-procedure')))).toContain(`GEN-${String(proceduresPerTagPart + 1).padStart(4, '0')}`);
      expect(await seriousViolations(page)).toEqual([]);
      // The first part's link leads to the tag's own page.
      await nav.getByRole('link', { name: `Part 1, procedures 1–${proceduresPerTagPart}` }).click();
      await expect.poll(() => new URL(page.url()).pathname).toBe(`/tags/${slug}/`);
      await expect.poll(() => page.locator('h1').textContent()).toMatch(new RegExp(`where used, part 1 of ${partCount}$`));
    } finally {
      await context.close();
      await site.close();
    }
  });
});

describe('a tablet updating from the first publication to the second', () => {
  let context: BrowserContext;
  let reader: Page;
  const seen: Array<{ url: string; copy: string | null }> = [];

  it('saves the whole first publication on its first visit', async () => {
    server = await serveSite(built.a);
    context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const first = await context.newPage();
    await first.goto(`${server.url}/`);
    await waitForCopy(first, listA.version);
    // Every distinct content once.
    expect(server.saved.length).toBe(new Set(listA.files.map((f) => f.hash)).size);
    await expect.poll(() => first.locator('[data-offline-status]').textContent(), { timeout: 10_000 }).toMatch(/^Offline copy: manual of 2026-12-01, saved/);
    await first.close();
  });

  it('fetches only the changed files, once each, and switches in one step', async () => {
    // A reader has the search screen open, shown from the first publication's copy.
    reader = await context.newPage();
    reader.on('response', (r) => { if (r.url().startsWith(server.url)) seen.push({ url: r.url(), copy: r.headers()['x-offline-copy'] ?? null }); });
    await reader.goto(`${server.url}/search/`);
    expect((await status(reader))?.page).toBe(listA.version);
    expect(await searchTitles(reader, changedId)).toEqual([expect.stringContaining(changedTitle)]);

    server.serve(built.b);
    server.saved.length = 0;
    const other = await context.newPage();
    await other.goto(`${server.url}/rules/`);
    await waitForCopy(other, listB.version);
    const expected = cost.urls.map((u) => `/${u === './' ? '' : u}`).sort();
    expect([...server.saved].sort()).toEqual(expected);
    await other.close();
  });

  it('never shows the old page with the new index: the open page keeps reading the copy it came from', async () => {
    // Searching again on the page that is still open: the old index, the old title, nothing of the new text.
    expect(await searchTitles(reader, changedId)).toEqual([expect.not.stringContaining('second edition')]);
    await reader.locator('#search-status').evaluate((el) => { el.textContent = ''; });
    await reader.locator('#search-input').fill('second edition');
    await reader.locator('#search-form button[type="submit"]').click();
    await expect.poll(() => reader.locator('#search-status').textContent(), { timeout: 20_000 }).toMatch(/^0 procedures found/);
    // It says a newer manual is saved.
    await expect.poll(() => reader.locator('[data-offline-stale]').textContent(), { timeout: 20_000 }).toMatch(/newer manual has been saved/);
    const fromCopy = seen.filter((s) => s.copy !== null);
    expect(fromCopy.length).toBeGreaterThan(3);
    expect(new Set(fromCopy.map((s) => s.copy))).toEqual(new Set([listA.version]));

    // Reloaded, it is the new manual throughout: page, index and fragments.
    seen.length = 0;
    await reader.reload();
    expect(await searchTitles(reader, 'second edition')).toEqual([expect.stringContaining('second edition')]);
    expect(new Set(seen.filter((s) => s.copy !== null).map((s) => s.copy))).toEqual(new Set([listB.version]));
    await context.close();
  });
});

/** A tablet holding the whole second publication, left by the update test for the one after it. */
let holdingWhole: { context: BrowserContext; page: Page } | undefined;

describe('a tablet whose network drops halfway through an update', () => {
  it('keeps its complete old copy, then finishes the update where it stopped', async () => {
    server.serve(built.a);
    server.dropAfter = null;
    server.down = false;
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    await page.goto(`${server.url}/`);
    await waitForCopy(page, listA.version);

    // The second publication appears; the network is cut after a third of its files.
    server.serve(built.b);
    server.saved.length = 0;
    const cutAfter = Math.max(1, Math.floor(cost.fetched / 3));
    server.dropAfter = cutAfter;
    await page.reload().catch(() => undefined);
    await expect.poll(async () => (await status(page))?.download?.failed ?? null, { timeout: 60_000 }).not.toBeNull();
    const before = [...server.saved];
    expect(before).toHaveLength(cutAfter);
    const s = (await status(page))!;
    expect(s.copy?.version).toBe(listA.version);
    expect(s.download?.done).toBeGreaterThanOrEqual(1);
    expect(s.download?.done).toBeLessThan(s.download!.files);

    // Without a network the tablet reads its whole old copy: the changed procedure as it was, and search.
    await page.goto(`${server.url}/procedures/${changedSlug}/`);
    await expect(page.locator('h1').textContent()).resolves.toContain(changedId);
    await expect(page.locator('body').textContent()).resolves.not.toContain('second edition');
    expect((await status(page))?.page).toBe(listA.version);
    await page.goto(`${server.url}/search/`);
    expect(await searchTitles(page, changedId)).toEqual([expect.stringContaining(changedTitle)]);
    await expect.poll(() => page.locator('[data-offline-status]').textContent(), { timeout: 10_000 }).toMatch(/Update stopped at \d+ of \d+ files/);
    // The offline-copy page says what stopped downloading, and when it last tried to check.
    await page.goto(`${server.url}/offline/`);
    await expect.poll(() => page.locator('[data-offline-details]').textContent(), { timeout: 10_000 })
      .toMatch(/Download stopped at \d+ of [\d,]+ files? \([^)]*\); it goes on at the next check with a network\./);
    await expect(page.locator('[data-offline-details]').textContent()).resolves.toMatch(/(Last checked|Last tried to check) for a newer manual \d{4}-/);

    // The network returns: the update goes on with the files it does not hold yet, and switches.
    server.dropAfter = null;
    server.down = false;
    await page.reload();
    await waitForCopy(page, listB.version);
    const after = server.saved.slice(before.length);
    const expected = cost.urls.map((u) => `/${u === './' ? '' : u}`).sort();
    // Files saved before the cut are not fetched again; together the two parts are exactly the update.
    expect(after.filter((p) => before.includes(p))).toEqual([]);
    expect([...new Set([...before, ...after])].sort()).toEqual(expected);
    await page.goto(`${server.url}/procedures/${changedSlug}/`);
    await expect(page.locator('body').textContent()).resolves.toContain('second edition');
    // This tablet now holds the whole second publication: the next test goes on with it instead of saving it again.
    holdingWhole = { context, page };
  });
});

describe('a tablet that keeps chosen areas', () => {
  it('keeps its areas and every emergency procedure, keeps pages once opened, and remembers the choice', async () => {
    server ??= await serveSite(built.b);
    server.serve(built.b);
    // The tablet of the test above when it ran (it holds the whole second publication), turned upright; else a new
    // one, which saves the whole second publication first.
    const { context, page } = holdingWhole ?? await (async () => {
      const fresh = await browser.newContext({ viewport: { width: 800, height: 1280 } });
      return { context: fresh, page: await fresh.newPage() };
    })();
    holdingWhole = undefined;
    await page.setViewportSize({ width: 800, height: 1280 });
    await page.goto(`${server.url}/offline/`);
    await waitForCopy(page, listB.version);
    const whole = (await status(page))!.copy!.keptFiles;
    expect(whole).toBe(listB.files.length);
    await expect.poll(() => page.locator('[data-offline-details]').textContent(), { timeout: 10_000 }).toMatch(/keeps the whole manual/);
    // In plain words: which publication it holds, when it last checked, and that nothing is downloading.
    const details = (await page.locator('[data-offline-details]').textContent())!;
    expect(details).toMatch(/This tablet holds the manual published \d{4}-\d\d-\d\d( \d\d:\d\d)? \(version [^)]+\), saved \d{4}-\d\d-\d\d \d\d:\d\d\./);
    expect(details).toMatch(/Last checked for a newer manual \d{4}-\d\d-\d\d \d\d:\d\d\./);
    expect(details).toContain('Nothing is downloading.');

    // The choice is made on the tablet: one area (areas are named as the manual shows them).
    const chosen = listB.areas[0].area;
    await page.locator(`input[name="offline-area"][value="${chosen}"]`).check();
    await page.locator('input[name="offline-mode"][value="areas"]').check();
    await page.getByRole('button', { name: 'Keep this choice' }).click();
    await expect.poll(async () => (await status(page))?.choice, { timeout: 20_000 }).toEqual({ mode: 'areas', areas: [chosen] });
    await expect.poll(async () => (await status(page))?.copy?.keptFiles, { timeout: 30_000 }).toBeLessThan(whole / 2);
    // Files outside the choice are deleted from the tablet.
    await expect.poll(() => page.evaluate(async () => {
      const names = await caches.keys();
      const files = await caches.open(names.find((n) => n.startsWith('stepwright-offline-files'))!);
      return (await files.keys()).length;
    }), { timeout: 30_000 }).toBeLessThan(whole / 2);

    // It survives a reload.
    await page.reload();
    await expect.poll(() => page.locator(`input[name="offline-area"][value="${chosen}"]`).isChecked(), { timeout: 10_000 }).toBe(true);
    await expect(page.locator('input[name="offline-mode"][value="areas"]').isChecked()).resolves.toBe(true);

    // Pages by area from the list: east is kept, an emergency procedure of another area is kept, a batch procedure
    // of another area is not.
    const procedurePages = listB.files.filter((f) => /^procedures\/[^/]+\/$/.test(f.url));
    const east = procedurePages.find((f) => f.area === chosen && !f.always)!.url;
    const otherEmergency = procedurePages.find((f) => f.area !== chosen && f.always)!.url;
    const [westBatch, westOther] = procedurePages.filter((f) => f.area !== chosen && !f.always).map((f) => f.url);
    // Opened once with a network: kept from then on.
    await page.goto(`${server.url}/${westOther}`);
    await expect.poll(async () => {
      const s = await page.evaluate(async () => (await (await fetch('/__offline/status.json')).json()).opened);
      return s;
    }, { timeout: 20_000 }).toBe(1);

    server.down = true;
    for (const url of [east, otherEmergency, westOther]) {
      await page.goto(`${server.url}/${url}`);
      await expect(page.locator('h1').textContent()).resolves.toMatch(/^GEN-\d{4}/);
    }
    await page.goto(`${server.url}/${westBatch}`);
    await expect(page.locator('h1').textContent()).resolves.toBe('Not in the offline copy');
    // Search offline finds what the tablet holds, and says what it cannot show.
    await page.goto(`${server.url}/search/`);
    const titles = await searchTitles(page, 'Generated batch procedure');
    expect(titles.length).toBeGreaterThan(0);
    await expect(page.locator('#search-status').textContent()).resolves.toMatch(/more match(es)? in pages this tablet has not saved/);
    server.down = false;
    await context.close();
  });
});
