// Browser pages used again from test to test within one file. A new browser context for every test started a
// renderer process for every test: about 0.4 CPU-s each on the 2-core machine (20 manual pages, each in a context
// of its own: 10.3 CPU-s of Chromium; the same 20 pages opened one after the other in one page: 2.4 CPU-s).
// A page is handed out cleaned: no routes, no listeners, no stored data of the site, the viewport and colour
// scheme asked for. Pages with other context settings (touch, JavaScript, service workers) are kept apart.
import { beforeEach } from 'vitest';
import type { Browser, BrowserContextOptions, Page } from 'playwright-core';

export interface PageOptions extends Omit<BrowserContextOptions, 'viewport' | 'colorScheme'> {
  viewport: { width: number; height: number };
  colorScheme?: 'light' | 'dark';
}

export class PagePool {
  readonly #browser: () => Browser;
  readonly #idle = new Map<string, Page[]>();
  #handedOut: Array<{ key: string; page: Page }> = [];

  /** The browser is asked for when the first page is needed (it is launched in the file's beforeAll). */
  constructor(browser: () => Browser) {
    this.#browser = browser;
    // Tests of a file run one after another: at the start of each, every page is free again.
    beforeEach(() => this.releaseAll());
  }

  /** A page of its own for the running test: one used before, cleaned, or a new one in a new context. */
  async page(options: PageOptions): Promise<Page> {
    const { viewport, colorScheme = 'light', ...contextOptions } = options;
    const key = JSON.stringify(contextOptions);
    const idle = this.#idle.get(key) ?? [];
    let page = idle.pop();
    while (page?.isClosed()) page = idle.pop();
    if (page) await clean(page);
    else page = await (await this.#browser().newContext({ ...contextOptions, viewport, colorScheme })).newPage();
    await page.setViewportSize(viewport);
    await page.emulateMedia({ media: null, colorScheme, reducedMotion: null, forcedColors: null });
    this.#handedOut.push({ key, page });
    return page;
  }

  releaseAll(): void {
    for (const { key, page } of this.#handedOut) {
      if (page.isClosed()) continue;
      const idle = this.#idle.get(key) ?? [];
      idle.push(page);
      this.#idle.set(key, idle);
    }
    this.#handedOut = [];
  }
}

/** The page events the tests listen to. */
const listenedFor = ['dialog', 'console', 'pageerror', 'request', 'response', 'requestfailed', 'popup', 'download'] as const;

/** Forget what the last test did with the page: routes, listeners, and the data the site stored. */
async function clean(page: Page): Promise<void> {
  await page.unrouteAll({ behavior: 'ignoreErrors' });
  for (const event of listenedFor) page.removeAllListeners(event);
  await page.context().clearCookies();
  await page.evaluate(async () => {
    // A page that never showed the site (about:blank) has no storage of it.
    if (!/^https?:$/.test(location.protocol)) return;
    localStorage.clear();
    sessionStorage.clear();
    if (window.isSecureContext) for (const name of await caches.keys()) await caches.delete(name);
  });
}
