// `--version`, `--help`, `help <command>` and `<command> --help` load only the command line itself: not the
// analysis, the units and language libraries, or the site stack. Checked on a whole process by listing every
// module it loads.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');
// Records the URL of every module the process loads and prints the list to stderr as it exits.
const hook = `data:text/javascript,${encodeURIComponent(`
import { registerHooks } from 'node:module';
const seen = [];
registerHooks({ resolve(specifier, context, next) { const r = next(specifier, context); seen.push(r.url); return r; } });
process.on('exit', () => process.stderr.write('\\nLOADED ' + JSON.stringify(seen) + '\\n'));
`)}`;

function loaded(args: string[]): string[] {
  const r = spawnSync(process.execPath, ['--import', hook, join(root, 'bin', 'stepwright.mjs'), ...args], { cwd: root, encoding: 'utf8', timeout: 60_000 });
  expect(r.status, r.stderr).toBe(0);
  const line = r.stderr.split('\n').find((l) => l.startsWith('LOADED '));
  return JSON.parse(line!.slice('LOADED '.length)) as string[];
}

describe('a light start', () => {
  for (const args of [['--version'], ['--help'], ['help', 'check'], ['check', '--help'], ['help', 'build'], ['new', '-h']]) {
    it(`stepwright ${args.join(' ')} loads no analysis, units, language or site modules`, () => {
      const urls = loaded(args);
      // The hook sees the command's own modules: without them the check below would pass for nothing.
      expect(urls.some((u) => u.endsWith('/src/cli/main.ts'))).toBe(true);
      const heavy = urls.filter((u) => /\/src\/(analysis|check|render|site|site-data|history)\/|\/node_modules\/(mathjs|compromise|astro|pagefind|remark-parse|unified|zod)\//.test(u));
      expect(heavy).toEqual([]);
    });
  }
});

// A check with no result cache starts the English model's load on a second thread; the main thread never loads it
// (it only looks the library's file up, to give the thread its path).
const loadHook = `data:text/javascript,${encodeURIComponent(`
import { registerHooks } from 'node:module';
import { isMainThread } from 'node:worker_threads';
const seen = [];
registerHooks({ load(url, context, next) { seen.push(url); return next(url, context); } });
if (isMainThread) process.on('exit', () => process.stderr.write('\\nLOADED ' + JSON.stringify(seen) + '\\n'));
`)}`;

describe('a cold check', () => {
  it('reads prose with the English model on its own thread, not in the main thread', () => {
    const r = spawnSync(process.execPath, ['--import', loadHook, join(root, 'bin', 'stepwright.mjs'), 'check', '--no-history', join(root, 'procedures', 'k-210-resin')], {
      cwd: root, encoding: 'utf8', timeout: 120_000, env: { ...process.env, STEPWRIGHT_CACHE: 'off', STEPWRIGHT_TODAY: '2026-12-01' },
    });
    expect(r.status, r.stderr).not.toBe(2);
    const lines = r.stderr.split('\n').filter((l) => l.startsWith('LOADED '));
    const main = lines.map((l) => JSON.parse(l.slice('LOADED '.length)) as string[]).find((urls) => urls.some((u) => u.endsWith('/src/cli/main.ts')));
    // The check ran its rules in this thread (the units library came in), and the model came from elsewhere.
    expect(main!.some((u) => /\/src\/check\/rules\//.test(u))).toBe(true);
    expect(main!.filter((u) => /\/node_modules\/compromise\//.test(u))).toEqual([]);
    expect(r.stdout).toMatch(/files? checked/);
  }, 120_000);
});
