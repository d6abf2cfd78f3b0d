// The browser tests' page pool hands a page used before to the next test only as a new one would be: without
// the data the site stored, the routes and listeners of the last test, or its emulated media, and at the size
// and colour scheme asked for. Pages still handed out, or with other context settings, are never shared.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchChromium } from './floor-fixture.ts';
import { PagePool } from './page-pool.ts';
import { serveSite, type SiteServer } from './static-server.ts';
import { tempFolder } from '../temp-folder.ts';

let browser: Browser;
let server: SiteServer;
const pool = new PagePool(() => browser);

beforeAll(async () => {
  const site = tempFolder('stepwright-page-pool-');
  mkdirSync(join(site, 'step'), { recursive: true });
  writeFileSync(join(site, 'index.html'), '<!doctype html><html lang="en"><title>Home</title><h1>Unit 2</h1>');
  writeFileSync(join(site, 'step', 'index.html'), '<!doctype html><html lang="en"><title>Step</title><h1>Charge kettle K-210</h1>');
  server = await serveSite(site);
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

describe('the page pool', () => {
  it('hands out a page used before only after it forgets what the last test did', async () => {
    const first = await pool.page({ viewport: { width: 800, height: 1280 }, colorScheme: 'dark', serviceWorkers: 'block' });
    await first.goto(`${server.url}/`);
    await first.evaluate(async () => {
      localStorage.setItem('stepwright-theme', 'dark');
      sessionStorage.setItem('pk', 'step 3');
      await (await caches.open('kept')).put('/x', new Response('x'));
    });
    await first.route('**/step/', (route) => route.fulfill({ body: '<h1>Routed</h1>', contentType: 'text/html' }));
    const heard: string[] = [];
    first.on('console', (message) => heard.push(message.text()));
    await first.emulateMedia({ media: 'print' });

    pool.releaseAll();
    const again = await pool.page({ viewport: { width: 1280, height: 800 }, serviceWorkers: 'block' });
    expect(again).toBe(first);
    await again.goto(`${server.url}/step/`);
    await again.evaluate(() => console.log('step 3 done'));
    expect(heard).toEqual([]);
    await expect(again.locator('h1').textContent()).resolves.toBe('Charge kettle K-210');
    const state = await again.evaluate(async () => ({
      local: localStorage.length, session: sessionStorage.length, caches: (await caches.keys()).length,
      dark: matchMedia('(prefers-color-scheme: dark)').matches, print: matchMedia('print').matches, width: innerWidth,
    }));
    expect(state).toEqual({ local: 0, session: 0, caches: 0, dark: false, print: false, width: 1280 });
  });

  it('never shares a page still handed out, nor one from a context with other settings', async () => {
    const one = await pool.page({ viewport: { width: 1280, height: 800 }, serviceWorkers: 'block' });
    const two = await pool.page({ viewport: { width: 1280, height: 800 }, serviceWorkers: 'block' });
    expect(two).not.toBe(one);
    pool.releaseAll();
    const withoutScripts = await pool.page({ viewport: { width: 1280, height: 800 }, serviceWorkers: 'block', javaScriptEnabled: false });
    expect([one, two]).not.toContain(withoutScripts);
    const handedOutAgain = await pool.page({ viewport: { width: 1280, height: 800 }, serviceWorkers: 'block' });
    expect([one, two]).toContain(handedOutAgain);
  });
});
