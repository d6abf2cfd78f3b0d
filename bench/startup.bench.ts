// Start-up of whole processes, as a plant runs them: `stepwright --version`, `stepwright --help` and
// `stepwright check procedures` (the demo manual) against `node -e 0` on the same Node, median of 5 runs.
// The package as users get it: compiled to lib/ and laid out without src/, so the bin runs the JavaScript.
// The development checkout (TypeScript sources, stripped by Node at every start) is measured beside it.
// Figures, not assertions.
import { spawnSync } from 'node:child_process';
import { existsSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { record } from './results.ts';
import { layOutInstalledPackage } from './installed-package.ts';

const root = join(import.meta.dirname, '..');
const node = process.execPath;
const runs = 5;

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}

/**
 * Wall time (ms), CPU time of the whole process (user + system, ms, all its threads) and peak memory (MB), when
 * /usr/bin/time is there, of one process, median of `runs`. `extraEnv` may be a function: a fresh environment per run.
 */
function measure(args: string[], cwd = root, extraEnv: Record<string, string> | (() => Record<string, string>) = {}): { ms: number; cpuMs?: number; mb?: number; status: number | null } {
  const times: number[] = [];
  const memory: number[] = [];
  const cpu: number[] = [];
  let status: number | null = 0;
  const timer = existsSync('/usr/bin/time') ? '/usr/bin/time' : undefined;
  for (let i = 0; i < runs; i++) {
    const env = { ...process.env, STEPWRIGHT_TODAY: '2026-12-05', NO_COLOR: '1', ...(typeof extraEnv === 'function' ? extraEnv() : extraEnv) };
    const started = performance.now();
    const run = timer
      ? spawnSync(timer, ['-f', '%M %U %S', node, ...args], { cwd, encoding: 'utf8', env })
      : spawnSync(node, args, { cwd, encoding: 'utf8', env });
    times.push(performance.now() - started);
    status = run.status;
    const [kb, user, system] = timer ? (run.stderr.trim().split('\n').at(-1) ?? '').split(' ').map(Number) : [NaN, NaN, NaN];
    if (Number.isFinite(kb)) memory.push(kb / 1024);
    if (Number.isFinite(user) && Number.isFinite(system)) cpu.push((user + system) * 1000);
  }
  return { ms: median(times), ...(cpu.length ? { cpuMs: median(cpu) } : {}), ...(memory.length ? { mb: median(memory) } : {}), status };
}

// The package as installed.
const { folder: installed, bin: packaged } = layOutInstalledPackage(root, 'startup');
const warmCache = join(installed, 'result-cache');
const checkout = join(root, 'bin', 'stepwright.mjs');
// Node's compile cache (the bin turns it on; NODE_COMPILE_CACHE names its folder): the first run of the installed
// package has none and writes it; later runs read it. Cold rows are measured both ways.
const compileCaches = join(installed, 'compile-caches');
let freshCaches = 0;
const firstRun = () => ({ STEPWRIGHT_CACHE: 'off', NODE_COMPILE_CACHE: join(compileCaches, `first-${freshCaches++}`) });
const keptCompileCache = { NODE_COMPILE_CACHE: join(compileCaches, 'kept') };

try {
  const floor = measure(['-e', '0']);
  const rows: Array<[string, string, ReturnType<typeof measure>, string?]> = [
    ['startup/node-floor', 'node -e 0', floor],
    ['startup/version', 'stepwright --version (package)', measure([packaged, '--version']), '<= 200 ms'],
    ['startup/help', 'stepwright --help (package)', measure([packaged, '--help'])],
    // Cold: no result cache at all; first run: no compile cache either (each run its own empty folder); later runs:
    // the compile cache an earlier run left. Warm: the result cache the run before left (nothing changed since).
    ['startup/check-demo-first-run', 'stepwright check procedures (package, 13 files, cold, first run, no compile cache)', measure([packaged, 'check', 'procedures'], root, firstRun), '<= 1000 ms'],
    ['startup/check-demo', 'stepwright check procedures (package, 13 files, cold, compile cache of an earlier run)', (measure([packaged, '--version'], root, keptCompileCache), measure([packaged, 'check', 'procedures'], root, { STEPWRIGHT_CACHE: 'off', ...keptCompileCache }), measure([packaged, 'check', 'procedures'], root, { STEPWRIGHT_CACHE: 'off', ...keptCompileCache })), '<= 1000 ms'],
    ['startup/check-demo-warm', 'stepwright check procedures (package, warm cache)', (measure([packaged, 'check', 'procedures'], root, { STEPWRIGHT_CACHE: warmCache, ...keptCompileCache }), measure([packaged, 'check', 'procedures'], root, { STEPWRIGHT_CACHE: warmCache, ...keptCompileCache })), '<= 1000 ms'],
    ['startup/version-checkout', 'stepwright --version (checkout, TypeScript sources)', measure([checkout, '--version'])],
    ['startup/check-demo-checkout', 'stepwright check procedures (checkout, cold)', measure([checkout, 'check', 'procedures'], root, { STEPWRIGHT_CACHE: 'off' })],
  ];
  console.log(`Whole processes, median of ${runs}, on ${node} (${process.version}):\n`);
  console.log(`${'what'.padEnd(90)} ${'wall'.padStart(9)} ${'x floor'.padStart(8)} ${'cpu'.padStart(9)} ${'peak'.padStart(8)}`);
  for (const [key, label, m, goal] of rows) {
    const ratio = m.ms / floor.ms;
    console.log(`${label.padEnd(90)} ${`${Math.round(m.ms)} ms`.padStart(9)} ${ratio.toFixed(1).padStart(7)}x ${(m.cpuMs === undefined ? '' : `${Math.round(m.cpuMs)} ms`).padStart(9)} ${(m.mb ? `${Math.round(m.mb)} MB` : '').padStart(8)}${m.status ? `  (exit ${m.status})` : ''}${goal ? `  goal ${goal}` : ''}`);
    const limit = goal ? Number(goal.replace(/\D/g, '')) : undefined;
    record(key, { value: Math.round(m.ms), unit: 'ms', ...(goal ? { goal, met: m.ms <= limit! } : {}), note: `${label}; ${ratio.toFixed(1)}x node -e 0${m.cpuMs === undefined ? '' : `; CPU (user + system, all threads) ${Math.round(m.cpuMs)} ms`}${m.mb ? `; peak ${Math.round(m.mb)} MB` : ''}` });
    if (m.mb) record(`${key}-memory`, { value: Math.round(m.mb), unit: 'MB', note: `peak resident memory of ${label}` });
    // The same time as a multiple of starting Node itself, measured in the same run: what a busier or slower machine
    // changes less than the milliseconds.
    if (key !== 'startup/node-floor') record(`${key}-floor-ratio`, { value: Number(ratio.toFixed(1)), unit: 'x', note: `${label} against node -e 0 (${Math.round(floor.ms)} ms) in the same run` });
  }
  console.log('\nGoals are for a quiet 2-core machine; on a busy one compare the ratios to node -e 0.');
} finally {
  rmSync(installed, { recursive: true, force: true });
}
