// `stepwright serve --base /manual/`: the built folder is served under the base the site was built with, as a
// plant's web server would; the root and the bare base lead to it, anything else outside it is not found.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { builtFor, startStaticServer } from '../../src/cli/serve-command.ts';
import { writeOfflineCopy } from '../../src/cli/write-offline-copy.ts';
import { runCli } from './run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

describe('serving under a base', () => {
  const dir = tempFolder('stepwright-serve-base-');
  mkdirSync(join(dir, 'tags'));
  writeFileSync(join(dir, 'index.html'), '<!doctype html><title>home</title>');
  writeFileSync(join(dir, 'tags', 'index.html'), '<!doctype html><title>tags</title>');

  it('serves the folder at /manual/, redirects / and /manual there, and answers 404 elsewhere', async () => {
    const { server, url } = await startStaticServer(dir, 0, '127.0.0.1', '/manual/');
    try {
      expect(url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/manual\/$/);
      const origin = new URL(url).origin;
      const get = (path: string) => fetch(origin + path, { redirect: 'manual' });
      expect(await (await get('/manual/')).text()).toContain('<title>home</title>');
      expect(await (await get('/manual/tags/')).text()).toContain('<title>tags</title>');
      const tags = await get('/manual/tags');
      expect([tags.status, tags.headers.get('location')]).toEqual([301, '/manual/tags/']);
      for (const path of ['/', '/manual']) {
        const r = await get(path);
        expect([r.status, r.headers.get('location')]).toEqual([301, '/manual/']);
      }
      expect((await get('/tags/')).status).toBe(404);
      expect((await get('/manual/../index.html')).status).not.toBe(500);
    } finally {
      server.close();
    }
  });

  it('refuses a base that is an address, naming --base, with exit 2', async () => {
    const r = await runCli(['serve', '--dir', dir, '--base', 'https://intranet/manual/', '--port', '0'], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--base');
    expect(r.stderr).toContain('address, not a path');
  });

  it('takes the base a build recorded for its site, so a site built under /manual/ is served there', async () => {
    const site = tempFolder('stepwright-serve-record-');
    writeFileSync(join(site, 'index.html'), '<!doctype html><title>home</title>');
    expect(await builtFor(site)).toBeUndefined();
    await writeOfflineCopy(site, { now: new Date('2026-12-01T00:00:00Z'), publishedUnder: '/manual/' });
    expect(await builtFor(site)).toBe('/manual/');
    await writeOfflineCopy(site, { now: new Date('2026-12-01T00:00:00Z') });
    expect(await builtFor(site)).toBe('/');
    writeFileSync(join(site, 'offline-manifest.json'), '{"version":"x","base":"https://elsewhere/"}');
    expect(await builtFor(site)).toBeUndefined();
  });
});
