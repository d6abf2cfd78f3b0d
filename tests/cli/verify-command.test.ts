// `stepwright verify`: every procedure page's source fingerprint against the sources as they are now.
import { cpSync, mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync, readFileSync, unlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { integrityMeta, sourceDigest } from '../../src/render/source-integrity.ts';
import { runCli } from './run-cli.ts';
import { writeSiteManifest } from '../../src/cli/site-manifest.ts';

const fixtures = join(import.meta.dirname, '../fixtures/rules/yaml-syntax');
let dir: string;

/** A published site as the build writes it: one page per source, with the two fingerprint meta elements. */
function publish(sources: string, site: string) {
  for (const name of readdirSync(sources)) {
    const text = readFileSync(join(sources, name), 'utf8');
    const page = join(site, 'procedures', name.replace(/\.md$/, ''));
    mkdirSync(page, { recursive: true });
    writeFileSync(join(page, 'index.html'), `<!doctype html><html><head><meta charset="utf-8"><meta name="${integrityMeta.source}" content="${name}"><meta name="${integrityMeta.digest}" content="${sourceDigest(text)}"></head><body>${name}</body></html>`);
  }
  writeFileSync(join(site, 'index.html'), '<!doctype html><html><head><title>Home</title></head><body></body></html>');
  writeSiteManifest(site);
}

beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'stepwright-verify-'));
  mkdirSync(join(dir, 'procedures'));
  for (const name of ['valid-base.md', 'invalid-unclosed.md']) cpSync(join(fixtures, name), join(dir, 'procedures', name));
  publish(join(dir, 'procedures'), join(dir, 'dist'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('stepwright verify', () => {
  it('passes when every page matches its source', async () => {
    const out = await runCli(['verify', 'dist'], dir);
    expect(out.stdout).toBe('Files: 3 match the manifest, 0 changed, 0 added, 0 missing; not signed.\nAll 2 procedure pages match their sources.\n');
    expect(out.code).toBe(0);
  });

  it('names the page whose source changed since it was published', async () => {
    writeFileSync(join(dir, 'procedures/valid-base.md'), readFileSync(join(dir, 'procedures/valid-base.md'), 'utf8').replace('revision: 1', 'revision: 2'));
    const out = await runCli(['verify', 'dist', '--procedures', 'procedures'], dir);
    expect(out.code).toBe(1);
    expect(out.stdout).toMatch(/^dist\/procedures\/valid-base\/index\.html: does not match its source procedures\/valid-base\.md/m);
    expect(out.stdout).not.toMatch(/invalid-unclosed/);
    expect(out.stdout).toMatch(/1 mismatch: 1 changed, 0 without source, 0 without page; 1 pages match/);
  });

  it('names a page whose source is gone and a source that has no page', async () => {
    unlinkSync(join(dir, 'procedures/invalid-unclosed.md'));
    writeFileSync(join(dir, 'procedures/new-one.md'), '---\nid: X\n---\n');
    const out = await runCli(['verify', 'dist'], dir);
    expect(out.code).toBe(1);
    expect(out.stdout).toMatch(/^dist\/procedures\/invalid-unclosed\/index\.html: its source procedures\/invalid-unclosed\.md is not in procedures$/m);
    expect(out.stdout).toMatch(/^procedures\/new-one\.md: has no page in dist$/m);
  });

  it('refuses a folder without fingerprinted pages, and reports usage errors with exit 2', async () => {
    mkdirSync(join(dir, 'empty'));
    expect((await runCli(['verify', 'empty'], dir)).code).toBe(1);
    expect((await runCli(['verify'], dir)).code).toBe(2);
    const nowhere = await runCli(['verify', 'nowhere'], dir);
    expect(nowhere.stdout).toMatch(/no site at .*nowhere/);
    expect(nowhere.code).toBe(1);
    expect((await runCli(['verify', 'dist', '--procedures', 'nope'], dir)).code).toBe(2);
  });
});
