// `stepwright build` refuses a manual with check errors (with check's own report) and never damages the last good site.
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { removeStaleTemporaries } from '../../src/cli/build-command.ts';
import { modelThreadRunning } from '../../src/analysis/prose/model-thread.ts';
import { runCli } from './run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

const broken = `---
id: U9-BAD-001
title: Broken procedure
kind: normal
revision: 0
status: draft
steps:
  - step: open
    do: Open the valve
    until: TI-9 >= 5 degC
---
`;

function project(): string {
  const dir = tempFolder('stepwright-build-');
  mkdirSync(join(dir, 'procedures'));
  writeFileSync(join(dir, 'procedures', 'bad.md'), broken);
  // The last good site, as a build published it (with its manifest).
  mkdirSync(join(dir, 'dist'));
  writeFileSync(join(dir, 'dist', 'index.html'), 'last good site');
  writeFileSync(join(dir, 'dist', 'stepwright-manifest.json'), '{}');
  return dir;
}

describe('stepwright build', () => {
  it('stops on check errors with the same report as check, and keeps the last good site', async () => {
    const dir = project();
    const build = await runCli(['build'], dir);
    // With no result cache yet, the check read the prose with the English model on its own thread; the build stops
    // that thread once the check is done (the pages never ask it), whether the build goes on or not.
    expect(existsSync(join(dir, '.stepwright', 'cache'))).toBe(true);
    expect(modelThreadRunning()).toBe(false);
    const check = await runCli(['check', 'procedures'], dir);
    expect(build.code).toBe(1);
    expect(check.code).toBe(1);
    // The diagnostics (file:line:column rule message, code frame, hint) are printed exactly as check prints them.
    expect(build.stdout).toBe(check.stdout);
    expect(build.stdout).toMatch(/procedures\/bad\.md:\d+:\d+ error undeclared-name/);
    expect(build.stderr).toContain('The last good site in dist/ is unchanged.');
    expect(readFileSync(join(dir, 'dist', 'index.html'), 'utf8')).toBe('last good site');
    expect(existsSync(join(dir, `dist.tmp-${process.pid}`))).toBe(false);
  });

  it('reads the folder from STEPWRIGHT_PROCEDURES or the argument and says when nothing was written', async () => {
    const dir = project();
    const build = await runCli(['build', '--out', 'site', 'procedures'], dir);
    expect(build.code).toBe(1);
    expect(build.stderr).toContain('No site was written.');
    expect(existsSync(join(dir, 'site'))).toBe(false);
  });
});

describe('left-overs of killed builds', () => {
  const dead = 2 ** 22 + 12345; // above the usual pid_max, so no live process has it

  it('removes the temporary folder of a build that died and keeps the site', () => {
    const dir = project();
    mkdirSync(join(dir, `dist.tmp-${dead}`));
    mkdirSync(join(dir, `dist.old-${dead + 1}`));
    removeStaleTemporaries(join(dir, 'dist'));
    expect(existsSync(join(dir, `dist.tmp-${dead}`))).toBe(false);
    expect(existsSync(join(dir, `dist.old-${dead + 1}`))).toBe(false);
    expect(readFileSync(join(dir, 'dist', 'index.html'), 'utf8')).toBe('last good site');
  });

  it('puts the old site back when a build died between its two renames', () => {
    const dir = tempFolder('stepwright-build-');
    mkdirSync(join(dir, `dist.old-${dead}`));
    writeFileSync(join(dir, `dist.old-${dead}`, 'index.html'), 'last good site');
    removeStaleTemporaries(join(dir, 'dist'));
    expect(readFileSync(join(dir, 'dist', 'index.html'), 'utf8')).toBe('last good site');
  });

  it('leaves the folders of builds still running alone', () => {
    const dir = project();
    mkdirSync(join(dir, `dist.tmp-${process.ppid}`));
    removeStaleTemporaries(join(dir, 'dist'));
    expect(existsSync(join(dir, `dist.tmp-${process.ppid}`))).toBe(true);
  });
});
