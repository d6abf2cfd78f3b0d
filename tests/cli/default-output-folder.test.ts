// The built manual's default folder is dist/ of the project (beside the configuration file, else at the top of the
// repository), from whichever folder of the repository a command starts; an --out given stays relative to where it
// is given.
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { defaultOutputFolder } from '../../src/engine/project.ts';
import { procedureText, stepsV1 } from '../history/temp-repo.ts';
import { tempFolder } from '../temp-folder.ts';
import { runCli } from './run-cli.ts';

function repository(files: Record<string, string>): string {
  const dir = tempFolder('stepwright-out-');
  for (const [name, text] of Object.entries(files)) {
    mkdirSync(join(dir, name, '..'), { recursive: true });
    writeFileSync(join(dir, name), text);
  }
  execFileSync('git', ['init', '-q'], { cwd: dir });
  execFileSync('git', ['add', '-A'], { cwd: dir });
  execFileSync('git', ['-c', 'user.name=Plant Engineer', '-c', 'user.email=engineer@alder-reach.example', 'commit', '-q', '-m', 'Unit 2 procedures'], { cwd: dir });
  return dir;
}

/**
 * The environment of a user's shell: without the STEPWRIGHT_ variables a build run in this test process earlier
 * leaves behind for its pages (STEPWRIGHT_PROCEDURES would name another folder than the one found from `cwd`).
 */
function shellEnv(): NodeJS.ProcessEnv {
  return Object.fromEntries(Object.entries(process.env).filter(([key]) => !key.startsWith('STEPWRIGHT_')));
}

/** The command as a user runs it, in its own process started in `cwd` (the site build reads the working folder). */
function stepwright(args: string[], cwd: string) {
  const bin = resolve(import.meta.dirname, '..', '..', 'bin', 'stepwright.mjs');
  const run = spawnSync(process.execPath, [bin, ...args], { cwd, encoding: 'utf8', env: { ...shellEnv(), STEPWRIGHT_TODAY: '2026-12-01', NO_COLOR: '1' } });
  return { code: run.status, stdout: run.stdout, stderr: run.stderr };
}

const files = {
  'procedures/k-210-resin/u2-a-001.md': procedureText({ revision: 1, status: 'draft', steps: stepsV1 }),
  'docs/notes.txt': 'Notes on Unit 2.\n',
};

describe('the default output folder', () => {
  it('is dist/ at the top of the repository, from a subfolder, and beside the configuration file found from there', () => {
    const dir = repository({ ...files, 'manual/stepwright.config.yaml': 'procedures: ../procedures\n' });
    expect(defaultOutputFolder({ cwd: dir })).toBe('dist');
    expect(defaultOutputFolder({ cwd: join(dir, 'docs') })).toBe('../dist');
    expect(defaultOutputFolder({ cwd: join(dir, 'procedures', 'k-210-resin') })).toBe('../../dist');
    expect(defaultOutputFolder({ cwd: join(dir, 'manual') })).toBe('dist');
    // A configuration named with --config does not move the site: it stays at the top of the repository.
    expect(defaultOutputFolder({ cwd: join(dir, 'docs') }, { config: '../manual/stepwright.config.yaml' })).toBe('../dist');
  });

  it('build from docs/ and from a procedures subfolder writes the one dist/ at the top; verify and serve find it', async () => {
    const dir = repository(files);
    const fromDocs = stepwright(['build'], join(dir, 'docs'));
    expect(fromDocs.code, fromDocs.stdout + fromDocs.stderr).toBe(0);
    expect(fromDocs.stdout).toMatch(/into \.\.\/dist\//);
    expect(existsSync(join(dir, 'dist', 'index.html'))).toBe(true);
    expect(existsSync(join(dir, 'docs', 'dist'))).toBe(false);

    const fromInside = stepwright(['build'], join(dir, 'procedures', 'k-210-resin'));
    expect(fromInside.code, fromInside.stdout + fromInside.stderr).toBe(0);
    expect(fromInside.stdout).toMatch(/into \.\.\/\.\.\/dist\//);

    const verify = stepwright(['verify'], join(dir, 'docs'));
    expect(verify.code, verify.stdout + verify.stderr).toBe(0);
    expect(verify.stdout).toContain('All 1 procedure pages match their sources.');
  });

  it('an --out given is relative to the working folder', async () => {
    const dir = repository(files);
    const build = stepwright(['build', '--out', 'site'], join(dir, 'docs'));
    expect(build.code, build.stdout + build.stderr).toBe(0);
    expect(existsSync(join(dir, 'docs', 'site', 'index.html'))).toBe(true);
    expect(existsSync(join(dir, 'dist'))).toBe(false);
  });

  it('serve with nothing built names the project dist/ it looked in', async () => {
    const dir = repository(files);
    const serve = await runCli(['serve'], join(dir, 'docs'));
    expect(serve.code).toBe(1);
    expect(serve.stderr).toBe("stepwright serve: no built manual in ../dist/; run 'stepwright build' first.\n");
  });
});
