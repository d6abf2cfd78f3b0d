// Builds the demo manual and prints its build time and the weight of each procedure page
// (HTML plus the stylesheets and scripts it loads, search excluded), raw and gzip-compressed.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { record } from './results.ts';

const goalKb = 60;
const given = process.argv[2];
const site = given ?? join(mkdtempSync(join(tmpdir(), 'stepwright-bench-')), 'site');
let buildSeconds: number | undefined;
if (!given) {
  const started = performance.now();
  const run = spawnSync(process.execPath, ['bin/stepwright.mjs', 'build', '--out', site], { encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
  buildSeconds = (performance.now() - started) / 1000;
  if (run.status !== 0) {
    process.stderr.write(run.stdout + run.stderr);
    process.exit(1);
  }
}

/** Files a page loads on its own: stylesheets, scripts and images it links, never the search index. */
function assetsOf(html: string): string[] {
  const found = new Set<string>();
  for (const m of html.matchAll(/<link[^>]+rel="?(?:stylesheet|manifest|icon)"?[^>]*>/g)) {
    const href = /href="?([^" >]+)/.exec(m[0])?.[1];
    if (href) found.add(href);
  }
  for (const m of html.matchAll(/<script[^>]+src="?([^" >]+)/g)) found.add(m[1]);
  return [...found].filter((u) => u.startsWith('/') && !u.startsWith('/pagefind/'));
}

const pagesDir = join(site, 'procedures');
const rows = readdirSync(pagesDir).sort().map((slug) => {
  const htmlBytes = readFileSync(join(pagesDir, slug, 'index.html'));
  const files = [htmlBytes, ...assetsOf(htmlBytes.toString('utf8')).map((u) => join(site, u.split('?')[0])).filter(existsSync).map((f) => readFileSync(f))];
  const raw = files.reduce((n, f) => n + f.length, 0);
  const gz = files.reduce((n, f) => n + gzipSync(f).length, 0);
  return { slug, raw, gz, html: htmlBytes.length };
});
const kb = (n: number) => (n / 1024).toFixed(1);
for (const r of rows) console.log(`${r.slug.padEnd(26)} html ${kb(r.html).padStart(6)} KB   page ${kb(r.raw).padStart(6)} KB raw   ${kb(r.gz).padStart(5)} KB gzip`);
const worst = rows.reduce((a, b) => (b.gz > a.gz ? b : a));
console.log(`procedure page weight (largest, gzip as served): ${kb(worst.gz)} KB (${worst.slug}); goal <= ${goalKb} KB: ${worst.gz / 1024 <= goalKb ? 'met' : 'NOT met'}`);
console.log(`procedure page weight (largest, uncompressed): ${kb(Math.max(...rows.map((r) => r.raw)))} KB`);
record('page-weight/largest-demo-page-gzip', { value: Number(kb(worst.gz)), unit: 'KB', goal: `<= ${goalKb}`, met: worst.gz / 1024 <= goalKb, note: `${worst.slug}: HTML + CSS + JS it loads, gzip, no search` });
record('page-weight/largest-demo-page-raw', { value: Number(kb(Math.max(...rows.map((r) => r.raw)))), unit: 'KB', note: 'uncompressed' });
if (buildSeconds !== undefined) record('site/demo/full-build', { value: Number(buildSeconds.toFixed(2)), unit: 's', note: `${rows.length} demo procedures` });
if (buildSeconds !== undefined) console.log(`demo manual build (check + astro + pagefind): ${buildSeconds.toFixed(1)} s for ${rows.length} procedures`);
if (!given) rmSync(join(site, '..'), { recursive: true, force: true });
