// Two publications of a generated manual of 150 procedures in four areas (some of them emergency procedures),
// the second with one procedure changed: built once and shared between runs through a folder in the temp
// directory, keyed by the sources' content like the demo site (site-build.ts). The same update at 1,000 procedures
// is measured by `npm run bench` (bench/offline-update.ts); the tests check what the tablet does.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { copyFileSync, cpSync, existsSync, mkdirSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { generateProcedure } from '../../bench/generate-procedures.ts';

export const procedureCount = 150;
export const areas = ['area-east', 'area-north', 'area-south', 'area-west'];
/** The procedure the second publication changes (the middle one): its title (shown in the lists) and one step's text. */
const changedNumber = procedureCount / 2;
export const changedId = `GEN-${String(changedNumber).padStart(4, '0')}`;
/** Its title in both publications: the first's, and the words the second adds. */
export const changedTitle = `Generated batch procedure ${changedNumber}`;

export interface GeneratedManual {
  procedures: string;
  /** The first publication. */
  a: string;
  /** The second: one procedure changed. */
  b: string;
}

/** The generated procedures: small ones (six steps) so that two builds stay quick; every tenth is an emergency procedure. */
export function generatedManual(changed: boolean): Array<{ file: string; text: string }> {
  return Array.from({ length: procedureCount }, (_, i) => {
    const p = generateProcedure(i + 1, 6);
    const id = p.file.slice('generated/'.length);
    let text = i % 10 === 4 ? p.text.replace('kind: batch', 'kind: emergency') : p.text;
    if (changed && p.text.includes(`id: ${changedId}\n`)) {
      text = text.replace(/^title: .*$/m, `title: ${changedTitle}, second edition`)
        .replace('Generated for benchmarks.', 'Generated for benchmarks. Changed in the second publication: sample the batch twice.');
    }
    return { file: `${areas[i % areas.length]}/${id}`, text };
  });
}

function write(folder: string, changed: boolean): void {
  rmSync(folder, { recursive: true, force: true });
  for (const p of generatedManual(changed)) {
    const file = join(folder, p.file);
    mkdirSync(dirname(file), { recursive: true });
    writeFileSync(file, p.text);
  }
}

function buildEnv(): NodeJS.ProcessEnv {
  const env = { ...process.env };
  for (const key of Object.keys(env)) if (/^(NODE_ENV|DEV|PROD|MODE|SSR|BASE_URL|TEST|VITEST.*)$/.test(key)) delete env[key];
  return { ...env, NO_COLOR: '1', STEPWRIGHT_TODAY: '2026-12-01' };
}

function build(cwd: string, procedures: string, out: string, cache: string): string {
  const run = spawnSync(process.execPath, ['bin/stepwright.mjs', 'build', procedures, '--out', out], {
    cwd, encoding: 'utf8', env: { ...buildEnv(), STEPWRIGHT_CACHE: cache }, timeout: 8 * 60_000,
  });
  if (run.status !== 0) throw new Error(`The generated manual did not build (exit ${run.status}):\n${run.stdout}\n${run.stderr}`);
  return run.stdout;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

const workerFile = 'src/site/client/service-worker.js';

/**
 * Keyed by everything the build reads except the service worker: the build copies that file unchanged
 * (sw.js), so a change to it is put in place without building 600 pages again.
 */
function buildKey(cwd: string): string {
  const hash = createHash('sha256');
  const tree = (path: string): void => {
    if (!existsSync(path) || path === join(cwd, workerFile)) return;
    if (statSync(path).isDirectory()) {
      for (const name of readdirSync(path).sort()) tree(join(path, name));
      return;
    }
    hash.update(path).update('\0').update(readFileSync(path)).update('\0');
  };
  for (const input of ['src', 'package-lock.json', 'bench/generate-procedures.ts', 'tests/e2e/offline-builds.ts']) tree(join(cwd, input));
  return hash.digest('hex').slice(0, 16);
}

function withCurrentWorker(cwd: string, built: GeneratedManual): GeneratedManual {
  for (const site of [built.a, built.b]) copyFileSync(join(cwd, workerFile), join(site, 'sw.js'));
  return built;
}

/**
 * Both publications, built from the same folder (the pages name their source file). The second is built into the
 * first one's output folder, as a plant republishes: its report says what the update costs (kept in b-build.txt),
 * and it takes the unchanged pages from the first build. A copy of the first publication is kept aside to serve.
 */
export async function ensureGeneratedBuilds(cwd = process.cwd()): Promise<GeneratedManual> {
  // Both publications built beforehand (a folder holding procedures/, a/ and b/), like STEPWRIGHT_SITE_DIR.
  const given = process.env.STEPWRIGHT_OFFLINE_BUILDS_DIR;
  if (given) return withCurrentWorker(cwd, { procedures: join(given, 'procedures'), a: join(given, 'a'), b: join(given, 'b') });
  const key = buildKey(cwd);
  const dir = join(tmpdir(), `stepwright-e2e-offline-${key}`);
  const result = { procedures: join(dir, 'procedures'), a: join(dir, 'a'), b: join(dir, 'b') };
  const done = join(dir, 'done');
  const lock = `${dir}.lock`;
  const deadline = Date.now() + 15 * 60_000;
  while (Date.now() < deadline) {
    if (existsSync(done)) return withCurrentWorker(cwd, result);
    try {
      mkdirSync(lock);
    } catch {
      const age = Date.now() - (statSync(lock, { throwIfNoEntry: false })?.mtimeMs ?? Date.now());
      if (age > 12 * 60_000) rmSync(lock, { recursive: true, force: true });
      await sleep(1000);
      continue;
    }
    try {
      if (existsSync(done)) return withCurrentWorker(cwd, result);
      rmSync(dir, { recursive: true, force: true });
      mkdirSync(dir, { recursive: true });
      write(result.procedures, false);
      writeFileSync(join(dir, 'a-build.txt'), build(cwd, result.procedures, result.b, join(dir, 'cache')));
      cpSync(result.b, result.a, { recursive: true, dereference: true });
      write(result.procedures, true);
      writeFileSync(join(dir, 'b-build.txt'), build(cwd, result.procedures, result.b, join(dir, 'cache')));
      writeFileSync(done, '');
      return withCurrentWorker(cwd, result);
    } finally {
      rmSync(lock, { recursive: true, force: true });
    }
  }
  throw new Error('Timed out waiting for another test run to build the generated manuals.');
}
