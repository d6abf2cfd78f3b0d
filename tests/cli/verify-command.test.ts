// `stepwright verify`: every procedure page's source fingerprint against the sources as they are now.
import { cpSync, mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync, readFileSync, unlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { buildInputs, inputsMeta, integrityMeta, sourceDigest } from '../../src/render/source-integrity.ts';
import { runCli } from './run-cli.ts';
import { writeSiteManifest } from '../../src/cli/site-manifest.ts';

const fixtures = join(import.meta.dirname, '../fixtures/rules/yaml-syntax');
let dir: string;

/** The register files (paths relative to the project folder) as the build records them. */
function registerOf(project: string, files: string[]) {
  return { folder: join(project, 'register'), sources: files.map((file) => ({ file: join(project, file), source: { text: readFileSync(join(project, file), 'utf8') } })) };
}

const attribute = (text: string) => text.replace(/&/g, '&amp;').replace(/"/g, '&quot;');

/**
 * A published site as the build writes it: one page per source, with the fingerprint meta elements; `inputs` is
 * the record of the register and configuration (false: a page of a build that recorded none, an older version).
 */
function publish(sources: string, site: string, inputs: ReturnType<typeof buildInputs> | false = buildInputs(undefined, undefined)) {
  for (const name of readdirSync(sources)) {
    const text = readFileSync(join(sources, name), 'utf8');
    const page = join(site, 'procedures', name.replace(/\.md$/, ''));
    mkdirSync(page, { recursive: true });
    const record = inputs ? `<meta name="${inputsMeta}" content="${attribute(JSON.stringify(inputs))}">` : '';
    writeFileSync(join(page, 'index.html'), `<!doctype html><html><head><meta charset="utf-8"><meta name="${integrityMeta.source}" content="${name}"><meta name="${integrityMeta.digest}" content="${sourceDigest(text)}">${record}</head><body>${name}</body></html>`);
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

  describe('with a plant register', () => {
    const trip = 'safety-functions:\n  TSH-235:\n    text: Hot water tank high temperature trip\n    trips-when: TI-235 >= 90 degC\n';
    beforeEach(() => {
      mkdirSync(join(dir, 'register'));
      writeFileSync(join(dir, 'register', 't-230.yaml'), trip);
      writeFileSync(join(dir, 'register', 'areas.yaml'), 'areas:\n  T-230: { name: Blending }\n');
      writeFileSync(join(dir, 'stepwright.config.yaml'), 'procedures: procedures\n');
      rmSync(join(dir, 'dist'), { recursive: true });
      publish(join(dir, 'procedures'), join(dir, 'dist'), buildInputs(registerOf(dir, ['register/areas.yaml', 'register/t-230.yaml']), { file: join(dir, 'stepwright.config.yaml'), text: readFileSync(join(dir, 'stepwright.config.yaml'), 'utf8') }, join(dir, 'procedures')));
    });

    it('passes while the register and the configuration are as the pages were built from', async () => {
      const out = await runCli(['verify', 'dist'], dir);
      expect(out.stdout).toMatch(/^All 2 procedure pages match their sources\.$/m);
      expect(out.stdout).not.toMatch(/register/);
      expect(out.code).toBe(0);
    });

    it('names the register file of a trip changed after the build, on every page built from it, with a hint to rebuild', async () => {
      writeFileSync(join(dir, 'register', 't-230.yaml'), trip.replace('90 degC', '85 degC'));
      const out = await runCli(['verify', 'dist'], dir);
      expect(out.code).toBe(1);
      for (const page of ['valid-base', 'invalid-unclosed']) {
        expect(out.stdout).toMatch(new RegExp(`^dist/procedures/${page}/index\\.html: built from a register or configuration that no longer matches: register/t-230\\.yaml has changed since the build\\..*rebuild the manual`, 'm'));
      }
      expect(out.stdout).not.toMatch(/areas\.yaml/);
      expect(out.stdout).not.toMatch(/^All 2 procedure pages match their sources\.$/m);
      expect(out.stdout).toMatch(/against the register and configuration: 2 out of date, 0 not checked/);
      // From another working folder the register is found from the procedures folder, as the sources are.
      const name = basename(dir);
      const elsewhere = await runCli(['verify', `${name}/dist`, '--procedures', `${name}/procedures`], join(dir, '..'));
      expect(elsewhere.code).toBe(1);
      expect(elsewhere.stdout).toContain(`${name}/dist/procedures/valid-base/index.html: built from a register or configuration that no longer matches: ${name}/register/t-230.yaml has changed since the build.`);
      expect(elsewhere.stdout).not.toMatch(/is gone since the build/);
    });

    it('reports a register file removed or added, and a changed configuration', async () => {
      unlinkSync(join(dir, 'register', 'areas.yaml'));
      writeFileSync(join(dir, 'register', 'utilities.yaml'), 'signals:\n  PI-300: { text: Steam pressure, unit: bar(g), range: [0, 16] }\n');
      writeFileSync(join(dir, 'stepwright.config.yaml'), 'procedures: procedures\nbase: /manual/\n');
      const out = await runCli(['verify', 'dist'], dir);
      expect(out.code).toBe(1);
      expect(out.stdout).toMatch(/valid-base\/index\.html: .*register\/areas\.yaml is gone since the build; register\/utilities\.yaml was added to the register since the build; stepwright\.config\.yaml has changed since the build/);
    });

    it('does not pass pages of a build that recorded no register: they are said not to be checked against it', async () => {
      rmSync(join(dir, 'dist'), { recursive: true });
      publish(join(dir, 'procedures'), join(dir, 'dist'), false);
      writeFileSync(join(dir, 'register', 't-230.yaml'), trip.replace('90 degC', '85 degC'));
      const out = await runCli(['verify', 'dist'], dir);
      expect(out.stdout).toMatch(/^2 procedure pages \(e\.g\. dist\/procedures\/invalid-unclosed\/index\.html\) do not record the register files and configuration they were built from \(built by an older version\): not checked against the register\. Rebuild the manual/m);
      expect(out.stdout).not.toMatch(/^All 2 procedure pages match their sources\.$/m);
      expect(out.stdout).toMatch(/All 2 procedure pages match their procedure sources; against the register and configuration: 0 out of date, 2 not checked\./);
      expect(out.code).toBe(1);
    });
  });

  it('refuses a folder without fingerprinted pages, and reports usage errors with exit 2', async () => {
    mkdirSync(join(dir, 'empty'));
    expect((await runCli(['verify', 'empty'], dir)).code).toBe(1);
    expect((await runCli(['verify', 'dist', 'empty'], dir)).code).toBe(2);
    // Without a site folder, verify reads dist/ of the project, where build writes it.
    expect((await runCli(['verify'], dir)).stdout).toBe((await runCli(['verify', 'dist'], dir)).stdout);
    const nowhere = await runCli(['verify', 'nowhere'], dir);
    expect(nowhere.stdout).toMatch(/no site at .*nowhere/);
    expect(nowhere.code).toBe(1);
    expect((await runCli(['verify', 'dist', '--procedures', 'nope'], dir)).code).toBe(2);
  });
});
