// Placekeeping on a tablet: step by step through a parallel block and a decision, surviving a reload.
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchChromium, builtSite, serveSite, type SiteServer } from './floor-fixture.ts';

let site: string;
let browser: Browser;
let server: SiteServer;
let page: Page;
const id = 'U2-K210-BATCH-001';

// Browser steps against a full manual: slower than the unit tests' default when other suites share the machine.
vi.setConfig({ testTimeout: 120_000 });

beforeAll(async () => {
  site = await builtSite();
  server = await serveSite(site);
  browser = await launchChromium();
  // Placekeeping keeps its place in the page's own storage: no service worker saving the manual in the background.
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, hasTouch: true, serviceWorkers: 'block' });
  page = await context.newPage();
  await page.goto(server.url + '/');
  const href = await page.locator(`a[href*="${id.toLowerCase()}"]`).first().getAttribute('href');
  await page.goto(new URL(href!, server.url).href);
});
afterAll(async () => { await browser?.close(); await server?.close(); });

const cardTitle = (p: Page) => p.locator('.pk-card-title').textContent();
const next = (p: Page) => p.locator('.pk-dock .pk-next').first();

describe('placekeeping on the batch procedure', () => {
  it('is off until asked for, and says plainly it is not a record of execution', async () => {
    await expect(page.locator('.pk-start').isVisible()).resolves.toBe(true);
    await expect(page.locator('.pk-disclaimer').textContent()).resolves.toMatch(/not a record of execution/);
    await expect(page.locator('.pk-dock').isVisible()).resolves.toBe(false);
  });

  it('walks one step at a time with large next and back', async () => {
    await page.locator('.pk-start').click();
    await expect(cardTitle(page)).resolves.toBe('Step 1');
    const box = await next(page).boundingBox();
    expect(box!.height).toBeGreaterThanOrEqual(56);
    await next(page).click();
    await expect(cardTitle(page)).resolves.toBe('Step 2');
    await page.locator('.pk-back').click();
    await expect(cardTitle(page)).resolves.toBe('Step 1');
    await next(page).click();
    await next(page).click();
    // Step 3 is the parallel block (agitator; dust-control): each branch keeps its own place.
    const branches = page.locator('.pk-branches button');
    await expect(branches.count()).resolves.toBe(2);
    await expect(branches.first().textContent()).resolves.toMatch(/^Branch 3A \(agitator\): step 3A\.1$/);
  });

  it('keeps the hazards of the current step in view', async () => {
    await expect(cardTitle(page)).resolves.toBe('Step 3A.1');
    const dockHazard = page.locator('.pk-dock .pk-hazard').first();
    await expect(dockHazard.textContent()).resolves.toMatch(/^(WARNING|CAUTION|DANGER|NOTICE)\s*Agitator M-210 running with the impeller uncovered/);
    await page.mouse.wheel(0, 3000);
    await expect(dockHazard.isVisible()).resolves.toBe(true);
    const box = await dockHazard.boundingBox();
    expect(box!.y).toBeGreaterThanOrEqual(0);
    expect(box!.y + box!.height).toBeLessThanOrEqual(800);
  });

  it('tracks parallel branches separately and survives a reload', async () => {
    await page.locator('.pk-branches button', { hasText: 'Branch 3B' }).click();
    await expect(cardTitle(page)).resolves.toBe('Step 3B.1');
    await next(page).click();
    await expect(cardTitle(page)).resolves.toBe('Step 3B.2');
    await page.reload();
    await expect(cardTitle(page)).resolves.toBe('Step 3B.2');
    const labels = await page.locator('.pk-branches button').allTextContents();
    expect(labels).toEqual(['Branch 3A (agitator): step 3A.1', 'Branch 3B (dust-control): step 3B.2']);
    await expect(page.locator('.pk-progress').textContent()).resolves.toMatch(/^3 of \d+ steps marked/);
  });

  it('joins after every branch ends and lets the operator pick a decision branch', async () => {
    await next(page).click(); // 3B.2 done: branch B waits
    for (const branch of ['Branch 3A']) {
      await page.locator('.pk-branches button', { hasText: branch }).click();
      await next(page).click();
    }
    await expect(page.locator('.pk-branches').isVisible()).resolves.toBe(false);
    // Walk on to the first decision: it offers one button per branch.
    for (let i = 0; i < 20 && (await page.locator('.pk-decision').count()) === 0; i++) await next(page).click();
    const options = page.locator('.pk-decision button');
    await expect(options.count()).resolves.toBeGreaterThanOrEqual(2);
    const before = await cardTitle(page);
    const loop = options.filter({ hasText: /go to step/ }).last();
    const target = (await loop.textContent())!.match(/go to step (\S+)$/)![1];
    await loop.click();
    await expect(cardTitle(page)).resolves.toBe(`Step ${target}`);
    expect(before).not.toBe(`Step ${target}`);
  });

  it('marks the current row in the full table, with words and not colour alone', async () => {
    await page.locator('.pk-modes button', { hasText: 'Full table' }).click();
    const current = page.locator('tr[aria-current="step"]');
    await expect(current.count()).resolves.toBe(1);
    await expect(current.locator('.pk-badge').textContent()).resolves.toBe('Current step');
    await expect(page.locator('tr.pk-done .pk-badge').first().textContent()).resolves.toMatch(/^Marked/);
    await expect(page.locator('[data-pk-table]').isVisible()).resolves.toBe(true);
  });

  it('can be reset', async () => {
    page.once('dialog', (d) => void d.accept());
    await page.locator('.pk-reset').click();
    await expect(page.locator('.pk-start').isVisible()).resolves.toBe(true);
    await expect(page.locator('tr[aria-current="step"]').count()).resolves.toBe(0);
    await page.reload();
    await expect(page.locator('.pk-start').isVisible()).resolves.toBe(true);
    const stored = await page.evaluate((key) => localStorage.getItem(key), `stepwright:placekeeping:${id}:rev6`);
    expect(stored).toBeNull();
  });
});
