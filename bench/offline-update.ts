// The offline copy at plant scale: builds a manual of 1,000 generated procedures in four areas, then builds it
// again with one procedure changed (title and one sentence) over the first build, as a plant republishes, and
// prints what a tablet keeps and what the one-procedure update costs it, against the whole copy.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync, cpSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { generateProcedure } from './generate-procedures.ts';
import { quick, record } from './results.ts';
import { formatBytes, updateCost, type OfflineFileList } from '../src/render/offline-manifest.ts';

const repo = join(import.meta.dirname, '..');
const count = Number(process.env.STEPWRIGHT_BENCH_OFFLINE_SIZE ?? (quick ? 200 : 1000));
const areas = ['area-east', 'area-north', 'area-south', 'area-west'];
const changed = 'GEN-0150';

function write(folder: string, edit: boolean): void {
  for (let i = 0; i < count; i++) {
    const p = generateProcedure(i + 1, 40);
    let text = i % 10 === 4 ? p.text.replace('kind: batch', 'kind: emergency') : p.text;
    if (edit && text.includes(`id: ${changed}\n`)) {
      text = text.replace(/^title: .*$/m, 'title: Generated batch procedure 150, second edition').replace('Generated for benchmarks.', 'Generated for benchmarks. Sample the batch twice.');
    }
    const file = join(folder, areas[i % areas.length], p.file.slice('generated/'.length));
    mkdirSync(dirname(file), { recursive: true });
    writeFileSync(file, text);
  }
}

function build(procedures: string, out: string): { seconds: number; report: string } {
  const started = performance.now();
  const run = spawnSync(process.execPath, ['bin/stepwright.mjs', 'build', procedures, '--out', out], {
    cwd: repo, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', ASTRO_TELEMETRY_DISABLED: '1', STEPWRIGHT_TODAY: '2026-12-05' }, maxBuffer: 64 * 1024 * 1024,
  });
  if (run.status !== 0) throw new Error(`build failed (exit ${run.status}):\n${run.stdout.slice(-3000)}\n${run.stderr.slice(-3000)}`);
  return { seconds: (performance.now() - started) / 1000, report: run.stdout.slice(run.stdout.indexOf('Offline copy:')) };
}

const work = mkdtempSync(join(tmpdir(), 'stepwright-bench-offline-'));
try {
  const procedures = join(work, 'procedures');
  write(procedures, false);
  const a = build(procedures, join(work, 'a'));
  write(procedures, true);
  cpSync(join(work, 'a'), join(work, 'b'), { recursive: true });
  const b = build(procedures, join(work, 'b'));
  const listA = JSON.parse(readFileSync(join(work, 'a', 'offline-files.json'), 'utf8')) as OfflineFileList;
  const listB = JSON.parse(readFileSync(join(work, 'b', 'offline-files.json'), 'utf8')) as OfflineFileList;
  const copyBytes = listB.files.reduce((n, f) => n + f.bytes, 0);
  const cost = updateCost(listA, listB);
  const chunks = listB.files.filter((f) => f.url.startsWith('pagefind/index/')).length;
  const changedChunks = cost.urls.filter((u) => u.startsWith('pagefind/index/')).length;
  const pages = cost.urls.filter((u) => !u.startsWith('pagefind/'));
  const worker = statSync(join(work, 'b', 'sw.js')).size;
  const list = statSync(join(work, 'b', 'offline-files.json')).size;
  const east = listB.files.filter((f) => !f.area || f.always || f.area === 'area-east');
  const eastBytes = east.reduce((n, f) => n + f.bytes, 0);

  console.log(`${count} generated procedures in ${areas.length} areas (builds ${a.seconds.toFixed(0)} s and ${b.seconds.toFixed(0)} s)\n`);
  console.log(b.report);
  console.log(`offline copy (whole manual):       ${listB.files.length} files, ${formatBytes(copyBytes)}`);
  console.log(`one area and the emergency ones:   ${east.length} files, ${formatBytes(eastBytes)}`);
  console.log(`one-procedure update:              ${cost.fetched} files, ${formatBytes(cost.fetchedBytes)} (${(100 * cost.fetchedBytes / copyBytes).toFixed(2)} % of the copy), ${cost.removed} deleted`);
  console.log(`  pages: ${pages.join(', ')}`);
  console.log(`  search index: ${cost.urls.length - pages.length} files, ${changedChunks} of ${chunks} index chunks`);
  console.log(`service worker ${formatBytes(worker)} (the same file every publication); file list ${formatBytes(list)}, read only when the version changed`);

  record(`offline/${count}/copy-files`, { value: listB.files.length, unit: 'n', note: 'files in the whole offline copy' });
  record(`offline/${count}/copy-size`, { value: Number((copyBytes / 1024 / 1024).toFixed(2)), unit: 'MB', note: 'bytes in the whole offline copy' });
  record(`offline/${count}/one-area-size`, { value: Number((eastBytes / 1024 / 1024).toFixed(2)), unit: 'MB', note: 'one of four areas + frame + every emergency procedure' });
  record(`offline/${count}/update-files`, { value: cost.fetched, unit: 'n', note: 'files a tablet downloads after one procedure changed' });
  record(`offline/${count}/update-size`, { value: Number((cost.fetchedBytes / 1024).toFixed(1)), unit: 'KB', note: `${pages.length} pages, ${cost.urls.length - pages.length} search files` });
  record(`offline/${count}/update-share`, { value: Number((100 * cost.fetchedBytes / copyBytes).toFixed(2)), unit: '%', goal: '< 5', met: cost.fetchedBytes / copyBytes < 0.05, note: 'of the whole copy; was 100 % before per-file updates' });
  record(`offline/${count}/index-chunks-changed`, { value: changedChunks, unit: 'n', note: `of ${chunks} pagefind index chunks` });
  record(`offline/${count}/worker-size`, { value: Number((worker / 1024).toFixed(1)), unit: 'KB' });
  record(`offline/${count}/file-list-size`, { value: Number((list / 1024).toFixed(1)), unit: 'KB' });
} finally {
  rmSync(work, { recursive: true, force: true });
}
