// Builds the whole manual (check + Astro + pagefind) for 500 and 2,000 generated procedures, and a bare Astro
// site of the same content as plain markdown pages in the same run, and prints the ratio (goal <= 1.3x).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { parse } from 'yaml';
import { generateProcedures, type GeneratedProcedure } from './generate-procedures.ts';
import { quick, record } from './results.ts';

const repo = join(import.meta.dirname, '..');
const baselineRoot = join(import.meta.dirname, 'baseline-site');
const sizes = process.env.STEPWRIGHT_BENCH_SIZES?.split(',').map(Number) ?? (quick ? [100, 300] : [500, 2000]);
const goalRatio = 1.3;
const timeBinary = existsSync('/usr/bin/time') ? '/usr/bin/time' : undefined;

/** The same procedure as a plain markdown page: title, facts and the steps as nested lists. */
export function plainMarkdown(p: GeneratedProcedure): string {
  const end = p.text.indexOf('\n---\n', 4);
  const data = parse(p.text.slice(4, end)) as Record<string, unknown>;
  const lines: string[] = [];
  const list = (items: unknown[], indent: string) => {
    for (const item of items as Array<Record<string, unknown>>) {
      if ('parallel' in item) {
        lines.push(`${indent}- At the same time:`);
        for (const [name, branch] of Object.entries(item.parallel as Record<string, unknown[]>)) {
          lines.push(`${indent}  - ${name}:`);
          list(branch, `${indent}    `);
        }
      } else if ('choose' in item) {
        lines.push(`${indent}- Choose one:`);
        for (const b of item.choose as Array<Record<string, unknown>>) {
          lines.push(`${indent}  - ${b.otherwise ? 'Otherwise' : `When ${b.when}`}${b.goto ? `, go back to ${b.goto}` : ''}`);
          if (Array.isArray(b.steps)) list(b.steps, `${indent}    `);
        }
      } else {
        const ends = item.until ? `until ${item.until}` : item.confirm ? `confirm: ${item.confirm}` : '';
        lines.push(`${indent}- **${item.step}** ${item.do}${ends ? ` (${ends})` : ''}`);
      }
    }
  };
  list(data.steps as unknown[], '');
  const facts = [
    `Kind: ${data.kind}, revision ${data.revision}, ${data.status}. Owner: ${data.owner}.`,
    `Equipment: ${(data.equipment as string[]).join(', ')}. PPE: ${(data.ppe as string[]).join(', ')}.`,
    ...Object.entries(data.signals as Record<string, { text: string }>).map(([tag, s]) => `- ${tag}: ${s.text}`),
  ];
  return `---\ntitle: ${JSON.stringify(`${data.id} ${data.title}`)}\n---\n\n${facts.join('\n')}\n\n## Steps\n\n${lines.join('\n')}\n${p.text.slice(end + 5)}`;
}

/** Runs a command, timing it and taking its peak memory from /usr/bin/time when the machine has it. */
function run(command: string, args: string[], env: Record<string, string>, cwd = repo): { seconds: number; cpu?: number; peakMb?: number } {
  const started = performance.now();
  const argv = timeBinary ? [timeBinary, ['-f', 'peak-kb=%M cpu=%U+%S', command, ...args]] as const : [command, args] as const;
  const result = spawnSync(argv[0], argv[1], { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', ASTRO_TELEMETRY_DISABLED: '1', ...env }, maxBuffer: 64 * 1024 * 1024 });
  const seconds = (performance.now() - started) / 1000;
  if (result.status !== 0) throw new Error(`${command} ${args.join(' ')} failed (exit ${result.status}):\n${result.stdout.slice(-3000)}\n${result.stderr.slice(-3000)}`);
  const peak = /peak-kb=(\d+)/.exec(result.stderr)?.[1];
  // CPU time (user + system, children included): steadier than wall time on a busy shared machine.
  const cpu = /cpu=([\d.]+)\+([\d.]+)/.exec(result.stderr);
  return { seconds, cpu: cpu ? Number(cpu[1]) + Number(cpu[2]) : undefined, peakMb: peak ? Math.round(Number(peak) / 1024) : undefined };
}

function largestPage(site: string): { slug: string; raw: number; gzip: number } {
  let worst = { slug: '', raw: 0, gzip: 0 };
  const dir = join(site, 'procedures');
  for (const slug of readdirSync(dir)) {
    const file = join(dir, slug, 'index.html');
    if (!existsSync(file)) continue;
    const html = readFileSync(file);
    const assets = [...html.toString('utf8').matchAll(/<(?:link[^>]+rel="?stylesheet"?[^>]*href|script[^>]+src)="?([^" >]+)/g)]
      .map((m) => m[1]).filter((u) => u.startsWith('/') && !u.startsWith('/pagefind/')).map((u) => join(site, u.split('?')[0])).filter(existsSync);
    const files = [html, ...new Set(assets)].map((f) => (typeof f === 'string' ? readFileSync(f) : f));
    const gzip = files.reduce((n, f) => n + gzipSync(f).length, 0);
    if (gzip > worst.gzip) worst = { slug, raw: files.reduce((n, f) => n + f.length, 0), gzip };
  }
  return worst;
}

