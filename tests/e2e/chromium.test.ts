// The tests' Chromium launch: it keeps every feature playwright-core turns off, and it opens no hidden page of
// the browser's own with each new context, nor a spare renderer process.
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { chromiumPath, launchBrowser, playwrightDisabledFeatures } from './chromium.ts';

/** The feature list in the installed playwright-core's source, read from its bundle. */
function installedPlaywrightList(): string[] | undefined {
  const lib = join(dirname(createRequire(import.meta.url).resolve('playwright-core/package.json')), 'lib');
  for (const file of ['coreBundle.js', 'server/chromium/chromiumSwitches.js']) {
    if (!existsSync(join(lib, file))) continue;
    const text = readFileSync(join(lib, file), 'utf8');
    const list = /disabledFeatures = \[([^\]]*)\]/.exec(text)?.[1];
    if (list) return [...list.replace(/\/\/[^\n]*/g, '').matchAll(/"([^"]+)"/g)].map((m) => m[1]);
  }
  return undefined;
}

describe('the tests\' Chromium', () => {
  it('repeats the features playwright-core turns off, since its own switch replaces theirs', () => {
    expect(installedPlaywrightList()).toEqual(playwrightDisabledFeatures);
  });

  it.skipIf(!existsSync(chromiumPath))('opens a new context with its page and nothing else', async () => {
    const browser = await launchBrowser();
    try {
      const cdp = await browser.newBrowserCDPSession();
      const context = await browser.newContext();
      await (await context.newPage()).goto('about:blank');
      const { targetInfos } = await cdp.send('Target.getTargets', {});
      expect(targetInfos.map((t) => `${t.type} ${t.url}`)).toEqual(['page about:blank']);
      await context.close();
    } finally {
      await browser.close();
    }
  });

  it.skipIf(!existsSync(chromiumPath))('starts one renderer process per open page, with no spare waiting beside them', async () => {
    const browser = await launchBrowser();
    try {
      const cdp = await browser.newBrowserCDPSession();
      const renderers: number[] = [];
      for (let i = 0; i < 3; i++) {
        const page = await (await browser.newContext()).newPage();
        await page.setContent('<!doctype html><title>Step</title><h1>Charge kettle K-210</h1>');
        const { processInfo } = (await cdp.send('SystemInfo.getProcessInfo')) as { processInfo: Array<{ type: string }> };
        renderers.push(processInfo.filter((p) => p.type === 'renderer').length);
      }
      expect(renderers).toEqual([1, 2, 3]);
    } finally {
      await browser.close();
    }
  });
});
