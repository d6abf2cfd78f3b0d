// `stepwright init` sets up a plant repository and never overwrites what is there.
import { spawnSync } from 'node:child_process';
import { mkdirSync, readdirSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { runCli } from './run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

const fresh = () => tempFolder('sw-init-');

describe('stepwright init', () => {
  it('writes config, an example procedure that checks clean, ignore entries, editor settings and a workflow', async () => {
    const dir = fresh();
    const run = await runCli(['init'], dir);
    expect(run.code).toBe(0);
    expect(parse(readFileSync(join(dir, 'stepwright.config.yaml'), 'utf8'))).toEqual({ procedures: 'procedures', rules: {} });
    expect(readdirSync(join(dir, 'procedures', 'example'))).toEqual(['u2-unl-xyl-001.md']);
    // The register entries the example lists under 'uses', and nothing else of the demo plant.
    const register = parse(readFileSync(join(dir, 'register', 'plant.yaml'), 'utf8'));
    expect(Object.keys(register)).toEqual(['chemicals']);
    expect(Object.keys(register.chemicals)).toEqual(['xylene']);
    expect(readFileSync(join(dir, '.gitignore'), 'utf8').split('\n')).toEqual(expect.arrayContaining(['dist', 'dist.versions/', '.stepwright/', 'node_modules/']));
    const settings = JSON.parse(readFileSync(join(dir, '.vscode', 'settings.json'), 'utf8'));
    expect(Object.values(settings['yaml.schemas'])).toEqual([['procedures/**/*.md', 'procedures/**/*.yaml', 'procedures/**/*.yml']]);
    const workflow = parse(readFileSync(join(dir, '.github', 'workflows', 'procedures.yml'), 'utf8'));
    expect(Object.keys(workflow.jobs)).toEqual(['check', 'check-and-review', 'publish']);
    const check = await runCli(['check'], dir);
    expect(check.stdout).toContain('0 errors');
    expect(check.code).toBe(0);
  });

  it('keeps the built manual out of git, although its path is a link to the version in use', async () => {
    const dir = fresh();
    expect(spawnSync('git', ['init', '-q'], { cwd: dir }).status).toBe(0);
    // An earlier entry that ignores only a folder does not count as the entry.
    writeFileSync(join(dir, '.gitignore'), 'dist/\n');
    expect((await runCli(['init'], dir)).code).toBe(0);
    mkdirSync(join(dir, 'dist.versions', 'site-1'), { recursive: true });
    writeFileSync(join(dir, 'dist.versions', 'site-1', 'index.html'), '<p>built</p>\n');
    symlinkSync(join('dist.versions', 'site-1'), join(dir, 'dist'));
    const status = spawnSync('git', ['status', '--porcelain', '--untracked-files=all'], { cwd: dir, encoding: 'utf8' }).stdout;
    expect(status).not.toMatch(/ dist/);
    expect(status).toContain('.gitignore');
  });

  it('never overwrites a file and says what it left alone; a second run changes nothing', async () => {
    const dir = fresh();
    writeFileSync(join(dir, 'stepwright.config.yaml'), 'rules: { placeholder-text: error }\n');
    writeFileSync(join(dir, '.gitignore'), 'dist\n');
    const first = await runCli(['init'], dir);
    expect(first.stdout).toMatch(/Left as they are[\s\S]*stepwright\.config\.yaml/);
    expect(readFileSync(join(dir, 'stepwright.config.yaml'), 'utf8')).toBe('rules: { placeholder-text: error }\n');
    // Only the missing ignore entries are appended, after what was there.
    const ignore = readFileSync(join(dir, '.gitignore'), 'utf8');
    expect(ignore.startsWith('dist\n')).toBe(true);
    expect(ignore.match(/^dist\/?$/gm)).toHaveLength(1);
    const snapshot = (d: string) => readdirSync(d, { recursive: true }).sort().map((f) => [f, (() => { try { return readFileSync(join(d, String(f)), 'utf8'); } catch { return '/'; } })()]);
    const before = snapshot(dir);
    const second = await runCli(['init'], dir);
    expect(second.stdout).toContain('Nothing to write.');
    expect(snapshot(dir)).toEqual(before);
  });

  it('--demo copies the whole demo manual', async () => {
    const dir = fresh();
    expect((await runCli(['init', '--demo'], dir)).code).toBe(0);
    const files = readdirSync(join(dir, 'procedures'), { recursive: true }).filter((f) => String(f).endsWith('.md'));
    const demo = readdirSync(join(import.meta.dirname, '../../procedures'), { recursive: true }).filter((f) => String(f).endsWith('.md'));
    expect(files.sort()).toEqual(demo.sort());
    // The demo procedures read their signals and trips from the demo register, copied next to the configuration.
    expect(readdirSync(join(dir, 'register')).sort()).toEqual(readdirSync(join(import.meta.dirname, '../../register')).sort());
    const check = await runCli(['check'], dir);
    expect(check.stdout).toMatch(/ 0 errors/);
  });
});
