// Operator pages measured in Chromium: the revision in force (fixture repository with an in-force revision 4 and
// an in-review revision 5), emergencies first, 800 px tablet fit, whole tags and dates, 44 px targets, dark
// charts, print (page count, blank pages, "continued" marks, light header), search excerpts, area names, safety
// alert symbols, chart and table numbering, redline with context. Screenshots go to test-artifacts/.
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { existsSync, mkdtempSync, rmSync, symlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { PDFParse } from 'pdf-parse';
import { artifactsDir, builtSite, launchChromium, serveSite, type SiteServer } from './floor-fixture.ts';
import { PagePool } from './page-pool.ts';
import { ada, bram, createTempRepo, procedureText, type TempRepo } from '../history/temp-repo.ts';

vi.setConfig({ testTimeout: 240_000, hookTimeout: 600_000 });

const tablet = { width: 800, height: 1280 };
const desk = { width: 1280, height: 900 };

let browser: Browser;
let demo: SiteServer;
let fixture: SiteServer;
let repo: TempRepo;
let fixtureOut: string;
const pool = new PagePool(() => browser);

/** Sixteen steps; revision 5 changes step 8 only, so the redline has one changed step in sixteen. */
function longSteps(changed: boolean): string[] {
  return Array.from({ length: 16 }, (_, i) => [
    `  - step: s${i + 1}`,
    `    do: ${changed && i === 7 ? 'Open' : 'Check'} valve XV-21${String(i + 1).padStart(2, '0')} on kettle K-210`,
    i === 3 ? '    until: TI-210 >= 205 degC' : '    confirm: Done',
  ]).flat();
}

const hazards = [
  '  - level: warning',
  '    hazard: Resin at up to 245 degC in K-210',
  '    consequence: Severe burns',
  '    avoid: Wear a face shield and heat-resistant gauntlets',
  '    at: [s4]',
];

function buildFixtureRepo(): TempRepo {
  const r = createTempRepo();
  const signatures = [{ role: 'Process engineer', name: 'Ada Ferrand', date: '2026-03-01' }, { role: 'Operations superintendent', name: 'Bram Okonjo', date: '2026-03-03' }];
  r.write('procedures/k-210-resin/u2-test-001.md', procedureText({ revision: 4, status: 'draft', steps: longSteps(false), hazards, change: 'Valve checks listed one by one.' }));
  r.commit('Draft U2-TEST-001 rev 4', ada, '2026-02-20');
  r.write('procedures/k-210-resin/u2-test-001.md', procedureText({ revision: 4, status: 'effective', effective: '2026-03-05', approvals: signatures, steps: longSteps(false), hazards, change: 'Valve checks listed one by one.' }));
  r.commit('U2-TEST-001 rev 4 effective', bram, '2026-03-05');
  r.write('procedures/k-210-resin/u2-test-001.md', procedureText({ revision: 5, status: 'in-review', steps: longSteps(true), hazards, change: 'Step 8 opens the valve instead of checking it.' }));
  r.commit('U2-TEST-001 rev 5 in review', ada, '2026-04-01');
  return r;
}

beforeAll(async () => {
  repo = buildFixtureRepo();
  // The plant's repository has the package installed: the build's server chunks resolve their imports there.
  symlinkSync(resolve('node_modules'), join(repo.dir, 'node_modules'), 'dir');
  fixtureOut = mkdtempSync(join(tmpdir(), 'stepwright-pages-fixture-'));
  const bin = resolve('bin/stepwright.mjs');
  const env: NodeJS.ProcessEnv = { ...process.env, NO_COLOR: '1' };
  for (const key of Object.keys(env)) if (/^(NODE_ENV|DEV|PROD|MODE|SSR|BASE_URL|TEST|VITEST.*)$/.test(key)) delete env[key];
  // The fixture manual builds while the shared demo build runs (or is waited for): two processes for two cores.
  const fixtureBuild = promisify(execFile)(process.execPath, [bin, 'build', '--out', join(fixtureOut, 'site')], { cwd: repo.dir, encoding: 'utf8', env, timeout: 8 * 60_000, maxBuffer: 64 * 1024 * 1024 })
    .catch((error: { code?: number; stdout?: string; stderr?: string }) => {
      throw new Error(`The fixture manual did not build (exit ${error.code}):\n${error.stdout}\n${error.stderr}`);
    });
  const [demoDir] = await Promise.all([builtSite(), fixtureBuild]);
  demo = await serveSite(demoDir);
  fixture = await serveSite(join(fixtureOut, 'site'));
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
  await demo?.close();
  await fixture?.close();
  repo?.remove();
  if (fixtureOut && existsSync(fixtureOut)) rmSync(fixtureOut, { recursive: true, force: true });
});

async function open(server: SiteServer, path: string, viewport = desk, colorScheme: 'light' | 'dark' = 'light'): Promise<Page> {
  const page = await pool.page({ viewport, colorScheme, serviceWorkers: 'block' });
  const response = await page.goto(`${server.url}${path}`);
  expect(response?.status(), path).toBe(200);
  return page;
}

const shot = (page: Page, name: string, fullPage = false) => page.screenshot({ path: join(artifactsDir, `pages-${name}.png`), fullPage });

/** Text of each PDF page, whitespace folded. */
async function pdfPages(pdf: Buffer): Promise<string[]> {
  const parser = new PDFParse({ data: new Uint8Array(pdf) });
  try {
    return (await parser.getText()).pages.map((p) => p.text.replace(/\s+/g, ' ').trim());
  } finally {
    await parser.destroy();
  }
}

describe('the revision in force', () => {
  it('shows revision 4 (in force) at the procedure URL, with a notice linking revision 5 on its own page', async () => {
    for (const viewport of [desk, tablet]) {
      const page = await open(fixture, '/procedures/u2-test-001/', viewport);
      expect(await page.locator('article').getAttribute('data-revision')).toBe('4');
      expect(await page.locator('article').getAttribute('data-pagefind-body')).not.toBeNull();
      expect(await page.locator('[data-status-banner]').count()).toBe(0);
      const notice = page.locator('[data-revision-notice]');
      expect(await notice.innerText()).toMatch(/Revision 4 is in force[\s\S]*Revision 5 is in review/);
      expect(await notice.locator('a').getAttribute('href')).toBe('/procedures/u2-test-001/next/');
      // The notice sits above the steps, on the first screen.
      expect((await notice.boundingBox())!.y).toBeLessThan(viewport.height);
      // The step table is revision 4's: step 8 checks the valve.
      expect(await page.locator('tr#step-s8').innerText()).toContain('Check valve XV-2108');
      await shot(page, `in-force-${viewport.width}x${viewport.height}`);
    }
  });

  it('puts revision 5 on its own page under its NOT FOR USE banner, out of search, linking back', async () => {
    for (const viewport of [desk, tablet]) {
      const page = await open(fixture, '/procedures/u2-test-001/next/', viewport);
      const article = page.locator('article');
      expect(await article.getAttribute('data-revision')).toBe('5');
      expect(await article.getAttribute('data-pagefind-ignore')).toBe('all');
      expect(await page.locator('[data-status-banner]').innerText()).toContain('IN REVIEW — NOT FOR USE');
      expect(await page.locator('[data-revision-notice] a').getAttribute('href')).toBe('/procedures/u2-test-001/');
      expect(await page.locator('tr#step-s8').innerText()).toContain('Open valve XV-2108');
      await shot(page, `in-review-${viewport.width}x${viewport.height}`);
    }
  });

  it('lists the revision in force on the home page, the newer one named beside it', async () => {
    const page = await open(fixture, '/', tablet);
    const item = page.locator('.proc-item[data-procedure="U2-TEST-001"]');
    expect(await item.getAttribute('data-in-force')).toBe('4');
    const text = await item.innerText();
    expect(text).toMatch(/Revision 4\s*EFFECTIVE/i);
    expect(text).toMatch(/Revision 5\s*IN REVIEW\s*\(not for use\)/i);
    expect(await item.locator('.proc-link').getAttribute('href')).toBe('/procedures/u2-test-001/');
    // Area names from data, not the folder name.
    expect(await page.locator('section[data-area] h2').allInnerTexts()).toEqual(['K-210 resin']);
  });

  it('search finds the revision in force, never the revision in review', async () => {
    const page = await open(fixture, `/search/?q=${encodeURIComponent('XV-2108')}`);
    await page.locator('#search-status').filter({ hasText: 'found' }).waitFor({ timeout: 30_000 });
    const links = await page.locator('.search-result a').evaluateAll((els) => els.map((e) => (e as HTMLAnchorElement).pathname));
    expect(links.length).toBeGreaterThan(0);
    for (const l of links) expect(l).not.toContain('/next/');
    expect(links).toContain('/procedures/u2-test-001/');
  });

  it('redline shows the one changed step of sixteen with context, and every step on request, without JSON quotes', async () => {
    const page = await open(fixture, '/procedures/u2-test-001/rev/5/redline/', tablet);
    const visible = async () => page.locator('tr[data-redline-step]').evaluateAll((rows) => rows.filter((r) => (r as HTMLElement).offsetParent !== null).map((r) => r.getAttribute('data-redline-step')));
    expect(await visible()).toEqual(['s7', 's8', 's9']);
    expect(await page.locator('tr[data-redline-step][data-changed="yes"]').count()).toBe(1);
    await page.locator('label[for="redline-show-all"]').click();
    expect((await visible()).length).toBe(16);
    const text = await page.locator('.redline').innerText();
    expect(text).not.toMatch(/"[a-z-]+"\s*:/);
    await shot(page, 'redline-800x1280');
  });

  it('keeps every date in the audit and revision tables on one line at 800 px', async () => {
    for (const path of ['/procedures/u2-test-001/audit/', '/procedures/u2-test-001/']) {
      const page = await open(fixture, path, tablet);
      const broken = await page.locator('.history-table .nb, .history-table time').evaluateAll((els) => els.filter((e) => e.getClientRects().length > 1 || (e as HTMLElement).getBoundingClientRect().height > 40).map((e) => e.textContent));
      expect(broken, path).toEqual([]);
      expect(await page.locator('.history-table .nb').count(), path).toBeGreaterThan(0);
    }
  });
});

describe('the demo manual', () => {
  it('says plainly when no revision is in force (revision 3 of the hot-oil shutdown is in review)', async () => {
    const page = await open(demo, '/procedures/u2-h220-sd-001/', tablet);
    const banner = page.locator('[data-no-revision-in-force]');
    expect(await banner.innerText()).toMatch(/NO REVISION IN FORCE[\s\S]*Revision 3 is in review/);
    expect(await banner.locator('a').getAttribute('href')).toBe('/procedures/u2-h220-sd-001/next/');
    expect(await page.locator('.step-table').count()).toBe(0);
    const home = await open(demo, '/', tablet);
    expect(await home.locator('.proc-item[data-procedure="U2-H220-SD-001"]').innerText()).toContain('No revision in force');
    // Area headings are the names the demo's plant register gives its areas, not folder names.
    const areas = await home.locator('section[data-area] h2').allInnerTexts();
    expect(areas).toContain('Resin kettle K-210');
    expect(areas).toContain('Hot-oil heater H-220');
    for (const a of areas) expect(a).not.toMatch(/^[a-z0-9]+(-[a-z0-9]+)+$/);
    await shot(home, 'home-800x1280');
    const wide = await open(demo, '/', desk);
    await shot(wide, 'home-1280x900');
  });

  it.each([['u2-k210-esd-001'], ['u2-h220-em-001']])('%s leads with conditions, responsibility and the immediate actions on the first screen', async (slug) => {
    for (const viewport of [tablet, desk]) {
      const page = await open(demo, `/procedures/${slug}/`, viewport);
      const box = async (sel: string) => (await page.locator(sel).first().boundingBox())!;
      const conditions = await box('[data-lead="conditions"]');
      const responsibility = await box('[data-lead="responsibility"]');
      const firstAction = await box('[data-lead="actions"] li');
      expect(firstAction.y + firstAction.height, `${slug} ${viewport.width}`).toBeLessThanOrEqual(viewport.height);
      expect(conditions.y).toBeLessThan(firstAction.y);
      expect(responsibility.y).toBeLessThan(firstAction.y);
      // Approvals and history come after the steps.
      const steps = await box('#steps');
      expect((await box('#approvals')).y).toBeGreaterThan(steps.y);
      expect((await box('#history')).y).toBeGreaterThan(steps.y);
      await shot(page, `emergency-${slug}-${viewport.width}x${viewport.height}`);
    }
  });

  it('reads conditions in plant words beside the expression', async () => {
    const page = await open(demo, '/procedures/u2-k210-batch-001/', desk);
    const until = await page.locator('.step-table .until').allInnerTexts();
    expect(until).toContain('Until Agitator M-210 running agitator-on == true');
    expect(until).toContain('Until Charge chute valve XV-2107 closed XV-2107 == closed');
    expect(until).toContain('Until Kettle temperature TI-210 at or above 205 degC TI-210 >= 205 degC');
  });

  it('shows in each step row what the step needs before it starts, the states it leaves and the trips it tests', async () => {
    // Links in table cells are touch targets (inline-flex), so their text comes with line breaks around it.
    const words = async (locator: { innerText(): Promise<string> }) => (await locator.innerText()).replace(/\s+/g, ' ').trim();
    const page = await open(demo, '/procedures/u2-k210-batch-001/', desk);
    const tip = page.locator('tr#step-tip-anhydride');
    const needs = await words(tip.locator('.needs'));
    expect(needs).toMatch(/^Before starting: .*DX-213 == running and bags-bonded == true$/);
    expect(await words(page.locator('tr#step-open-chute .plant-state'))).toContain('Leaves XV-2107 open');
    expect(await words(page.locator('tr#step-charge-solvent .plant-state'))).toContain('Holds FV-211 open during this step');
    expect(await page.locator('tr#step-open-chute .plant-state a.tag').getAttribute('href')).toMatch(/\/(tags|register)\//);
    const startUp = await open(demo, '/procedures/u2-k210-tar-su-001/', desk);
    const inert = startUp.locator('tr#step-inert');
    const ends = inert.locator('.call-end a');
    expect(await words(ends)).toBe('When U2-K210-INERT-001 has ended');
    expect(await ends.getAttribute('href')).toMatch(/\/procedures\/u2-k210-inert-001\/$/);
    expect(await inert.innerText()).not.toContain('See the decision below');
    expect(await words(startUp.locator('tr#step-test-trips .plant-state'))).toContain('Trips TSHH-210 on purpose (trip test)');
  });

  it('shows on the K-210 emergency shutdown how each trip latches and is reset, the reset at the step that resets, and the alarm beside the limit', async () => {
    const words = async (locator: { innerText(): Promise<string> }) => (await locator.innerText()).replace(/\s+/g, ' ').trim();
    const page = await open(demo, '/procedures/u2-k210-esd-001/', tablet);
    const reset = 'At the K-210 panel by the board operator, once the shift supervisor has found and cleared the cause';
    // The register's trip starts ESD-210: its latching and reset are that function's, and the page says so.
    const trip = page.locator('tr[data-interlock="TSHH-210"] td.latching');
    expect(await words(trip)).toBe(`Latches through ESD-210: it stays tripped until it is reset. Holds XV-2101 closed, XV-2102 closed, XV-2105 open and XV-2109 open until reset. Reset (ESD-210): ${reset}`);
    expect(await trip.locator('[data-latches]').getAttribute('data-latches')).toBe('true');
    // The relief valve's register entry says nothing of latching or reset: nor does the page.
    expect(await words(page.locator('tr[data-interlock="PSV-210"] td.latching'))).toBe('Not stated');
    const header = await page.locator('tr[data-interlock]').first().locator('xpath=ancestor::table//thead//th').allInnerTexts();
    expect(header.map((h) => h.toLowerCase())).toEqual(['tag', 'trips when', 'what it does', 'latching and reset']);
    // The reset step gives the instruction beside each trip it resets.
    for (const tag of ['TSHH-210', 'PSHH-210']) {
      expect(await words(page.locator(`tr#step-reset-trips li[data-resets="${tag}"]`))).toBe(`Resets ${tag} How to reset (ESD-210): ${reset}`);
    }
    // The register's high alarm on TI-210 (240 degC) under the procedure's high limit (245 degC), in the row's unit.
    const limit = page.locator('tr[data-limit="TI-210"]');
    const cells = await limit.locator('td').allInnerTexts();
    expect(cells.slice(1, 4).map((c) => c.replace(/\s+/g, ' ').trim())).toEqual(['15', '245 Alarm at 240', 'degC']);
    expect(await limit.locator('[data-alarm="high"]').count()).toBe(1);
    expect(await page.locator('tr[data-limit="PI-210"] [data-alarm]').count()).toBe(0);
    // All of it is on the upright tablet's screen width, not cut off.
    for (const part of [trip, page.locator('tr#step-reset-trips .reset-how').first(), limit.locator('[data-alarm="high"]')]) {
      const box = (await part.boundingBox())!;
      expect(box.x + box.width).toBeLessThanOrEqual(tablet.width);
    }
    await page.locator('#interlocks').scrollIntoViewIfNeeded();
    await shot(page, 'esd-interlocks-800x1280');
  });

  it('fits 800 px without hidden clipping: wraps, stacks, or scrolls in an area that says so', async () => {
    const paths = ['/', '/tags/', '/procedures/u2-k210-batch-001/', '/procedures/u2-k210-esd-001/', '/procedures/u2-h220-em-001/', '/procedures/u2-t230-cip-002/', '/procedures/u2-k210-batch-001/audit/'];
    for (const path of paths) {
      const page = await open(demo, path, tablet);
      const problems = await page.evaluate(() => {
        const out: string[] = [];
        if (document.documentElement.scrollWidth > innerWidth) out.push(`page ${document.documentElement.scrollWidth} px wide`);
        for (const el of document.querySelectorAll<HTMLElement>('main *')) {
          if (el.closest('svg') && !(el instanceof SVGSVGElement && el.classList.contains('sfc-chart'))) continue;
          const style = getComputedStyle(el);
          if (style.display === 'none' || style.visibility === 'hidden') continue;
          const scroller = el.closest<HTMLElement>('.scroll-x, .chart-scroll');
          const r = el.getBoundingClientRect();
          if (scroller && scroller !== el) {
            const s = scroller.getBoundingClientRect();
            if (r.right > s.right + 1 && !scroller.hasAttribute('data-overflows')) out.push(`${el.tagName}.${el.className} clipped in an unmarked scroll area`);
          } else if (r.right > innerWidth + 1) out.push(`${el.tagName}.${el.className} ends at ${Math.round(r.right)}`);
        }
        // Every scroll area that overflows shows its hint.
        for (const s of document.querySelectorAll<HTMLElement>('[data-overflows]')) {
          const hint = s.classList.contains('chart-scroll') ? s.nextElementSibling : s;
          if (!hint || getComputedStyle(hint, s.classList.contains('chart-scroll') ? null : '::before').display === 'none') out.push('overflow without a hint');
        }
        return [...new Set(out)].slice(0, 8);
      });
      expect(problems, path).toEqual([]);
      if (path.includes('batch-001/') && !path.includes('audit')) {
        // The batch chart (844 px drawn) fits the 766 px column by scaling, so no transition label is cut.
        const chart = await page.locator('#sequence .chart-scroll').evaluate((el) => ({ box: el.clientWidth, svg: el.querySelector('svg')!.getBoundingClientRect().width }));
        expect(chart.svg).toBeLessThanOrEqual(chart.box);
        await shot(page, 'batch-800x1280');
        const wide = await open(demo, path, desk);
        await shot(wide, 'batch-1280x900');
      }
    }
  });

  it('never breaks inside a tag or a date', async () => {
    for (const path of ['/procedures/u2-k210-batch-001/', '/procedures/u2-k210-esd-001/', '/tags/']) {
      const page = await open(demo, path, tablet);
      const counts = await page.locator('.nb').evaluateAll((els) => ({ all: els.length, broken: els.filter((e) => e.getClientRects().length > 1).map((e) => e.textContent) }));
      expect(counts.all, path).toBeGreaterThan(10);
      expect(counts.broken, path).toEqual([]);
    }
  });

  it('makes every block link and button at least 44 × 44 CSS px', async () => {
    // Source: WCAG 2.2 SC 2.5.5 Target Size (Enhanced), 44 by 44 CSS pixels
    for (const path of ['/tags/', '/', '/procedures/u2-k210-esd-001/', '/procedures/u2-k210-batch-001/audit/']) {
      const page = await open(demo, path, tablet);
      const small = await page.evaluate(() => {
        const inText = (a: Element) => { const p = a.parentElement; return !!p && ['P', 'DD', 'FIGCAPTION', 'LABEL'].includes(p.tagName) && !a.classList.contains('block-link'); };
        return [...document.querySelectorAll<HTMLElement>('main a, main button, header a, header button')]
          .filter((el) => el.offsetParent !== null && !inText(el) && !el.closest('svg'))
          .map((el) => ({ el, r: el.getBoundingClientRect() }))
          .filter(({ r }) => r.height < 44 - 0.5 || r.width < 44 - 0.5)
          .map(({ el, r }) => `${el.tagName} "${el.textContent!.trim().slice(0, 30)}" ${Math.round(r.width)}×${Math.round(r.height)}`);
      });
      expect(small, path).toEqual([]);
      if (path === '/tags/') expect(await page.locator('main a').count()).toBeGreaterThan(100);
    }
  });

  it('draws the chart and the timeline dark in the dark theme', async () => {
    const page = await open(demo, '/procedures/u2-k210-batch-001/', tablet, 'dark');
    const colours = await page.evaluate(() => {
      const luminance = (c: string) => {
        const m = c.match(/[\d.]+/g)!.map(Number);
        const [r, g, b] = m.slice(0, 3).map((v) => { const s = v / 255; return s <= 0.03928 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4; });
        return 0.2126 * r + 0.7152 * g + 0.0722 * b;
      };
      const chart = document.querySelector('.chart-scroll')!;
      const box = chart.querySelector('a.sfc-step rect')!;
      const text = chart.querySelector('a.sfc-step text')!;
      const timeline = document.querySelector('svg.timeline-chart');
      return {
        panel: luminance(getComputedStyle(chart).backgroundColor),
        box: luminance(getComputedStyle(box).fill),
        text: luminance(getComputedStyle(text).fill),
        timelineText: timeline ? luminance(getComputedStyle(timeline.querySelector('text')!).fill) : null,
      };
    });
    // Source: WCAG 2.x contrast ratio (L1 + 0.05) / (L2 + 0.05), at least 4.5:1 for text
    expect(colours.panel).toBeLessThan(0.05);
    expect(colours.box).toBeLessThan(0.05);
    expect((colours.text + 0.05) / (colours.box + 0.05)).toBeGreaterThanOrEqual(4.5);
    if (colours.timelineText !== null) expect(colours.timelineText).toBeGreaterThan(0.5);
    await page.locator('#sequence').scrollIntoViewIfNeeded();
    await shot(page, 'batch-dark-800x1280');
  });

  it('draws the safety alert symbol with DANGER, WARNING and CAUTION everywhere, never with NOTICE', async () => {
    // Source: ANSI Z535.4 — the safety alert symbol precedes DANGER, WARNING and CAUTION; NOTICE is used without it (from memory)
    for (const path of ['/procedures/u2-k210-batch-001/', '/procedures/u2-h220-em-001/']) {
      const page = await open(demo, path, desk);
      const words = await page.locator('.signal-word').evaluateAll((els) => els.map((e) => ({ word: e.textContent!.trim(), symbol: !!e.querySelector('svg.alert-symbol path + path, svg.alert-symbol circle') })));
      expect(words.length, path).toBeGreaterThan(0);
      for (const w of words) expect(w.symbol, `${path} ${w.word}`).toBe(w.word !== 'NOTICE');
      const chart = await page.locator('.chart-scroll .sfc-alert').evaluateAll((els) => els.map((e) => e.getAttribute('data-level')));
      expect(chart.length).toBeGreaterThan(0);
      expect(chart).not.toContain('notice');
    }
  });

  it('numbers every step and decision the same in the chart and the table', async () => {
    const page = await open(demo, '/procedures/u2-k210-batch-001/', desk);
    const chart = await page.locator('.chart-scroll a.sfc-step').evaluateAll((els) => els.map((e) => [e.getAttribute('data-step'), e.querySelector('text')!.textContent!.split(/\s+/)[0]] as const));
    const table = await page.locator('tr.step-row').evaluateAll((els) => els.map((e) => [e.getAttribute('data-step'), e.querySelector('td.num')!.textContent!.trim().split(/\s+/)[0]] as const));
    expect(new Map(chart)).toEqual(new Map(table));
    const decisions = await page.locator('tr.decision-row').evaluateAll((els) => els.map((e) => e.getAttribute('data-decision')));
    const branches = await page.locator('.chart-scroll text.sfc-branch').allTextContents();
    expect(decisions.length).toBeGreaterThan(0);
    for (const d of decisions) expect(branches.filter((b) => b.startsWith(d!)).length, `decision ${d}`).toBeGreaterThanOrEqual(2);
  });

  it('draws every step, the sign-off step included, with the same thin outline (double only for the initial step)', async () => {
    // Source: IEC 60848, step symbols (plain box; initial step double box), common practice; no thick-border symbol.
    const page = await open(demo, '/procedures/u2-k210-batch-001/', desk);
    const steps = await page.locator('.chart-scroll a.sfc-step').evaluateAll((els) => els.map((e) => ({
      step: e.getAttribute('data-step'),
      widths: [...e.querySelectorAll('rect:not(.sfc-hit)')].filter((r) => getComputedStyle(r).stroke !== 'none')
        .map((r) => Number.parseFloat(getComputedStyle(r).strokeWidth)),
    })));
    expect(steps.length).toBeGreaterThan(5);
    for (const s of steps) for (const w of s.widths) expect(w, `step ${s.step}`).toBeLessThanOrEqual(2);
    expect(steps.filter((s) => s.widths.length >= 2).length, 'steps drawn with a double outline').toBe(1);
  });

  it('keeps table headings out of search excerpts', async () => {
    const page = await open(demo, `/search/?q=${encodeURIComponent('Ingrid Halvorsen')}`);
    await page.locator('#search-status').filter({ hasText: 'found' }).waitFor({ timeout: 30_000 });
    const excerpts = await page.locator('.search-result .excerpt').allInnerTexts();
    for (const e of excerpts) expect(e).not.toMatch(/RolePrinted|Printed nameDate|DateMeaning|No\.ActionSetpoints/);
    await shot(page, 'search-1280x900');
  });

  it('uses one 24-hour time format on the placekeeping card, with the alert symbol on its signal words', async () => {
    const page = await open(demo, '/procedures/u2-k210-esd-001/', tablet);
    await page.locator('.pk-start').click();
    await page.locator('.pk-next').first().click();
    const progress = await page.locator('.pk').innerText();
    expect(progress).toMatch(/last mark \d{2}:\d{2}\./);
    expect(progress).not.toMatch(/\b(AM|PM|am|pm)\b/);
    const words = await page.locator('.pk-signal-word').evaluateAll((els) => els.map((e) => ({ word: e.textContent!.trim(), symbol: !!e.querySelector('svg.alert-symbol') })));
    for (const w of words) expect(w.symbol, w.word).toBe(w.word !== 'NOTICE');
  });
});

describe('printing', () => {
  const printable = [['u2-k210-batch-001', 'batch'], ['u2-k210-esd-001', 'emergency']] as const;
  it.each(printable)('%s prints with no blank page, the chart in parts marked "continued", a light header and the controlled-copy marks', async (slug, name) => {
    const page = await open(demo, `/procedures/${slug}/`, desk);
    await page.emulateMedia({ media: 'print' });
    const header = await page.locator('.site-header').evaluate((el) => getComputedStyle(el).backgroundColor);
    expect(header).toMatch(/rgb\(255, 255, 255\)|rgba\(0, 0, 0, 0\)/);
    await shot(page, `print-${name}-1280x900`);
    await page.setViewportSize(tablet);
    await shot(page, `print-${name}-800x1280`);
    await page.setViewportSize(desk);
    for (const format of ['A4', 'Letter'] as const) {
      const pdf = await page.pdf({ format, printBackground: true, preferCSSPageSize: format === 'A4' });
      const pages = await pdfPages(pdf);
      expect(pages.length, `${slug} ${format}`).toBeGreaterThan(1);
      for (const [i, text] of pages.entries()) {
        // A page with nothing but its margin marks is blank.
        const body = text.replace(/Uncontrolled when printed|Page \d+ of \d+|U2-[A-Z0-9-]+ · Revision \d+ · (Effective|Status) [\w-]+/g, '').trim();
        expect(body.length, `${slug} ${format} page ${i + 1} is blank`).toBeGreaterThan(40);
        // A section heading is never left alone at the bottom of a page (the chart heading was, before page 5).
        expect(body, `${slug} ${format} page ${i + 1} ends with a heading`).not.toMatch(/(What to do now|Before you start|Sequence chart|Cycle time|Purpose, scope and notes|Revision history)$/);
        expect(text, `${slug} ${format} page ${i + 1}`).toContain('Uncontrolled when printed');
      }
      // The chart starts on a fresh page: on its first page nothing but the margin marks comes before its heading.
      const chartPage = pages.find((t) => t.includes('Sequence chart Steps'));
      expect(chartPage, `${slug} ${format}: chart page`).toBeDefined();
      expect(chartPage!.replace(/Uncontrolled when printed|Page \d+ of \d+|U2-[A-Z0-9-]+ · Revision \d+ · (Effective|Status) [\w-]+/g, '').replace(/^\s*— printed \d{4}-\d\d-\d\d\s*/, ''), `${slug} ${format}: chart on a fresh page`).toMatch(/^Sequence chart Steps/);
      // Both charts are longer than a page, so each must be split at transitions into marked parts.
      const parts = await page.locator('.chart-print .chart-part').count();
      expect(parts, `${slug} chart parts`).toBeGreaterThan(1);
      const all = pages.join('\n');
      expect(all).toContain(`Continued on the next page (part 2 of ${parts})`);
      expect(all).toContain(`continued from the previous page (part ${parts} of ${parts})`);
      // Each part draws its share of the chart (the parts show the screen chart's shapes by reference): a page that
      // holds a middle part alone holds more than its margin marks and its two "continued" lines.
      for (let k = 2; k < parts; k++) {
        const partPage = pages.find((t) => t.includes(`continued from the previous page (part ${k} of ${parts})`));
        const drawn = partPage!
          .replace(/Uncontrolled when printed|Page \d+ of \d+|U2-[A-Z0-9-]+ · Revision \d+ · (Effective|Status) [\w-]+|— printed \d{4}-\d\d-\d\d/g, '')
          .replace(/Sequence chart of \S+, continued from the previous page \(part \d+ of \d+\)|Continued on the next page \(part \d+ of \d+\)/g, '')
          .trim();
        expect(drawn.length, `${slug} ${format}: chart part ${k} draws nothing`).toBeGreaterThan(40);
      }
    }
  });
});
