// The plant register pages and what procedure pages gained with them, in Chromium on the shared demo build:
// register index and entry pages (every entry, where-used links that land on real step rows, the entry's changes),
// register links from procedure pages, the temporary procedure in force (procedure page and home, with its end
// date), the contingency column, performer and verification, the line-up checklist kept by placekeeping and the
// contingency jump; 800 px without sideways scrolling and print with the new content. Screenshots in test-artifacts/.
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { PDFParse } from 'pdf-parse';
import { artifactsDir, builtSite, launchChromium, serveSite, type SiteServer } from './floor-fixture.ts';
import { PagePool } from './page-pool.ts';
import { seriousViolations } from './accessibility-scan.ts';
import { loadRegister } from '../../src/engine/load-register.ts';

vi.setConfig({ testTimeout: 120_000, hookTimeout: 600_000 });

const tablet = { width: 800, height: 1280 };
const desk = { width: 1280, height: 900 };
const batch = '/procedures/u2-k210-batch-001/';
const esd = '/procedures/u2-k210-esd-001/';
// The demo register, read independently of the site: every entry must have its page.
const register = loadRegister(process.cwd(), undefined, undefined)!;

let browser: Browser;
let server: SiteServer;
const pool = new PagePool(() => browser);

beforeAll(async () => {
  const site = await builtSite();
  server = await serveSite(site);
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

async function open(path: string, viewport = desk): Promise<Page> {
  const page = await pool.page({ viewport, serviceWorkers: 'block' });
  const response = await page.goto(server.url + path);
  expect(response?.status(), path).toBe(200);
  return page;
}

const shot = (page: Page, name: string, fullPage = false) => page.screenshot({ path: join(artifactsDir, `register-${name}.png`), fullPage });

async function pdfText(pdf: Buffer): Promise<string[]> {
  const parser = new PDFParse({ data: new Uint8Array(pdf) });
  try {
    return (await parser.getText()).pages.map((p) => p.text.replace(/\s+/g, ' ').trim());
  } finally {
    await parser.destroy();
  }
}

describe('register pages', () => {
  it('lists every register entry once, each with a page that names it', async () => {
    const page = await open('/register/');
    const listed = await page.locator('[data-entry]').evaluateAll((els) => els.map((e) => (e as HTMLElement).dataset.entry!));
    expect([...listed].sort()).toEqual([...register.entries.keys()].sort());
    for (const section of ['areas', 'equipment', 'signals', 'safety-functions', 'relief-devices', 'chemicals']) {
      await expect(page.locator(`[data-register-section="${section}"]`).count(), section).resolves.toBe(1);
    }
    const hrefs = await page.locator('[data-entry] a').evaluateAll((els) => els.map((e) => (e as HTMLAnchorElement).getAttribute('href')!));
    for (const href of hrefs) {
      const r = await page.request.get(new URL(href, page.url()).href);
      expect(r.status(), href).toBe(200);
    }
    await shot(page, 'index-1280x900');
  });

  it('shows where a trip is used, with links that land on real step rows, and its changes from git', async () => {
    const page = await open('/register/tshh-210/');
    await expect(page.locator('h1').textContent()).resolves.toContain('TSHH-210');
    await expect(page.locator('.register-facts').textContent()).resolves.toContain('TI-210 >= 255 degC');
    const users = await page.locator('ul.where-used > li').evaluateAll((els) => els.map((e) => (e as HTMLElement).dataset.procedure!));
    expect(users.length).toBeGreaterThanOrEqual(3);
    expect(users).toContain('U2-K210-ESD-001');
    const stepLinks = await page.locator('ul.where-used a[href*="#step-"]').evaluateAll((els) => els.map((e) => (e as HTMLAnchorElement).href));
    expect(stepLinks.length).toBeGreaterThan(0);
    // Each link opened in a second page, as a new tab would open it.
    const target = await pool.page({ viewport: desk, serviceWorkers: 'block' });
    for (const href of stepLinks.slice(0, 6)) {
      await target.goto(href);
      const id = decodeURIComponent(new URL(href).hash.slice(1));
      await expect(target.locator(`tr#${id}`).count(), href).resolves.toBe(1);
    }
    // The register was committed in the demo's history: the entry's changes name a commit.
    await expect(page.locator('.register-history li').count()).resolves.toBeGreaterThan(0);
    await expect(page.locator('.register-history li').first().textContent()).resolves.toMatch(/(Added|Changed|First seen) on \d{4}-\d{2}-\d{2}/);
    await shot(page, 'tshh-210-1280x900', true);
  });

  it('keeps the safety data sheet caution on a chemical and reaches the shutdown function through its trips', async () => {
    const chemical = await open('/register/xylene/');
    await expect(chemical.locator('.register-caution').textContent()).resolves.toContain("supplier's current safety data sheet");
    await expect(chemical.locator('ul.where-used > li[data-procedure="U2-K210-BATCH-001"]').count()).resolves.toBe(1);
    const shutdown = await open('/register/esd-210/');
    const how = await shutdown.locator('ul.where-used > li[data-procedure="U2-K210-ESD-001"]').textContent();
    expect(how).toMatch(/Through .*HS-2190/);
  });

  it('is linked from procedure pages: interlocks, limits, the area and the list of entries used', async () => {
    const page = await open(batch);
    const interlock = await page.locator('#interlocks ~ div a[data-register]').first().getAttribute('href');
    expect(interlock).toMatch(/^\/register\/[a-z0-9_-]+\/$/);
    await expect(page.locator('#limits ~ div a[data-register]').count()).resolves.toBeGreaterThan(0);
    await expect(page.locator('#identity dd a[href="/register/k-210-resin/"]').count()).resolves.toBe(1);
    const used = await page.locator('[data-register-entries] a.register-link').evaluateAll((els) => els.map((e) => e.textContent));
    expect(used).toEqual(expect.arrayContaining(['TSHH-210', 'xylene', 'ESD-210']));
  });

  for (const path of ['/register/', '/register/ti-210/', '/register/esd-210/', '/register/k-210-resin/']) {
    it(`fits an 800 px tablet without sideways scrolling: ${path}`, async () => {
      const page = await open(path, tablet);
      const [scroll, width] = await page.evaluate(() => [document.documentElement.scrollWidth, innerWidth]);
      expect(scroll).toBeLessThanOrEqual(width);
      await shot(page, `${path.replaceAll('/', '_')}-800x1280`);
    });
  }

  it('shows on a committed revision and its redline the trips it takes from the register, said to be this build\'s register', async () => {
    // Revision 4 of the hot-oil leak response names its burner trips under `uses:`; the register describes them.
    const page = await open('/procedures/u2-h220-em-001/rev/4/');
    const note = page.locator('[data-register-as-built]');
    expect(await note.innerText()).toMatch(/as the register defines it in this build, not as it stood when the revision was committed/);
    expect(await note.locator('a').getAttribute('href')).toBe('/register/');
    const trips = await page.locator('#before-you-start table').filter({ has: page.locator('th', { hasText: 'Trips when' }) }).innerText();
    for (const tag of ['HS-2201', 'FSLL-224', 'TSHH-221']) expect(trips).toContain(tag);
    const redline = await open('/procedures/u2-h220-em-001/rev/4/redline/');
    expect(await redline.locator('[data-register-as-built]').count()).toBe(1);
    // Moving the trips into the register is not shown as taking them away.
    expect(await redline.locator('article').innerText()).not.toMatch(/HS-2201\s+removed/);
  });

  it('says on a revision in force which register entries it takes over changed after it took effect', async () => {
    // The kettle's inerting took effect on 2026-12-01; the register gained PI-210 and the other K-210 entries on
    // 2026-12-02 (in this repository's history).
    const page = await open('/procedures/u2-k210-inert-001/');
    const note = page.locator('[data-register-changed-since]');
    expect(await note.count()).toBe(1);
    expect(await note.innerText()).toMatch(/Plant register changed since this revision took effect/);
    expect(await note.innerText()).toMatch(/after this revision took effect on 2026-12-01/);
    // The list is closed at first, its summary saying how many entries changed; the keyboard opens it.
    const summary = note.locator('summary');
    expect(await summary.innerText()).toMatch(/^\d+ register (entry|entries) changed: show which$/);
    expect(await note.locator('details').getAttribute('open')).toBeNull();
    await summary.focus();
    await page.keyboard.press('Enter');
    expect(await note.locator('details').getAttribute('open')).not.toBeNull();
    expect(await note.innerText()).toMatch(/PI-210 added to the register on 2026-12-02/);
    expect(await note.locator('a', { hasText: /^PI-210$/ }).getAttribute('href')).toBe('/register/pi-210/');
    expect(await seriousViolations(page)).toEqual([]);
    // A draft's page says nothing of the kind: it shows what it will be approved with.
    const draft = await open('/procedures/u2-n2-su-001/next/');
    expect(await draft.locator('[data-register-changed-since]').count()).toBe(0);
  });

  it('prints an entry with its values, where it is used and the standing caution', async () => {
    const page = await open('/register/ti-210/');
    await page.emulateMedia({ media: 'print' });
    const text = (await pdfText(await page.pdf({ format: 'A4', printBackground: true }))).join('\n');
    expect(text).toContain('245 degC');
    expect(text).toContain('Where it is used');
    expect(text).toContain('THIS MANUAL SUPPORTS');
  });
});

describe('temporary procedure in force', () => {
  it('is said at the top of the procedures it changes, with its end date and a link', async () => {
    const page = await open(batch);
    const notice = page.locator('[data-temporary-notice]');
    await expect(notice.textContent()).resolves.toMatch(/U2-T230-TMP-001.*in force until 2027-01-15/s);
    await expect(notice.locator('a').first().getAttribute('href')).resolves.toBe('/procedures/u2-t230-tmp-001/');
    // Before the steps: the notice comes before the step table in the page.
    const before = await page.evaluate(() => {
      const n = document.querySelector('[data-temporary-notice]')!;
      return Boolean(n.compareDocumentPosition(document.querySelector('#steps')!) & Node.DOCUMENT_POSITION_FOLLOWING);
    });
    expect(before).toBe(true);
    const other = await open('/procedures/u2-k210-sd-001/');
    await expect(other.locator('[data-temporary-notice]').count()).resolves.toBe(0);
  });

  it('is listed on the home page with what it changes and its end date', async () => {
    const page = await open('/');
    const summary = await page.locator('[data-temporary-summary]').textContent();
    expect(summary).toContain('U2-T230-TMP-001');
    expect(summary).toContain('2027-01-15');
    expect(summary).toContain('U2-K210-BATCH-001');
    await expect(page.locator('[data-procedure="U2-T230-CIP-002"] .temporary-mark').count()).resolves.toBe(1);
  });
});

describe('step table, chart and placekeeping: contingencies, performers, checks and the line-up', () => {
  it('shows the contingency column with time limits and jumps, the performer and the second-person check', async () => {
    const page = await open(esd);
    const heads = await page.locator('.step-table thead th').allTextContents();
    expect(heads).toContain('If it does not happen');
    expect(heads).toContain('Who and checks');
    const contingency = await page.locator('#step-check-cooling-open td.contingency').textContent();
    expect(contingency).toContain('Within 1 min.');
    expect(contingency).toContain('HV-2106');
    await expect(page.locator('#step-check-cooling-open td.contingency a').getAttribute('href')).resolves.toBe('#step-read-temperature');
    await expect(page.locator('#step-reset-trips td.who').textContent()).resolves.toMatch(/By: Board operator.*Second-person sign-off: Shift supervisor/s);
    // The chart says the same inside the step boxes.
    const chart = await page.locator('#sequence .chart-scroll > svg').textContent();
    expect(chart).toContain('BY: Board operator');
    expect(chart).toContain('SECOND-PERSON SIGN-OFF:');
  });

  it('stacks the new columns with labels on an 800 px tablet, without sideways scrolling', async () => {
    const page = await open(esd, tablet);
    const [scroll, width] = await page.evaluate(() => [document.documentElement.scrollWidth, innerWidth]);
    expect(scroll).toBeLessThanOrEqual(width);
    const label = await page.locator('#step-check-cooling-open td.contingency').evaluate((el) => getComputedStyle(el, '::before').content);
    expect(label).toContain('If it does not happen');
    // A step without a contingency shows no empty label.
    await expect(page.locator('#step-announce td.contingency').isVisible()).resolves.toBe(false);
    await page.locator('#step-check-cooling-open').scrollIntoViewIfNeeded();
    await shot(page, 'esd-steps-800x1280');
  });

  it('puts the line-up checklist before the chart; placekeeping keeps its ticks and reminds of open items', async () => {
    const page = await open(batch, tablet);
    const items = page.locator('#line-up [data-line-up-check]');
    const count = await items.count();
    expect(count).toBeGreaterThan(3);
    await expect(page.locator('#line-up').textContent()).resolves.toContain('Completed first: U2-K210-INERT-001');
    const beforeChart = await page.evaluate(() => Boolean(document.querySelector('#line-up')!.compareDocumentPosition(document.querySelector('#sequence')!) & Node.DOCUMENT_POSITION_FOLLOWING));
    expect(beforeChart).toBe(true);
    await items.nth(0).check();
    await items.nth(1).check();
    await expect(page.locator('[data-line-up-status]').textContent()).resolves.toContain(`2 of ${count} confirmed`);
    await page.locator('.pk-start').click();
    await expect(page.locator('[data-pk-line-up]').getAttribute('data-pk-line-up')).resolves.toBe(String(count - 2));
    await page.reload();
    await expect(items.nth(0).isChecked()).resolves.toBe(true);
    await expect(items.nth(2).isChecked()).resolves.toBe(false);
    for (let i = 2; i < count; i++) await items.nth(i).check();
    await expect(page.locator('[data-pk-line-up]').getAttribute('data-pk-line-up')).resolves.toBe('0');
    await page.locator('#line-up').scrollIntoViewIfNeeded();
    await shot(page, 'line-up-800x1280');
  });

  it('offers a step\'s contingency jump in placekeeping and moves the place there', async () => {
    const page = await open(esd, tablet);
    await page.locator('.pk-start').click();
    for (let i = 0; i < 2; i++) await page.locator('.pk-dock .pk-next').click();
    await expect(page.locator('.pk-card-title').textContent()).resolves.toBe('Step 3');
    const jump = page.locator('.pk-dock [data-pk-if-not]');
    await expect(jump.textContent()).resolves.toContain('go to step 5');
    // The card shows the contingency as the table does.
    await expect(page.locator('.pk-card').textContent()).resolves.toContain('HV-2106');
    await jump.click();
    await expect(page.locator('.pk-card-title').textContent()).resolves.toBe('Step 5');
    await expect(page.locator('tr#step-read-temperature').getAttribute('aria-current')).resolves.toBe('step');
  });

  it('prints the line-up with empty boxes and the contingency column', async () => {
    const page = await open(batch, desk);
    await page.locator('#line-up [data-line-up-check]').first().check();
    await page.emulateMedia({ media: 'print' });
    const box = await page.locator('#line-up [data-line-up-check]').first().evaluate((el) => getComputedStyle(el).appearance);
    expect(box).toBe('none');
    const text = (await pdfText(await page.pdf({ format: 'A4', printBackground: true }))).join('\n');
    expect(text).toContain('Line-up before step 1');
    expect(text.toLowerCase()).toContain('if it does not happen');
  });
});
