// Offline: after one visit the whole manual works with the network gone, and a newer published manual is flagged.
import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { launchChromium, builtSite, serveSite, type SiteServer } from './floor-fixture.ts';

let site: string;
let browser: Browser;
let server: SiteServer;
let context: BrowserContext;
let page: Page;
let manifest: { version: string; builtAt: string; files: number };
let list: { version: string; files: Array<{ hash: string }> };

// Browser steps against a full manual: slower than the unit tests' default when other suites share the machine.
vi.setConfig({ testTimeout: 120_000 });

beforeAll(async () => {
  site = await builtSite();
  manifest = JSON.parse(await readFile(join(site, 'offline-manifest.json'), 'utf8'));
  list = JSON.parse(await readFile(join(site, 'offline-files.json'), 'utf8'));
  server = await serveSite(site);
  browser = await launchChromium();
});
afterAll(async () => { await browser?.close(); await server?.close(); });

async function procedureHref(p: Page, id: string): Promise<string> {
  const href = await p.locator(`a[href*="${id.toLowerCase()}"]`).first().getAttribute('href');
  return new URL(href!, p.url()).href;
}

/** Searches with the manual's own search page, as an operator would. */
async function search(p: Page, term: string): Promise<string[]> {
  await p.goto(new URL('/search/', p.url()).href);
  await p.locator('#search-input').fill(term);
  const links = p.locator('#search-results a');
  await expect.poll(() => links.count(), { timeout: 10_000 }).toBeGreaterThan(0);
  return (await links.evaluateAll((as) => as.map((a) => (a as HTMLAnchorElement).href)));
}

describe('offline copy', () => {
  it('is saved on the first visit and the page says when', async () => {
    context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    page = await context.newPage();
    await page.goto(server.url + '/');
    await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
    await page.waitForFunction(() => navigator.serviceWorker.controller !== null, undefined, { timeout: 30_000 });
    const status = page.locator('[data-offline-status]');
    await expect.poll(() => status.textContent(), { timeout: 60_000 }).toMatch(/^Offline copy: manual of \d{4}-\d\d-\d\d, saved \d{4}-\d\d-\d\d \d\d:\d\d\./);
    const cached = await page.evaluate(async () => {
      const name = (await caches.keys()).find((n) => n.startsWith('stepwright-offline-files'))!;
      return (await (await caches.open(name)).keys()).length;
    });
    // Every built file, stored once per distinct content.
    expect(cached).toBe(new Set(list.files.map((f) => f.hash)).size);
    expect(manifest.files).toBe(list.files.length);
  });

  it('serves pages, search and another procedure with the network gone', async () => {
    const batch = await procedureHref(page, 'U2-K210-BATCH-001');
    await server.close(); // not only "offline" in the browser: the server is really gone
    await context.setOffline(true);
    await page.goto(batch);
    await expect(page.locator('h1').textContent()).resolves.toContain('U2-K210-BATCH-001');
    await expect(page.locator('tr[data-step]').count()).resolves.toBeGreaterThan(5);
    await page.reload();
    await expect(page.locator('h1').textContent()).resolves.toContain('U2-K210-BATCH-001');
    const urls = await search(page, 'H-220');
    expect(urls.length).toBeGreaterThan(0);
    const other = urls.find((u) => !u.includes('u2-k210-batch-001') && u.includes('/procedures/'))!;
    expect(other).toBeDefined();
    await page.locator(`#search-results a[href="${new URL(other).pathname}"]`).first().click();
    await page.waitForURL(other);
    await expect(page.locator('h1').count()).resolves.toBe(1);
    await expect(page.locator('body').textContent()).resolves.toMatch(/H-220/);
    // A page outside the manual answers with a plain explanation instead of the browser's error page.
    await page.goto(new URL('/no-such-page/', page.url()).href);
    await expect(page.locator('h1').textContent()).resolves.toBe('Not in the offline copy');
  });

  it('warns when the published manual it last saw is newer, and updates when it can reach it', async () => {
    // The server is back on its port (the same origin, so the tablet keeps the copy it saved) and so is the network.
    server = await serveSite(site, Number(new URL(server.url).port));
    await context.setOffline(false);
    await page.goto(server.url + '/');
    await page.waitForFunction(() => navigator.serviceWorker.controller !== null, undefined, { timeout: 30_000 });
    await expect.poll(() => page.locator('[data-offline-status]').textContent(), { timeout: 60_000 }).toMatch(/^Offline copy: manual of/);
    const stale = page.locator('[data-offline-stale]');
    await expect(stale.isVisible()).resolves.toBe(false);

    // A newer manual is published: the server's manifest now names another version.
    // Same build date on purpose: two publications on one day must still be told apart by their version.
    const newer = { ...manifest, version: 'f00dfeedf00dfeed' };
    server.override.set('/offline-manifest.json', JSON.stringify(newer));
    await page.reload();
    await expect.poll(() => stale.isVisible(), { timeout: 30_000 }).toBe(true);
    await expect(stale.textContent()).resolves.toMatch(/older than the published manual/);

    // Offline, the warning stays: the tablet remembers the newer manual it saw.
    await context.setOffline(true);
    await page.reload();
    await expect.poll(() => stale.isVisible(), { timeout: 30_000 }).toBe(true);

    // Back on the network with the newer file list published (the same files: nothing to download), the copy
    // switches to it and the warning goes away.
    server.override.set('/offline-files.json', JSON.stringify({ ...list, version: newer.version }));
    await context.setOffline(false);
    await page.reload();
    await expect.poll(() => page.locator('[data-offline-status]').getAttribute('data-offline-version'), { timeout: 30_000 }).toBe(newer.version);
    // This page came from the server (a newer manual was known): it is current, so no warning.
    await expect.poll(() => stale.isVisible(), { timeout: 10_000 }).toBe(false);
    await page.reload();
    await expect.poll(() => page.locator('[data-offline-status]').getAttribute('data-offline-version'), { timeout: 10_000 }).toBe(newer.version);
    await expect.poll(() => stale.isVisible(), { timeout: 10_000 }).toBe(false);
  });
});
