// `stepwright check` of 1,001 procedures (the demo procedures copied 77 times, ids renamed per copy) as whole
// processes, against the floor of reading the same files and parsing their front-matter with positions
// (bench/floor-read.ts); interleaved, median of three. Cold (no cache), warm (cache from the run before), and after
// editing one file (the others answered by the cache; the cross-file rules read every file again). The cold check is
// measured from the development checkout (TypeScript sources) and from the package as a plant installs it.
// The copies sit next to a copy of the demo's plant register, as a plant keeps them, so the manual checks clean.
import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { quick, record } from './results.ts';
import { layOutInstalledPackage } from './installed-package.ts';

const repo = join(import.meta.dirname, '..');
const copies = quick ? 23 : 77;
const timeBinary = existsSync('/usr/bin/time') ? '/usr/bin/time' : undefined;

function demoFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name);
    return statSync(full).isDirectory() ? demoFiles(full) : name.endsWith('.md') ? [full] : [];
  });
}

/** Wall time, and CPU time (user + system) from /usr/bin/time: on a busy shared machine CPU time is the steadier figure. */
function run(args: string[], env: Record<string, string> = {}, cwd = repo): { seconds: number; cpu?: number; peakMb?: number; out: string } {
  const argv = timeBinary ? [timeBinary, '-f', 'peak-kb=%M cpu=%U+%S', process.execPath, ...args] : [process.execPath, ...args];
  const started = performance.now();
  const r = spawnSync(argv[0], argv.slice(1), { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', STEPWRIGHT_TODAY: '2026-12-05', ...env }, maxBuffer: 256 * 1024 * 1024 });
  const seconds = (performance.now() - started) / 1000;
  if (r.status !== 0 && r.status !== 1) throw new Error(`${args.join(' ')} failed (exit ${r.status}): ${r.stderr.slice(-2000)}`);
  const peak = /peak-kb=(\d+)/.exec(r.stderr)?.[1];
  const cpu = /cpu=([\d.]+)\+([\d.]+)/.exec(r.stderr);
  return { seconds, cpu: cpu ? Number(cpu[1]) + Number(cpu[2]) : undefined, peakMb: peak ? Math.round(Number(peak) / 1024) : undefined, out: r.stdout };
}
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

const work = mkdtempSync(join(tmpdir(), 'stepwright-bench-check-'));
const installed = layOutInstalledPackage(repo, 'check-scale');
try {
  const demo = demoFiles(join(repo, 'procedures'));
  for (let c = 1; c <= copies; c++) {
    mkdirSync(join(work, 'procedures', `copy-${c}`), { recursive: true });
    for (const file of demo) writeFileSync(join(work, 'procedures', `copy-${c}`, basename(file)), readFileSync(file, 'utf8').replaceAll('U2-', `U2C${c}-`));
  }
  const count = demo.length * copies;
  // The register is found as a plant keeps it: register/ in the working folder that holds the procedures.
  cpSync(join(repo, 'register'), join(work, 'register'), { recursive: true });
  const cache = join(work, 'cache');
  const floor: number[] = [];
  const cold: number[] = [];
  const coldInstalled: number[] = [];
  const warm: number[] = [];
  const edited: number[] = [];
  const cpu = { floor: [] as number[], cold: [] as number[], warm: [] as number[] };
  let peak = { floor: 0, cold: 0, warm: 0 };
  const check = [join(repo, 'bin', 'stepwright.mjs'), 'check', 'procedures', '--no-history', '--quiet'];
  const first = run(check, { STEPWRIGHT_CACHE: 'off' }, work);
  console.log(`  (the copies check with: ${first.out.trim().split('\n').at(-1)})`);
  for (let i = 0; i < 3; i++) {
    const f = run([join(import.meta.dirname, 'floor-read.ts'), join(work, 'procedures')]);
    const c = run(check, { STEPWRIGHT_CACHE: 'off' }, work);
    coldInstalled.push(run([installed.bin, ...check.slice(1)], { STEPWRIGHT_CACHE: 'off' }, work).seconds);
    rmSync(cache, { recursive: true, force: true });
    run(check, { STEPWRIGHT_CACHE: cache }, work);
    const w = run(check, { STEPWRIGHT_CACHE: cache }, work);
    // One procedure in the middle gets a sentence more, a different one each round.
    const middle = join(work, 'procedures', `copy-${Math.ceil(copies / 2)}`, basename(demo[i % demo.length]));
    writeFileSync(middle, readFileSync(middle, 'utf8').replace('## Purpose', `## Purpose\n\nEdited for the benchmark, round ${i + 1}.`));
    edited.push(run(check, { STEPWRIGHT_CACHE: cache }, work).seconds);
    cpu.floor.push(f.cpu ?? Number.NaN);
    cpu.cold.push(c.cpu ?? Number.NaN);
    cpu.warm.push(w.cpu ?? Number.NaN);
    floor.push(f.seconds);
    cold.push(c.seconds);
    warm.push(w.seconds);
    peak = { floor: Math.max(peak.floor, f.peakMb ?? 0), cold: Math.max(peak.cold, c.peakMb ?? 0), warm: Math.max(peak.warm, w.peakMb ?? 0) };
  }
  const [f, c, w] = [median(floor), median(cold), median(warm)];
  console.log(`check of ${count} procedures (${copies} copies of the demo), whole processes, median of 3`);
  console.log(`  floor: read + split + yaml with positions: ${f.toFixed(2)} s, peak ${peak.floor} MB`);
  console.log(`  check, cold (no cache):                    ${c.toFixed(2)} s, peak ${peak.cold} MB  (${(c / f).toFixed(2)}x floor; goal <= 2x and < 2 s)`);
  const ci = median(coldInstalled);
  console.log(`  check, cold, installed package:            ${ci.toFixed(2)} s  (${(ci / f).toFixed(2)}x floor)`);
  console.log(`  check, warm (cache from the run before):   ${w.toFixed(2)} s, peak ${peak.warm} MB  (${(w / f).toFixed(2)}x floor)`);
  const e = median(edited);
  console.log(`  check after editing one file (warm cache): ${e.toFixed(2)} s  (${(e / f).toFixed(2)}x floor)`);
  const [fc, cc, wc] = [median(cpu.floor), median(cpu.cold), median(cpu.warm)];
  console.log(`  CPU time (user + system): floor ${fc.toFixed(2)} s, cold ${cc.toFixed(2)} s (${(cc / fc).toFixed(2)}x), warm ${wc.toFixed(2)} s (${(wc / fc).toFixed(2)}x)`);
  if (Number.isFinite(cc)) {
    record(`check/${count}/cold-cpu-ratio`, { value: Number((cc / fc).toFixed(2)), unit: 'x', goal: '<= 2', met: cc / fc <= 2, note: `CPU seconds ${cc.toFixed(2)} against ${fc.toFixed(2)}: steadier than wall time on a shared machine` });
    record(`check/${count}/warm-cpu-ratio`, { value: Number((wc / fc).toFixed(2)), unit: 'x', goal: '<= 2', met: wc / fc <= 2, note: `CPU seconds ${wc.toFixed(2)} against ${fc.toFixed(2)}` });
  }
  record(`check/${count}/floor-read-parse`, { value: Number(f.toFixed(2)), unit: 's', note: 'read files, split front-matter, yaml parseDocument with a LineCounter; one process' });
  record(`check/${count}/cold`, { value: Number(c.toFixed(2)), unit: 's', goal: '< 2', met: c < 2, note: 'stepwright check --no-history, STEPWRIGHT_CACHE=off; one process' });
  record(`check/${count}/cold-ratio`, { value: Number((c / f).toFixed(2)), unit: 'x', goal: '<= 2', met: c / f <= 2, note: 'cold check / floor, same run' });
  record(`check/${count}/cold-installed`, { value: Number(ci.toFixed(2)), unit: 's', goal: '< 2', met: ci < 2, note: 'the same cold check from the package as installed (compiled, bundled)' });
  record(`check/${count}/cold-installed-ratio`, { value: Number((ci / f).toFixed(2)), unit: 'x', goal: '<= 2', met: ci / f <= 2, note: 'cold check of the installed package / floor, same run' });
  record(`check/${count}/warm`, { value: Number(w.toFixed(2)), unit: 's', goal: '< 2', met: w < 2, note: 'same check with the cache of the run before' });
  record(`check/${count}/warm-ratio`, { value: Number((w / f).toFixed(2)), unit: 'x', goal: '<= 2', met: w / f <= 2 });
  record(`check/${count}/one-edit`, { value: Number(e.toFixed(2)), unit: 's', note: 'one file edited, the cache of the run before for the others' });
  record(`check/${count}/one-edit-ratio`, { value: Number((e / f).toFixed(2)), unit: 'x', note: 'check after one edit / floor, same run' });
  record(`check/${count}/cold-peak-memory-ratio`, { value: Number((peak.cold / Math.max(1, peak.floor)).toFixed(2)), unit: 'x', note: `${peak.cold} MB against ${peak.floor} MB` });
} finally {
  rmSync(work, { recursive: true, force: true });
  rmSync(installed.folder, { recursive: true, force: true });
}
