// `stepwright verify` checks whole sites: every file against the build's manifest, the manifest against the
// plant's ed25519 signature, and what is at the site path. `stepwright keygen` never overwrites a key.
import { appendFileSync, cpSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { buildManifest, manifestFile, manifestText, privateKeyFile, publicKeyFile, readPrivateKey, writeSiteManifest } from '../../src/cli/site-manifest.ts';
import { buildInputs, inputsMeta, integrityMeta, sourceDigest } from '../../src/render/source-integrity.ts';
import { runCli } from './run-cli.ts';

const fixture = join(import.meta.dirname, '../fixtures/rules/yaml-syntax/valid-base.md');
let dir: string;

/** A small published site as the build writes it: a procedure page with its fingerprint, a tag page, an audit page. */
function site(root: string) {
  const text = readFileSync(join(dir, 'procedures', 'valid-base.md'), 'utf8');
  mkdirSync(join(root, 'procedures', 'valid-base', 'audit'), { recursive: true });
  mkdirSync(join(root, 'tags', 'k-210'), { recursive: true });
  writeFileSync(join(root, 'procedures', 'valid-base', 'index.html'), `<!doctype html><html><head><meta name="${integrityMeta.source}" content="valid-base.md"><meta name="${integrityMeta.digest}" content="${sourceDigest(text)}"><meta name="${inputsMeta}" content="${JSON.stringify(buildInputs(undefined, undefined)).replace(/"/g, '&quot;')}"></head><body><table><tr><td>Heat to 230 degC</td></tr></table></body></html>`);
  writeFileSync(join(root, 'procedures', 'valid-base', 'audit', 'index.html'), '<!doctype html><html><body>Audit: revision 1 approved</body></html>');
  writeFileSync(join(root, 'tags', 'k-210', 'index.html'), '<!doctype html><html><body>K-210</body></html>');
  writeFileSync(join(root, 'index.html'), '<!doctype html><html><body>Home</body></html>');
}

beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'stepwright-verify-manifest-'));
  mkdirSync(join(dir, 'procedures'));
  cpSync(fixture, join(dir, 'procedures', 'valid-base.md'));
  site(join(dir, 'dist'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('verify against the manifest, without a key', () => {
  beforeEach(() => writeSiteManifest(join(dir, 'dist')));

  it('passes an untouched site', async () => {
    const out = await runCli(['verify', 'dist'], dir);
    expect(out.stdout).toMatch(/^Files: 4 match the manifest, 0 changed, 0 added, 0 missing; not signed\.$/m);
    expect(out.code).toBe(0);
  });

  it('reports an edited step table (230 -> 330 degC) although the page still carries the right source stamp', async () => {
    const page = join(dir, 'dist/procedures/valid-base/index.html');
    writeFileSync(page, readFileSync(page, 'utf8').replace('230 degC', '330 degC'));
    const out = await runCli(['verify', 'dist'], dir);
    expect(out.code).toBe(1);
    expect(out.stdout).toMatch(/^dist\/procedures\/valid-base\/index\.html: changed since the build/m);
  });

  it('reports an edited audit page and an edited tag page', async () => {
    appendFileSync(join(dir, 'dist/procedures/valid-base/audit/index.html'), '<p>approved by nobody</p>');
    appendFileSync(join(dir, 'dist/tags/k-210/index.html'), ' ');
    const out = await runCli(['verify', 'dist'], dir);
    expect(out.code).toBe(1);
    expect(out.stdout).toMatch(/^dist\/procedures\/valid-base\/audit\/index\.html: changed since the build/m);
    expect(out.stdout).toMatch(/^dist\/tags\/k-210\/index\.html: changed since the build/m);
  });

  it('reports an added page, a stamped page copied elsewhere, and a removed file', async () => {
    writeFileSync(join(dir, 'dist/extra.html'), '<p>not built</p>');
    mkdirSync(join(dir, 'dist/procedures/copy'));
    cpSync(join(dir, 'dist/procedures/valid-base/index.html'), join(dir, 'dist/procedures/copy/index.html'));
    rmSync(join(dir, 'dist/tags/k-210/index.html'));
    const out = await runCli(['verify', 'dist'], dir);
    expect(out.code).toBe(1);
    expect(out.stdout).toMatch(/^dist\/extra\.html: not in the manifest \(added after the build\)$/m);
    expect(out.stdout).toMatch(/^dist\/procedures\/copy\/index\.html: not in the manifest/m);
    expect(out.stdout).toMatch(/^dist\/tags\/k-210\/index\.html: in the manifest but missing/m);
  });

  it('reports a changed manifest entry as a changed file, and a missing manifest', async () => {
    const path = join(dir, 'dist', manifestFile);
    const manifest = JSON.parse(readFileSync(path, 'utf8'));
    manifest.files['index.html'] = '0'.repeat(64);
    writeFileSync(path, JSON.stringify(manifest));
    expect((await runCli(['verify', 'dist'], dir)).stdout).toMatch(/^dist\/index\.html: changed since the build/m);
    rmSync(path);
    const out = await runCli(['verify', 'dist'], dir);
    expect(out.code).toBe(1);
    expect(out.stdout).toMatch(/stepwright-manifest\.json: missing/);
  });
});

describe('signed manifests', () => {
  beforeEach(async () => {
    const made = await runCli(['keygen', 'keys'].slice(0, 1), dir);
    expect(made.code).toBe(0);
    writeSiteManifest(join(dir, 'dist'), { privateKey: readPrivateKey(join(dir, privateKeyFile)) });
  });

  it('passes with a valid signature (public key found in the current folder)', async () => {
    const out = await runCli(['verify', 'dist'], dir);
    expect(out.stdout).toMatch(/signature valid\.$/m);
    expect(out.code).toBe(0);
  });

  it('reports a forged manifest: a page edited and its hash recomputed', async () => {
    const page = join(dir, 'dist/procedures/valid-base/index.html');
    writeFileSync(page, readFileSync(page, 'utf8').replace('230 degC', '330 degC'));
    writeFileSync(join(dir, 'dist', manifestFile), manifestText(buildManifest(join(dir, 'dist'))));
    const out = await runCli(['verify', 'dist', '--public-key', publicKeyFile], dir);
    expect(out.code).toBe(1);
    expect(out.stdout).toMatch(/stepwright-manifest\.json: its signature does not match/);
  });

  it('reports a manifest signed with another key, and a removed signature', async () => {
    mkdirSync(join(dir, 'other'));
    expect((await runCli(['keygen', 'other'], dir)).code).toBe(0);
    writeSiteManifest(join(dir, 'dist'), { privateKey: readPrivateKey(join(dir, 'other', privateKeyFile)) });
    expect((await runCli(['verify', 'dist'], dir)).stdout).toMatch(/signature does not match/);
    rmSync(join(dir, 'dist', 'stepwright-manifest.sig'));
    const out = await runCli(['verify', 'dist'], dir);
    expect(out.code).toBe(1);
    expect(out.stdout).toMatch(/not signed .* but a public key was given/);
  });

  it('keygen never overwrites a key', async () => {
    const before = readFileSync(join(dir, privateKeyFile), 'utf8');
    const again = await runCli(['keygen'], dir);
    expect(again.code).toBe(1);
    expect(again.stderr).toMatch(/already exists; no key was written or replaced/);
    expect(readFileSync(join(dir, privateKeyFile), 'utf8')).toBe(before);
    expect(existsSync(join(dir, publicKeyFile))).toBe(true);
  });
});
