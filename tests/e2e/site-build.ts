// Builds the demo manual once for all browser tests: keyed by the content of the sources, shared between
// test files (and runs) through a folder in the temp directory, guarded by a lock folder.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const inputs = ['procedures', 'register', 'src', 'package-lock.json', 'tests/e2e/site-build.ts'];

function hashTree(hash: ReturnType<typeof createHash>, path: string): void {
  if (!existsSync(path)) return;
  if (statSync(path).isDirectory()) {
    for (const name of readdirSync(path).sort()) hashTree(hash, join(path, name));
    return;
  }
  hash.update(path).update('\0').update(readFileSync(path)).update('\0');
}

export function siteKey(cwd = process.cwd()): string {
  const hash = createHash('sha256');
  for (const i of inputs) hashTree(hash, join(cwd, i));
  return hash.digest('hex').slice(0, 16);
}

/** The environment of a plain command line: without what the test runner adds (NODE_ENV=test, DEV, MODE …),
 * which the site build would take as a development build. */
function buildEnv(): NodeJS.ProcessEnv {
  const env = { ...process.env };
  for (const key of Object.keys(env)) if (/^(NODE_ENV|DEV|PROD|MODE|SSR|BASE_URL|TEST|VITEST.*)$/.test(key)) delete env[key];
  return env;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** True while the process that took the lock is alive (a lock without its owner's id is judged by age). */
function lockHeld(lock: string): boolean {
  const owner = Number(readFileSync(join(lock, 'pid'), { encoding: 'utf8', flag: 'a+' }).trim());
  if (owner > 0) {
    try {
      process.kill(owner, 0);
      return true;
    } catch (error) {
      return (error as NodeJS.ErrnoException).code === 'EPERM';
    }
  }
  // Just taken, its id not written yet; or left by a build that died without one.
  return Date.now() - (statSync(lock, { throwIfNoEntry: false })?.mtimeMs ?? Date.now()) < 60_000;
}

/**
 * The folder of a complete build of the demo manual; builds it when the sources changed. Other test files wait
 * for a build in progress (its owner is alive) instead of starting a second one, however busy the machine is.
 */
export async function ensureBuiltSite(cwd = process.cwd()): Promise<{ dir: string; seconds: number | null }> {
  const dir = join(tmpdir(), `stepwright-e2e-site-${siteKey(cwd)}`);
  const lock = `${dir}.lock`;
  const deadline = Date.now() + 15 * 60_000;
  while (Date.now() < deadline) {
    if (existsSync(join(dir, 'index.html'))) return { dir, seconds: null };
    try {
      mkdirSync(lock);
      writeFileSync(join(lock, 'pid'), String(process.pid));
    } catch {
      let held = true;
      try {
        held = lockHeld(lock);
      } catch {
        // The lock went away while we looked: try again.
      }
      if (!held) rmSync(lock, { recursive: true, force: true });
      await sleep(500);
      continue;
    }
    try {
      if (existsSync(join(dir, 'index.html'))) return { dir, seconds: null };
      const started = performance.now();
      const run = spawnSync(process.execPath, ['bin/stepwright.mjs', 'build', '--out', dir], {
        cwd, encoding: 'utf8', env: { ...buildEnv(), NO_COLOR: '1' }, timeout: 15 * 60_000,
      });
      if (run.status !== 0) throw new Error(`The demo manual did not build (exit ${run.status}):\n${run.stdout}\n${run.stderr}`);
      return { dir, seconds: (performance.now() - started) / 1000 };
    } finally {
      rmSync(lock, { recursive: true, force: true });
    }
  }
  throw new Error('Timed out waiting for another test run to build the demo manual.');
}
