// The shared accessibility scan finds what axe-core reports, in its quick in-page form as in its frame-by-frame
// form: a page with known serious problems is not passed as clean.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchChromium } from './floor-fixture.ts';
import { seriousViolations } from './accessibility-scan.ts';

let browser: Browser;
beforeAll(async () => {
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
});

// Source: WCAG 2.1 SC 1.1.1 Non-text Content (an image needs a text alternative) and SC 1.4.3 Contrast (Minimum),
// 4.5:1 for body text; axe-core's rules image-alt (critical) and color-contrast (serious).
const faulty = `<!doctype html><html lang="en"><head><title>Faulty</title></head><body><main>
  <h1>Charge kettle K-210</h1>
  <img src="data:image/gif;base64,R0lGODlhAQABAAAAACw=">
  <p style="color:#bbb;background:#fff">Close XV-2101 before charging.</p>
</main></body></html>`;
const clean = `<!doctype html><html lang="en"><head><title>Clean</title></head><body><main>
  <h1>Charge kettle K-210</h1>
  <img src="data:image/gif;base64,R0lGODlhAQABAAAAACw=" alt="Kettle K-210">
  <p style="color:#222;background:#fff">Close XV-2101 before charging.</p>
</main></body></html>`;

describe('the accessibility scan', () => {
  it('reports a missing text alternative and low contrast on a page without frames, and nothing on a sound page', async () => {
    const page = await (await browser.newContext()).newPage();
    await page.setContent(faulty);
    expect(page.frames()).toHaveLength(1);
    const found = await seriousViolations(page);
    expect(found.some((v) => v.startsWith('image-alt (critical)'))).toBe(true);
    expect(found.some((v) => v.startsWith('color-contrast (serious)'))).toBe(true);
    await page.setContent(clean);
    expect(await seriousViolations(page)).toEqual([]);
    await page.context().close();
  });

  it('scans inside a frame when the page has one', async () => {
    const page = await (await browser.newContext()).newPage();
    await page.setContent(`<!doctype html><html lang="en"><head><title>Framed</title></head><body><main><h1>Frame</h1><iframe title="Step card" srcdoc="${faulty.replaceAll('"', '&quot;')}"></iframe></main></body></html>`);
    await page.waitForLoadState('load');
    expect(page.frames().length).toBeGreaterThan(1);
    const found = await seriousViolations(page);
    expect(found.some((v) => v.startsWith('image-alt (critical)'))).toBe(true);
    await page.context().close();
  });
});
