// Printed copies: identity, page n of m and "uncontrolled when printed" on every page; no controls; JS off too.
import { readFileSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { PDFParse } from 'pdf-parse';
import { artifactsDir, launchChromium, builtSite, serveSite, type SiteServer } from './floor-fixture.ts';

let site: string;
let browser: Browser;
let server: SiteServer;
let batchUrl: string;
const id = 'U2-K210-BATCH-001';
// The revision in force and its effective date, as the demo source states them.
const source = readFileSync(join(import.meta.dirname, '../../procedures/k-210-resin/u2-k210-batch-001.md'), 'utf8');
const revision = source.match(/^revision: (\d+)$/m)![1];
const effective = source.match(/^effective: (\d{4}-\d\d-\d\d)$/m)![1];
const identity = `U2-K210-BATCH-001 · Revision ${revision} · Effective ${effective}`;

beforeAll(async () => {
  site = await builtSite();
  server = await serveSite(site);
  browser = await launchChromium();
  batchUrl = `${server.url}/procedures/${id.toLowerCase()}/`;
});
afterAll(async () => { await browser?.close(); await server?.close(); });

async function open(javaScriptEnabled: boolean): Promise<Page> {
  // The offline copy is not printed: no service worker saving the manual in the background.
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, javaScriptEnabled, serviceWorkers: 'block' });
  const page = await context.newPage();
  const response = await page.goto(batchUrl);
  expect(response?.status()).toBe(200);
  return page;
}

/** The text of the @page margin boxes in effect, read from the style sheets (margin boxes are not in the DOM). */
function marginBoxes(page: Page): Promise<Record<string, string[]>> {
  return page.evaluate(() => {
    const out: Record<string, string[]> = {};
    const visit = (rules: CSSRuleList) => {
      for (const rule of [...rules]) {
        if (rule instanceof CSSPageRule) {
          for (const inner of [...rule.cssRules]) {
            const m = inner as CSSRule & { name?: string; style?: CSSStyleDeclaration };
            if (m.name && m.style?.content) (out[m.name] ??= []).push(m.style.content);
          }
        } else if ('cssRules' in rule) visit((rule as CSSGroupingRule).cssRules);
      }
    };
    for (const sheet of [...document.styleSheets]) { try { visit(sheet.cssRules); } catch { /* cross-origin */ } }
    return out;
  });
}

// Making PDFs of a long procedure takes a while when other browser tests run at the same time.
vi.setConfig({ testTimeout: 120_000 });

/** The text of each PDF page, whitespace folded (margin-box text can wrap over lines). */
async function pdfPages(pdf: Buffer): Promise<string[]> {
  const parser = new PDFParse({ data: new Uint8Array(pdf) });
  try {
    const { pages } = await parser.getText();
    return pages.map((p) => p.text.replace(/\s+/g, ' '));
  } finally {
    await parser.destroy();
  }
}

describe('printing a procedure', () => {
  it('shows the uncontrolled-copy line with the print date and hides the controls', async () => {
    const page = await open(true);
    const today = await page.evaluate(() => new Date().toLocaleDateString('sv')); // sv gives YYYY-MM-DD
    await page.emulateMedia({ media: 'print' });
    const stamp = page.locator('.print-head [data-print-stamp]');
    await expect(stamp.isVisible()).resolves.toBe(true);
    await expect(stamp.textContent()).resolves.toBe(`Uncontrolled when printed — printed ${today}`);
    await expect(page.locator('.print-head').textContent()).resolves.toMatch(new RegExp(`U2-K210-BATCH-001.*Revision ${revision}.*Effective ${effective}`, 's'));
    for (const chrome of ['.site-nav', '.floor-bar', '.skip-link']) {
      await expect(page.locator(chrome).first().isVisible()).resolves.toBe(false);
    }
    await expect(page.locator('.step-table thead').evaluate((el) => getComputedStyle(el).display)).resolves.toBe('table-header-group');
    await expect(page.locator('tr[data-step]').first().evaluate((el) => getComputedStyle(el).breakInside)).resolves.toBe('avoid');
    await expect(page.locator('#sequence figure').evaluate((el) => getComputedStyle(el).breakInside)).resolves.toBe('avoid');
  });

  it('puts id, revision, effective date, page n of m and the dated line in the page margins', async () => {
    const page = await open(true);
    const boxes = await marginBoxes(page);
    expect(boxes['bottom-left']).toContain(`"${identity}"`);
    expect(boxes['bottom-right']).toContain('"Page " counter(page) " of " counter(pages)');
    expect(boxes['bottom-center']?.at(-1)).toMatch(/^"Uncontrolled when printed — printed \d{4}-\d\d-\d\d"$/);
    // Chromium supports margin boxes, so the fixed-footer fallback stays off.
    await expect(page.evaluate(() => document.documentElement.classList.contains('print-fixed-footer'))).resolves.toBe(false);
    const pdf = await page.pdf({ format: 'A4', printBackground: true });
    await writeFile(join(artifactsDir, 'floor-print-u2-k210-batch-001.pdf'), pdf);
    // Read the printed pages back: every page carries the identity, its number of the total, and the dated line.
    const pages = await pdfPages(pdf);
    expect(pages.length).toBeGreaterThan(1);
    pages.forEach((text, i) => {
      expect(text).toContain(identity);
      expect(text).toContain(`Page ${i + 1} of ${pages.length}`);
      expect(text).toMatch(/Uncontrolled when printed — printed \d{4}-\d\d-\d\d/);
      expect(text).not.toContain('Skip to content');
      expect(text).not.toContain('Mark step');
    });
  });

  it('without JavaScript still prints the uncontrolled line, with a blank for the date', async () => {
    const page = await open(false);
    await page.emulateMedia({ media: 'print' });
    const stamp = page.locator('.print-head [data-print-stamp]');
    await expect(stamp.isVisible()).resolves.toBe(true);
    await expect(stamp.textContent()).resolves.toMatch(/^Uncontrolled when printed — printed on: _+/);
    const boxes = await marginBoxes(page);
    expect(boxes['bottom-center']).toEqual(['"Uncontrolled when printed"']);
    const pdf = await page.pdf({ format: 'A4' });
    await writeFile(join(artifactsDir, 'floor-print-u2-k210-batch-001-no-js.pdf'), pdf);
    const pages = await pdfPages(pdf);
    pages.forEach((text, i) => {
      expect(text).toContain('Uncontrolled when printed');
      expect(text).toContain(`Page ${i + 1} of ${pages.length}`);
    });
  });
});
