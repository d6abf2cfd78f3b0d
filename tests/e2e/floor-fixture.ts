// Shared by the floor e2e tests: one built site, a static server that can be stopped, and headless Chromium.
import { createServer, type Server } from 'node:http';
import { existsSync } from 'node:fs';
import { mkdir, readFile, stat } from 'node:fs/promises';
import { extname, join, normalize } from 'node:path';
import { chromium, type Browser } from 'playwright-core';
import { ensureBuiltSite } from './site-build.ts';

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

const types: Record<string, string> = {
  '.html': 'text/html; charset=utf-8', '.js': 'text/javascript', '.mjs': 'text/javascript', '.css': 'text/css',
  '.json': 'application/json', '.svg': 'image/svg+xml', '.png': 'image/png', '.wasm': 'application/wasm',
  '.woff2': 'font/woff2', '.ico': 'image/x-icon', '.txt': 'text/plain',
};

export interface SiteServer {
  url: string;
  /** Replace a response body by path (e.g. a newer offline-manifest.json) for the next requests. */
  override: Map<string, string>;
  requests: string[];
  close(): Promise<void>;
}

export async function serveSite(dir: string): Promise<SiteServer> {
  const override = new Map<string, string>();
  const requests: string[] = [];
  const server: Server = createServer(async (req, res) => {
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
    requests.push(path);
    if (override.has(path)) {
      res.writeHead(200, { 'content-type': types[extname(path)] ?? 'application/octet-stream', 'cache-control': 'no-cache' });
      res.end(override.get(path));
      return;
    }
    let file = join(dir, normalize(path).replace(/^(\.\.[/\\])+/, ''));
    try {
      if ((await stat(file)).isDirectory()) file = join(file, 'index.html');
      const body = await readFile(file);
      res.writeHead(200, { 'content-type': types[extname(file)] ?? 'application/octet-stream', 'cache-control': 'no-cache' });
      res.end(body);
    } catch {
      res.writeHead(404, { 'content-type': 'text/plain' });
      res.end('not found');
    }
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  return {
    // localhost, not 127.0.0.1: service workers need a secure context, and localhost counts as one.
    url: `http://localhost:${port}`,
    override,
    requests,
    close: () => new Promise<void>((resolve) => { server.closeAllConnections(); server.close(() => resolve()); }),
  };
}

export async function launchChromium(): Promise<Browser> {
  await mkdir(artifactsDir, { recursive: true });
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
  });
}
