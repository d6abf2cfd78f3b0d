// The operator manual in real headless Chromium: find a procedure by tag, safety before the chart,
// chart nodes and bars match the model, step links land on their rows, no serious accessibility faults.
import { existsSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Server } from 'node:http';
import { chromiumPath, launchBrowser } from './chromium.ts';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { loadManual } from '../../src/site-data/manual.ts';
import { startStaticServer } from '../../src/cli/serve-command.ts';
import { compileStepGraph, type StepGraph } from '../../src/analysis/step-graph.ts';
import type { ProcedureView } from '../../src/render/manual.ts';
import { seriousViolations } from './accessibility-scan.ts';
import { ensureBuiltSite } from './site-build.ts';

// A browser on a busy 2-core machine: give each test room; the build itself is shared and runs once.
vi.setConfig({ testTimeout: 120_000, hookTimeout: 400_000 });

const haveChromium = existsSync(chromiumPath);
if (!haveChromium) console.warn(`Skipping the browser tests: ${chromiumPath} is missing. Install it with: apt-get install -y chromium`);

const artifacts = join(process.cwd(), 'test-artifacts');
const manual = await loadManual({ cwd: process.cwd(), env: { ...process.env, STEPWRIGHT_PROCEDURES: 'procedures' } });
const view = manual.view!;
const procedures = new Map(manual.result.files.filter((f) => f.procedure).map((f) => [f.procedure!.id, f.procedure!]));

/** Transitions drawn as bars: each step's end, each decision branch, and a join that leads to a step. */
function drawnTransitions(graph: StepGraph): number {
  const stepPlaces = new Set(graph.places.filter((p) => p.kind === 'step').map((p) => p.id));
  return graph.transitions.filter((t) => t.fromStep !== undefined || t.guard.length > 0 || (t.kind === 'join' && t.to.every((to) => stepPlaces.has(to)))).length;
}