console.log(`Full manual build against a bare Astro build of the same pages${quick ? ' (quick sizes)' : ''}\n`);
for (const count of sizes) {
  const work = mkdtempSync(join(tmpdir(), `stepwright-bench-${count}-`));
  try {
    const procedures = generateProcedures(count, 40);
    for (const p of procedures) {
      const file = join(work, 'procedures', p.file);
      mkdirSync(dirname(file), { recursive: true });
      writeFileSync(file, p.text);
      const page = join(work, 'plain', p.file);
      mkdirSync(dirname(page), { recursive: true });
      writeFileSync(page, plainMarkdown(p));
    }
    // Cold builds: no content cache from an earlier run of the baseline.
    rmSync(join(baselineRoot, '.astro'), { recursive: true, force: true });
    rmSync(join(baselineRoot, 'node_modules'), { recursive: true, force: true });
    const bare = run(process.execPath, [join(repo, 'node_modules/astro/bin/astro.mjs'), 'build', '--root', baselineRoot, '--outDir', join(work, 'bare-site'), '--silent'],
      { BASELINE_CONTENT: join(work, 'plain') });
    const full = run(process.execPath, ['bin/stepwright.mjs', 'build', join(work, 'procedures'), '--out', join(work, 'site')], { STEPWRIGHT_TODAY: '2026-12-05', STEPWRIGHT_CACHE: join(work, 'cache') });
    // One procedure edited, the same folder built again into the same output (its cache from the build before).
    const edited = join(work, 'procedures', procedures[Math.floor(procedures.length / 2)].file);
    writeFileSync(edited, readFileSync(edited, 'utf8').replace('## Purpose', '## Purpose\n\nEdited for the rebuild benchmark.'));
    const rebuild = run(process.execPath, ['bin/stepwright.mjs', 'build', join(work, 'procedures'), '--out', join(work, 'site')], { STEPWRIGHT_TODAY: '2026-12-05', STEPWRIGHT_CACHE: join(work, 'cache') });
    const rebuildRatio = rebuild.seconds / full.seconds;
    const pages = readdirSync(join(work, 'site', 'procedures')).length;
    const barePages = readdirSync(join(work, 'bare-site', 'generated')).length;
    const ratio = full.seconds / bare.seconds;
    const page = largestPage(join(work, 'site'));
    console.log(`${count} procedures (${pages} procedure pages; bare site ${barePages} pages)`);
    console.log(`  full build (check + Astro + pagefind): ${full.seconds.toFixed(1)} s${full.peakMb ? `, peak ${full.peakMb} MB` : ''}`);
    console.log(`  bare Astro build of plain markdown:    ${bare.seconds.toFixed(1)} s${bare.peakMb ? `, peak ${bare.peakMb} MB` : ''}`);
    console.log(`  ratio: ${ratio.toFixed(2)}x (goal <= ${goalRatio}x: ${ratio <= goalRatio ? 'met' : 'NOT met'})`);
    if (full.cpu && bare.cpu) console.log(`  CPU time: full ${full.cpu.toFixed(1)} s, bare ${bare.cpu.toFixed(1)} s, ratio ${(full.cpu / bare.cpu).toFixed(2)}x`);
    if (full.peakMb && bare.peakMb) console.log(`  peak memory ratio: ${(full.peakMb / bare.peakMb).toFixed(2)}x (goal <= 1.5x)`);
    console.log(`  rebuild after editing one procedure: ${rebuild.seconds.toFixed(1)} s, ${rebuildRatio.toFixed(2)}x the full build (goal <= 0.3x)`);
    console.log(`  largest procedure page without search: ${(page.gzip / 1024).toFixed(1)} KB gzip, ${(page.raw / 1024).toFixed(1)} KB raw (${page.slug})\n`);
    record(`site/${count}/full-build`, { value: Number(full.seconds.toFixed(2)), unit: 's', note: 'stepwright build: check + Astro + pagefind + offline copy' });
    record(`site/${count}/bare-astro-build`, { value: Number(bare.seconds.toFixed(2)), unit: 's', note: 'bench/baseline-site: plain markdown pages, same content' });
    record(`site/${count}/ratio`, { value: Number(ratio.toFixed(2)), unit: 'x', goal: `<= ${goalRatio}`, met: ratio <= goalRatio });
    if (full.peakMb) record(`site/${count}/full-build-peak-memory`, { value: full.peakMb, unit: 'MB' });
    if (full.peakMb && bare.peakMb) record(`site/${count}/peak-memory-ratio`, { value: Number((full.peakMb / bare.peakMb).toFixed(2)), unit: 'x', goal: '<= 1.5', met: full.peakMb / bare.peakMb <= 1.5 });
    if (full.cpu && bare.cpu) record(`site/${count}/cpu-ratio`, { value: Number((full.cpu / bare.cpu).toFixed(2)), unit: 'x', goal: '<= 1.3', met: full.cpu / bare.cpu <= 1.3, note: `CPU seconds ${full.cpu.toFixed(1)} against ${bare.cpu.toFixed(1)}` });
    record(`site/${count}/rebuild-one-change`, { value: Number(rebuild.seconds.toFixed(2)), unit: 's', note: 'one procedure edited, built again into the same output' });
    record(`site/${count}/rebuild-ratio`, { value: Number(rebuildRatio.toFixed(2)), unit: 'x', goal: '<= 0.3', met: rebuildRatio <= 0.3, note: 'rebuild after one change / full build' });
    if (bare.peakMb) record(`site/${count}/bare-astro-peak-memory`, { value: bare.peakMb, unit: 'MB' });
    record(`site/${count}/largest-page-gzip`, { value: Number((page.gzip / 1024).toFixed(1)), unit: 'KB', goal: '<= 60', met: page.gzip / 1024 <= 60, note: `${page.slug}, HTML + CSS + JS, no search` });
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}
rmSync(join(baselineRoot, '.astro'), { recursive: true, force: true });
rmSync(join(baselineRoot, 'node_modules'), { recursive: true, force: true });
