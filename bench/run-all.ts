// Runs every benchmark in bench/ one after another (`npm run bench`): the *.bench.ts files, then the site build.
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';

const here = import.meta.dirname;
const scripts = readdirSync(here).filter((f) => f.endsWith('.bench.ts')).sort();
// The manual-site benchmark builds the whole site, so it runs last.
if (existsSync(join(here, 'manual-site.ts'))) scripts.push('manual-site.ts');
let failed = 0;
for (const script of scripts) {
  process.stdout.write(`\n### ${script}\n\n`);
  const run = spawnSync(process.execPath, ['--import', 'tsx', join(here, script)], { stdio: 'inherit' });
  if (run.status !== 0) failed++;
}
process.exitCode = failed ? 1 : 0;