describe.skipIf(!haveChromium)('operator manual in Chromium', () => {
  let browser: Browser;
  let context: BrowserContext;
  let server: Server;
  let base: string;

  beforeAll(async () => {
    const { dir } = await ensureBuiltSite();
    const started = await startStaticServer(dir, 0, '127.0.0.1');
    server = started.server;
    base = started.url.replace(/\/$/, '');
    mkdirSync(artifacts, { recursive: true });
    browser = await launchBrowser();
    // Search, charts and banners, read from the server: the offline copy is tested on its own (floor-offline).
    context = await browser.newContext({ viewport: { width: 1280, height: 800 }, serviceWorkers: 'block' });
  });

  afterAll(async () => {
    await browser?.close();
    await new Promise((done) => (server ? server.close(done) : done(null)));
  });

  // One page, taken from page to page as a reader does: a new page started a renderer process for each test.
  let reader: Page | undefined;
  const open = async (path: string): Promise<Page> => {
    const page = reader ??= await context.newPage();
    const response = await page.goto(`${base}${path}`);
    expect(response?.status(), path).toBe(200);
    return page;
  };

  const expectNoSeriousViolations = async (page: Page, name: string) => {
    expect((await seriousViolations(page)).map((v) => `${name}: ${v}`)).toEqual([]);
  };

  it('finds a procedure from the home page by searching an equipment tag', async () => {
    // A tag that only one current procedure lists as equipment, so the search has one right answer.
    const tag = view.tags.find((t) => t.roles.includes('equipment') && t.uses.filter((u) => u.role === 'equipment' && u.procedure.current).length === 1)!;
    const target = tag.uses.find((u) => u.role === 'equipment')!.procedure;
    const page = await open('/');
    expect(await page.locator('h1').innerText()).toBe('Procedures');
    expect(await page.locator('.proc-item').count()).toBe(view.procedures.length);
    // What the live preview shows during `npm run dev` never reaches the published manual.
    expect(await page.getByText('live preview').count()).toBe(0);
    await page.screenshot({ path: join(artifacts, 'manual-home.png'), fullPage: true });
    await page.locator('.site-nav a[href="/search/"]').click();
    await page.waitForURL(`${base}/search/`);
    await page.fill('#search-input', tag.tag);
    const result = page.locator('.search-result a', { hasText: target.id });
    await result.first().waitFor({ timeout: 15_000 });
    await page.screenshot({ path: join(artifacts, 'manual-search.png'), fullPage: true });
    await result.first().click();
    await page.waitForURL(`${base}${target.url}`);
    expect(await page.locator('h1').innerText()).toContain(target.id);
  });

  it('leaves superseded procedures out of search results unless asked', async () => {
    const old = view.procedures.find((p) => !p.current)!;
    const page = await open(`/search/?q=${encodeURIComponent(old.id)}`);
    await page.locator('#search-status').filter({ hasText: 'found' }).waitFor({ timeout: 15_000 });
    const resultIds = () => page.locator('.search-result a .tag').allInnerTexts();
    expect(await resultIds()).not.toContain(old.id);
    await page.check('#search-all');
    const mine = page.locator('.search-result').filter({ has: page.locator('a .tag', { hasText: old.id }) });
    await mine.first().waitFor({ timeout: 15_000 });
    const text = await mine.first().innerText();
    expect(text).toContain(old.status);
    expect(text).toMatch(/revision \d+/);
    await expectNoSeriousViolations(page, 'search');
  }, 240_000);

  it('shows the hazards above the chart, DANGER before WARNING', async () => {
    const p = view.procedures.find((x) => x.hazards.some((h) => h.level === 'danger') && x.hazards.some((h) => h.level === 'warning'))!;
    const page = await open(p.url);
    const levels = await page.locator('#before-you-start .hazard').evaluateAll((els) => els.map((e) => e.getAttribute('data-level')));
    expect(levels).toEqual(p.hazards.map((h) => h.level));
    expect(levels.indexOf('danger')).toBeLessThan(levels.indexOf('warning'));
    const hazardsBox = await page.locator('#before-you-start').boundingBox();
    const chartBox = await page.locator('#sequence .chart-scroll > svg').boundingBox();
    expect(hazardsBox!.y + hazardsBox!.height).toBeLessThanOrEqual(chartBox!.y);
    for (const word of ['DANGER', 'WARNING']) await expect(page.locator('#before-you-start .signal-word', { hasText: word }).first().isVisible()).resolves.toBe(true);
    await page.screenshot({ path: join(artifacts, `manual-${p.slug}.png`), fullPage: true });
  });

  it('draws one chart node per step and one bar per transition on every procedure page', async () => {
    const page = reader ??= await context.newPage();
    for (const p of view.procedures) {
      await page.goto(`${base}${p.url}`);
      // The procedure's own page shows the revision in force; the file's newer text has its own page.
      if ((await page.locator('article').getAttribute('data-revision')) !== String(p.revision)) await page.goto(`${base}${p.url}next/`);
      const graph = compileStepGraph(procedures.get(p.id)!);
      const stepIds = graph.places.filter((x) => x.kind === 'step').map((x) => x.step!.id);
      const nodes = await page.locator('#sequence .chart-scroll a.sfc-step').evaluateAll((els) => els.map((e) => e.getAttribute('data-step')));
      expect(nodes.sort(), p.id).toEqual([...stepIds].sort());
      expect(await page.locator('#sequence .chart-scroll .sfc-bar').count(), p.id).toBe(drawnTransitions(graph));
      // Every step link has a row to land on.
      const missing = await page.locator('#sequence .chart-scroll a.sfc-step').evaluateAll((els) => els.map((e) => e.getAttribute('href')!).filter((h) => !document.querySelector(`tr${h}`)));
      expect(missing, p.id).toEqual([]);
    }
  }, 240_000);

  it('lands every step link of the chart on its table row', async () => {
    const p: ProcedureView = view.procedures.reduce((a, b) => (b.stepCount > a.stepCount ? b : a));
    const page = await open(p.url);
    const ids = await page.locator('#sequence .chart-scroll a.sfc-step').evaluateAll((els) => els.map((e) => e.getAttribute('data-step')!));
    expect(ids.length).toBe(p.stepCount);
    for (const id of ids) {
      await page.locator(`#sequence .chart-scroll a.sfc-step[data-step="${id}"]`).click();
      await page.waitForFunction((want) => location.hash === `#step-${want}`, id);
      const row = page.locator(`tr#step-${id}`);
      expect(await row.evaluate((el) => el.matches(':target'))).toBe(true);
      const box = await row.boundingBox();
      const viewport = page.viewportSize()!;
      expect(box!.y).toBeGreaterThanOrEqual(-1);
      expect(box!.y).toBeLessThan(viewport.height);
    }
  });

  const axePages = (): Array<[string, string]> => {
    const withDanger = view.procedures.find((x) => x.hazards.some((h) => h.level === 'danger'))!;
    const stopped = view.procedures.find((x) => x.banner)!;
    const tag = view.tags.find((t) => t.roles.includes('interlock'))!;
    // The home page and the tag index are scanned in both themes at this size by floor-tablet.test.ts.
    return [['procedure', withDanger.url], ['procedure with a status banner', stopped.url], ['where-used', tag.url]];
  };
  it.each(axePages())('has no serious or critical accessibility violations: %s page', async (name, path) => {
    const page = await open(path);
    await expectNoSeriousViolations(page, name);
    if (name === 'where-used') {
      expect(await page.locator('.where-used li a').count()).toBeGreaterThan(0);
      await page.screenshot({ path: join(artifacts, 'manual-where-used.png'), fullPage: true });
    }
  }, 240_000);

  it('shows draft, in-review and superseded procedures with an unmistakable banner', async () => {
    for (const p of view.procedures.filter((x) => ['draft', 'in-review', 'superseded', 'retired'].includes(x.status))) {
      const page = await open(p.url);
      const banner = page.locator('[data-status-banner]');
      expect(await banner.count(), p.id).toBe(1);
      expect((await banner.innerText()).toUpperCase()).toContain(p.status.replace('-', ' ').toUpperCase());
      // The banner comes before everything else in the procedure.
      const bannerBox = await banner.boundingBox();
      const h1Box = await page.locator('h1').boundingBox();
      expect(bannerBox!.y).toBeLessThan(h1Box!.y);
    }
  });

  it('says of a procedure superseded by another document only what the manual knows', async () => {
    const cip = view.procedures.find((x) => x.id === 'U2-T230-CIP-001')!;
    expect(cip.status).toBe('superseded');
    const page = await open(cip.url);
    const text = await page.locator('[data-status-banner]').innerText();
    expect(text).toContain('This procedure is superseded and must not be used.');
    expect(text).not.toMatch(/newer revision|current revision/i);
    expect(text).toContain('ask the procedure owner (Unit 2 Operations, Blending)');
  });
});
