// Shared by the floor e2e tests: one built site, the tests' static server, and headless Chromium.
import { existsSync } from 'node:fs';
import { mkdir } from 'node:fs/promises';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { launchBrowser } from './chromium.ts';
import { ensureBuiltSite } from './site-build.ts';

export { serveSite, type SiteServer } from './static-server.ts';

export const artifactsDir = join(process.cwd(), 'test-artifacts');

/**
 * The built manual: STEPWRIGHT_SITE_DIR when set (a site built beforehand), else the demo manual built once for
 * all browser tests by the site's own fixture (keyed by the sources' content).
 */
export async function builtSite(): Promise<string> {
  const dir = process.env.STEPWRIGHT_SITE_DIR ?? (await ensureBuiltSite()).dir;
  if (!existsSync(join(dir, 'sw.js'))) {
    throw new Error(`The built manual in ${dir} has no offline copy (sw.js); 'stepwright build' writes it after pagefind.`);
  }
  return dir;
}

export async function launchChromium(): Promise<Browser> {
  await mkdir(artifactsDir, { recursive: true });
  return launchBrowser();
}
