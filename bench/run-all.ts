// Runs every benchmark in bench/ one after another (`npm run bench [-- --quick]`): the *.bench.ts files, then
// the demo site build, the scaled site builds, then the offline copy and its one-procedure update. Prints one summary and writes bench/results.json.
import { spawnSync } from 'node:child_process';
import { cpus, loadavg, tmpdir } from 'node:os';
import { writeReadmeTable } from './readme-table.ts';
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Figure } from './results.ts';

const here = import.meta.dirname;
const quick = process.argv.includes('--quick');
const scripts = readdirSync(here).filter((f) => f.endsWith('.bench.ts')).sort();
// The site benchmarks build whole sites, so they run last.
for (const last of ['check-scale.ts', 'manual-site.ts', 'site-scale.ts', 'offline-update.ts']) if (existsSync(join(here, last))) scripts.push(last);

// STEPWRIGHT_BENCH_ONLY=check-scale.ts,site-scale.ts runs only those scripts (figures of the others are absent).
const only = process.env.STEPWRIGHT_BENCH_ONLY?.split(',').map((s) => s.trim()).filter(Boolean);
if (only?.length) scripts.splice(0, scripts.length, ...scripts.filter((s) => only.includes(s)));
const scratch = mkdtempSync(join(tmpdir(), 'stepwright-bench-results-'));
const sink = join(scratch, 'figures.jsonl');
const runs: Record<string, { seconds: number; exitCode: number | null }> = {};
const started = performance.now();
const loadAtStart = loadavg().map((n) => Number(n.toFixed(2)));
let failed = 0;
// Each figure carries the time and the load of the script that measured it, so figures kept from an earlier
// partial run (STEPWRIGHT_BENCH_ONLY) still say when and how busy the machine was.
const stamps: Record<string, { at: string; loadAtStart: number[]; loadAtEnd: number[] }> = {};
const load = () => loadavg().map((n) => Number(n.toFixed(2)));
for (const script of scripts) {
  process.stdout.write(`\n### ${script}\n\n`);
  const t = performance.now();
  const stampStart = { at: new Date().toISOString(), loadAtStart: load() };
  // Quick mode goes by environment: some scripts take a folder as their first argument.
  const run = spawnSync(process.execPath, ['--import', 'tsx', join(here, script)], {
    stdio: 'inherit', env: { ...process.env, STEPWRIGHT_BENCH_RESULTS: sink, ...(quick ? { STEPWRIGHT_BENCH_QUICK: '1' } : {}) },
  });
  runs[script] = { seconds: Number(((performance.now() - t) / 1000).toFixed(1)), exitCode: run.status };
  stamps[script] = { ...stampStart, loadAtEnd: load() };
  if (run.status !== 0) failed++;
}

const figures: Record<string, Figure> = {};
if (existsSync(sink)) {
  for (const line of readFileSync(sink, 'utf8').split('\n').filter(Boolean)) {
    const { key, script, ...figure } = JSON.parse(line) as Figure & { key: string; script?: string };
    const stamp = script ? stamps[`${script}.ts`] : undefined;
    figures[key] = { ...figure, ...(script ? { script } : {}), ...(stamp ? { measured: stamp } : {}) };
  }
}
rmSync(scratch, { recursive: true, force: true });

// A partial run keeps the figures of the scripts it did not run from bench/results.json (each with its own
// time and load), so the README table never loses a measured row to a partial run.
const resultsPath = join(here, 'results.json');
let kept: { figures: Record<string, Figure>; scripts: Record<string, unknown> } = { figures: {}, scripts: {} };
if (only?.length && existsSync(resultsPath)) {
  try {
    const before = JSON.parse(readFileSync(resultsPath, 'utf8')) as { quick?: boolean; figures?: Record<string, Figure>; scripts?: Record<string, unknown> };
    // Figures this run measured again replace the old ones, key by key; the rest keep their own time and load.
    if (before.quick === quick) {
      kept = {
        figures: before.figures ?? {},
        scripts: Object.fromEntries(Object.entries(before.scripts ?? {}).filter(([name]) => !(name in runs))),
      };
    }
  } catch {
    // An unreadable results file is replaced.
  }
}
const results = {
  date: new Date().toISOString(),
  quick,
  machine: { cpus: cpus().length, cpu: cpus()[0]?.model, node: process.version, loadAtStart, loadAverage: loadavg().map((n) => Number(n.toFixed(2))) },
  totalSeconds: Number(((performance.now() - started) / 1000).toFixed(1)),
  scripts: { ...kept.scripts, ...runs },
  figures: { ...kept.figures, ...figures },
};
writeFileSync(resultsPath, `${JSON.stringify(results, null, 2)}\n`);
// The README's table of figures is regenerated from the same results (only by a full-size run).
if (!quick) writeReadmeTable(join(here, '..', 'README.md'), results);

const width = Math.max(...Object.keys(results.figures).map((k) => k.length), 10);
console.log(`\n### Summary${quick ? ' (quick sizes)' : ''}: ${Object.keys(results.figures).length} figures in ${results.totalSeconds} s on ${results.machine.cpus} cores (load ${results.machine.loadAverage.join(' ')})\n`);
for (const [key, f] of Object.entries(results.figures).sort(([a], [b]) => a.localeCompare(b))) {
  const goal = f.goal ? `  goal ${f.goal}: ${f.met === undefined ? '' : f.met ? 'met' : 'NOT met'}` : '';
  console.log(`${key.padEnd(width)}  ${String(f.value).padStart(9)} ${f.unit.padEnd(3)}${goal}`);
}
console.log(`\nWritten to bench/results.json${failed ? `; ${failed} benchmark(s) failed` : ''}.`);
process.exitCode = failed ? 1 : 0;
