// The package as a plant gets it: packed with `npm pack`, installed from the tarball into a new git repository
// of the plant's own, and run there with the installed bin on the plant's Node (>= 22.12; here the project's
// Node 24). Every procedure gets a page and the audit trail lists that repository's commits, not the tool's.
import { execFileSync, spawn, spawnSync, type SpawnSyncReturns } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { builtinModules } from 'node:module';
import { tmpdir } from 'node:os';
import { delimiter, dirname, join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ChildProcessWithoutNullStreams } from 'node:child_process';
import { launchChromium } from '../e2e/floor-fixture.ts';

const tool = join(import.meta.dirname, '..', '..');
const work = mkdtempSync(join(tmpdir(), 'stepwright-package-'));
const plant = join(work, 'plant');
// The plant's Node and npm: the project's Node 24 first on the PATH; without what the test runner adds.
const env: NodeJS.ProcessEnv = { ...process.env, PATH: [dirname(process.execPath), join(tool, 'node_modules', '.bin'), process.env.PATH].join(delimiter), NO_COLOR: '1' };
for (const key of Object.keys(env)) if (/^(NODE_ENV|DEV|PROD|MODE|SSR|BASE_URL|TEST|VITEST.*|npm_.*|INIT_CWD|STEPWRIGHT_.*)$/.test(key)) delete env[key];
const author = { GIT_AUTHOR_NAME: 'Plant Engineer', GIT_AUTHOR_EMAIL: 'engineer@alder-reach.example', GIT_COMMITTER_NAME: 'Plant Engineer', GIT_COMMITTER_EMAIL: 'engineer@alder-reach.example' };

function run(command: string, args: string[], cwd: string, timeout = 240_000): SpawnSyncReturns<string> {
  return spawnSync(command, args, { cwd, env, encoding: 'utf8', timeout });
}
function ok(result: SpawnSyncReturns<string>): string {
  if (result.status !== 0) throw new Error(`exit ${result.status}:\n${result.stdout}\n${result.stderr}`);
  return result.stdout;
}
const git = (args: string[], date: string) => execFileSync('git', args, { cwd: plant, env: { ...env, ...author, GIT_AUTHOR_DATE: `${date}T09:00:00Z`, GIT_COMMITTER_DATE: `${date}T09:00:00Z` }, encoding: 'utf8' });
const stepwright = (args: string[]) => run(join(plant, 'node_modules', '.bin', 'stepwright'), args, plant);

const unloading = readFileSync(join(tool, 'procedures', 'unloading', 'u2-unl-xyl-001.md'), 'utf8');
const nitrogen = readFileSync(join(tool, 'procedures', 'utilities', 'u2-n2-su-001.md'), 'utf8');

let tarball = '';

beforeAll(() => {
  // The tarball, made the way a release is made (prepack compiles the TypeScript into lib/).
  ok(run('npm', ['pack', '--pack-destination', work], tool, 300_000));
  tarball = join(work, readdirSync(work).find((f) => f.endsWith('.tgz'))!);

  mkdirSync(join(plant, 'procedures', 'utilities'), { recursive: true });
  execFileSync('git', ['init', '-q', '-b', 'main'], { cwd: plant, env });
  writeFileSync(join(plant, 'package.json'), `${JSON.stringify({ name: 'alder-reach-unit-2-procedures', private: true }, null, 2)}\n`);
  // The unloading procedure committed at two revisions; the nitrogen procedure once; a README.md beside them,
  // which is not a procedure and must be skipped with an info line, never an error.
  writeFileSync(join(plant, 'procedures', 'README.md'), '# Unit 2 procedures\n\nOne file per procedure; see the site for the manual.\n');
  writeFileSync(join(plant, 'procedures', 'u2-unl-xyl-001.md'), unloading.replace(/^revision: \d+$/m, 'revision: 5').replace('Unloading xylene', 'Unloading of xylene'));
  git(['add', '-A'], '2026-03-01');
  git(['commit', '-q', '-m', 'Unloading procedure, revision 5'], '2026-03-01');
  writeFileSync(join(plant, 'procedures', 'u2-unl-xyl-001.md'), unloading);
  writeFileSync(join(plant, 'procedures', 'utilities', 'u2-n2-su-001.md'), nitrogen);
  // The plant's register of chemicals, which the unloading procedure names under 'uses'.
  mkdirSync(join(plant, 'register'));
  writeFileSync(join(plant, 'register', 'chemicals.yaml'), readFileSync(join(tool, 'register', 'chemicals.yaml'), 'utf8'));
  git(['add', '-A'], '2026-04-01');
  git(['commit', '-q', '-m', 'Unloading procedure, revision 6; nitrogen start-up'], '2026-04-01');

  ok(run('npm', ['install', '--save-dev', '--prefer-offline', '--no-audit', '--no-fund', tarball], plant, 300_000));
}, 600_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

// Whole processes on a shared machine: each step gets room.
describe('the packed package in a plant repository', { timeout: 300_000 }, () => {
  it('ships compiled JavaScript and the site, but no TypeScript sources, tests, bench or fixtures', () => {
    const installed = join(plant, 'node_modules', 'stepwright');
    const files = readdirSync(installed, { recursive: true }).map(String);
    expect(files.some((f) => f.startsWith('lib/cli/') && f.endsWith('.js'))).toBe(true);
    expect(files.some((f) => f.startsWith('lib/site/pages/') && f.endsWith('.astro'))).toBe(true);
    expect(files.filter((f) => /^(src|tests|bench)\//.test(f) || f.endsWith('.ts'))).toEqual([]);
    const manifest = JSON.parse(readFileSync(join(installed, 'package.json'), 'utf8'));
    expect(manifest.engines.node).toBe('>=22.12.0');
    expect(Object.keys(manifest.dependencies)).not.toContain('tsx');
    // The check command is one file with the libraries it imports (the English model and mathjs are loaded on first
    // use, from node_modules); their licences are shipped beside it.
    const bundle = readFileSync(join(installed, 'lib', 'cli', 'check-command.js'), 'utf8');
    const imported = [...bundle.matchAll(/^import\s[^'"]*?from\s*['"]([^'"]+)['"]/gm)].map((m) => m[1]);
    expect(imported.filter((name) => !name.startsWith('node:') && !builtinModules.includes(name))).toEqual([]);
    expect(imported.length).toBeGreaterThan(0);
    // zod's messages in English only (scripts/compile.mjs): none of its other languages is in the bundle.
    // (esbuild names each module by its path from the project, ../ first when node_modules is a link elsewhere.)
    const locales = bundle.match(/^\/\/ \S*node_modules\/zod\/v4\/locales\/\S+/gm)?.map((line) => line.replace(/^.*node_modules\//, ''));
    expect(locales?.sort()).toEqual(['zod/v4/locales/en.js', 'zod/v4/locales/index.js']);
    const licences = readFileSync(join(installed, 'lib', 'cli', 'check-command.LICENSES.txt'), 'utf8');
    for (const library of ['yaml', 'zod', 'micromark', '@babel/code-frame']) expect(licences).toMatch(new RegExp(`^${library} \\d+\\.\\d+\\.\\d+ \\(`, 'm'));
    // So is the code a large check's reading thread loads, with the libraries it reads front-matter and markdown with.
    const threadCode = readFileSync(join(installed, 'lib', 'read', 'read-on-thread.js'), 'utf8');
    const threadImports = [...threadCode.matchAll(/^import\s[^'"]*?from\s*['"]([^'"]+)['"]/gm)].map((m) => m[1]);
    expect(threadImports.filter((name) => !name.startsWith('node:') && !builtinModules.includes(name))).toEqual([]);
    expect(threadCode).toMatch(/export\s*\{[^}]*\breadOnThread\b/);
    const threadLicences = readFileSync(join(installed, 'lib', 'read', 'read-on-thread.LICENSES.txt'), 'utf8');
    for (const library of ['yaml', 'js-yaml', 'zod', 'micromark']) expect(threadLicences).toMatch(new RegExp(`^${library} \\d+\\.\\d+\\.\\d+ \\(`, 'm'));
    // And it reads a procedure as the check does: its data, and what the schema finds (a key it does not know).
    const script = `import { deserialize } from 'node:v8';
      const { readOnThread } = await import(${JSON.stringify(join(installed, 'lib', 'read', 'read-on-thread.js'))});
      const [bytes, , issues] = readOnThread('p.md', ${JSON.stringify(unloading.replace(/^id: /m, 'colour: red\nid: '))});
      console.log(JSON.stringify({ id: deserialize(bytes).data.id, issues: issues.map((i) => i.code + ' ' + i.path.join('.')) }));`;
    const read = run(process.execPath, ['--input-type=module', '-e', script], plant);
    expect(read.stderr).toBe('');
    expect(JSON.parse(read.stdout)).toEqual({ id: 'U2-UNL-XYL-001', issues: ['unknown-key colour'] });
  });

  it('init adds config, ignore entries, editor settings and a workflow, and leaves the procedures alone', () => {
    const out = ok(stepwright(['init']));
    expect(out).toContain('stepwright.config.yaml');
    expect(out).toMatch(/Left as they are[\s\S]*procedures\/ \(already holds procedures/);
    expect(existsSync(join(plant, '.github', 'workflows', 'procedures.yml'))).toBe(true);
    expect(readFileSync(join(plant, 'procedures', 'u2-unl-xyl-001.md'), 'utf8')).toBe(unloading);
  });

  it('check and review --base work on the plant repository', () => {
    const check = stepwright(['check']);
    expect(check.stdout).toMatch(/0 errors/);
    expect(check.stdout).toMatch(/README\.md.*not-a-procedure|not-a-procedure.*README\.md/);
    expect(check.status).toBe(0);
    // A setting the user must fix is said as such (exit 2, how to fix it), not as a fault of the tool, from the
    // bundled check command too.
    const badDate = spawnSync(join(plant, 'node_modules', '.bin', 'stepwright'), ['check'], { cwd: plant, env: { ...env, STEPWRIGHT_TODAY: '2030-1-1' }, encoding: 'utf8' });
    expect(badDate.status).toBe(2);
    expect(badDate.stderr).toContain("stepwright check: STEPWRIGHT_TODAY is '2030-1-1', which needs two digits for the month and the day");
    expect(badDate.stderr).not.toContain('internal failure');
    const review = stepwright(['review', '--base', 'HEAD~1']);
    expect(review.stderr).toBe('');
    expect(review.stdout).toContain('U2-UNL-XYL-001');
    expect(review.stdout).toMatch(/5\D+6/);
  });

  it('build writes a page for every procedure and an audit trail from this repository; verify and serve work', async () => {
    const build = stepwright(['build']);
    expect(build.stderr).toBe('');
    expect(build.status).toBe(0);
    for (const slug of ['u2-unl-xyl-001', 'u2-n2-su-001']) expect(existsSync(join(plant, 'dist', 'procedures', slug, 'index.html'))).toBe(true);
    const audit = readFileSync(join(plant, 'dist', 'procedures', 'u2-unl-xyl-001', 'audit', 'index.html'), 'utf8');
    const commits = execFileSync('git', ['log', '--format=%h', '--', 'procedures/u2-unl-xyl-001.md'], { cwd: plant, encoding: 'utf8' }).trim().split('\n');
    expect(commits).toHaveLength(2);
    for (const commit of commits) expect(audit).toContain(commit);
    expect(audit).not.toMatch(/uncommitted/i);
    const verify = stepwright(['verify', 'dist']);
    expect(verify.stdout).toContain('0 changed, 0 added, 0 missing');
    expect(verify.stdout).toContain('All 2 procedure pages match their sources.');
    expect(verify.stdout).toContain('1 markdown file in procedures is not a procedure and needs no page.');
    expect(verify.status).toBe(0);

    const server = spawn(join(plant, 'node_modules', '.bin', 'stepwright'), ['serve', '--port', '0', '--host', '127.0.0.1'], { cwd: plant, env });
    try {
      const url = (await servedAt(server)).replace(/\/$/, '');
      for (const path of ['/', '/procedures/u2-unl-xyl-001/', '/procedures/u2-n2-su-001/', '/procedures/u2-unl-xyl-001/audit/']) {
        const response = await fetch(`${url}${path}`);
        expect(response.status, path).toBe(200);
      }
    } finally {
      server.kill('SIGTERM');
    }
  });

  it('a build under /manual/ works in Chromium there: home, a procedure, search, and the offline copy after a reload', async () => {
    const build = stepwright(['build', '--base', '/manual/', '--out', 'dist-manual']);
    expect(build.stderr).toBe('');
    expect(build.status).toBe(0);
    // No page links outside /manual/ (the build refuses such a site; checked here on its own terms too).
    const site = join(plant, 'dist-manual');
    const pages = readdirSync(site, { recursive: true }).map(String).filter((f) => f.endsWith('.html'));
    expect(pages.length).toBeGreaterThan(5);
    for (const page of pages) {
      const html = readFileSync(join(site, page), 'utf8');
      expect([...html.matchAll(/\b(?:href|src|action)="(\/(?!manual\/)[^"]*)"/g)].map((m) => m[1]), page).toEqual([]);
    }

    // serve takes the base the build recorded for the site.
    const server = spawn(join(plant, 'node_modules', '.bin', 'stepwright'), ['serve', '--dir', 'dist-manual', '--port', '0', '--host', '127.0.0.1'], { cwd: plant, env });
    const browser = await launchChromium();
    try {
      const url = await servedAt(server);
      expect(new URL(url).pathname).toBe('/manual/');
      const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
      const page = await context.newPage();
      await page.goto(url);
      await expect(page.locator('h1').textContent()).resolves.toBe('Procedures');

      // The offline copy: the service worker's scope is the base, and the copy is saved from there.
      await page.waitForFunction(() => navigator.serviceWorker.controller !== null, undefined, { timeout: 30_000 });
      const worker = await page.evaluate(async () => ({ scope: (await navigator.serviceWorker.ready).scope, script: navigator.serviceWorker.controller!.scriptURL }));
      expect(new URL(worker.scope).pathname).toBe('/manual/');
      expect(new URL(worker.script).pathname).toBe('/manual/sw.js');
      await expect.poll(() => page.locator('[data-offline-status]').textContent(), { timeout: 60_000 }).toMatch(/^Offline copy: manual of \d{4}-\d\d-\d\d, saved/);

      // A procedure, from the home page's own link.
      await page.locator('a[href$="/procedures/u2-n2-su-001/"]').first().click();
      await page.waitForURL(/\/manual\/procedures\/u2-n2-su-001\/$/);
      await expect(page.locator('h1').textContent()).resolves.toContain('U2-N2-SU-001');
      for (const href of await page.locator('a[href^="/"]').evaluateAll((as) => as.map((a) => a.getAttribute('href')!))) expect(href.startsWith('/manual/'), href).toBe(true);

      // Search finds a procedure and links to it under the base.
      await page.locator('nav a', { hasText: 'Search' }).click();
      await page.waitForURL(/\/manual\/search\/$/);
      await page.locator('#search-input').fill('xylene');
      const results = page.locator('#search-results a');
      await expect.poll(() => results.count(), { timeout: 20_000 }).toBeGreaterThan(0);
      const found = await results.evaluateAll((as) => as.map((a) => new URL((a as HTMLAnchorElement).href).pathname));
      expect(found).toContain('/manual/procedures/u2-unl-xyl-001/');

      // The server gone and the browser offline, the procedure still opens and reloads from the offline copy.
      server.kill('SIGTERM');
      await context.setOffline(true);
      await page.goto(new URL('/manual/procedures/u2-unl-xyl-001/', url).href);
      await expect(page.locator('h1').textContent()).resolves.toContain('U2-UNL-XYL-001');
      await page.reload();
      await expect(page.locator('h1').textContent()).resolves.toContain('U2-UNL-XYL-001');
      await context.close();
    } finally {
      await browser.close();
      server.kill('SIGTERM');
    }
  });

  it('dev previews the plant\'s procedures, shows a saved edit, stops cleanly, and writes nothing into the installed package', async () => {
    const installed = join(plant, 'node_modules', 'stepwright');
    const before = readdirSync(installed, { recursive: true }).map(String).sort();
    const file = join(plant, 'procedures', 'utilities', 'u2-n2-su-001.md');
    const committed = readFileSync(file, 'utf8');
    const dev = spawn(join(plant, 'node_modules', '.bin', 'stepwright'), ['dev', '--port', '0', '--host', '127.0.0.1'], { cwd: plant, env });
    let stderr = '';
    dev.stderr.on('data', (chunk) => { stderr += chunk; });
    try {
      const url = await servedAt(dev);
      const home = await fetch(url);
      expect(home.status).toBe(200);
      expect(await home.text()).toContain('U2-UNL-XYL-001');
      const pageUrl = new URL('procedures/u2-n2-su-001/', url).href;
      expect(await (await fetch(pageUrl)).text()).not.toContain('as edited in the preview');
      // An edit saved while the preview runs shows on the next request.
      writeFileSync(file, committed.replace(/^title: (.*)$/m, 'title: $1 as edited in the preview'));
      await expect.poll(async () => (await fetch(pageUrl)).text(), { timeout: 60_000, interval: 1000 }).toContain('as edited in the preview');
      const exited = new Promise<number | null>((resolve) => dev.on('exit', (code) => resolve(code)));
      dev.kill('SIGTERM');
      expect(await exited).toBe(0);
      expect(stderr).not.toMatch(/error/i);
    } finally {
      dev.kill('SIGKILL');
      writeFileSync(file, committed);
    }
    // Astro's own files (.astro/, caches) went into the plant's .stepwright/, not into the package.
    expect(readdirSync(installed, { recursive: true }).map(String).sort()).toEqual(before);
    expect(existsSync(join(plant, '.stepwright', 'dev', '.astro'))).toBe(true);
  });

  it('npx runs dev in a repository that has no node_modules of its own', async () => {
    // A plant that tries the tool once: nothing installed in its repository, the package fetched by npx.
    const once = join(work, 'once');
    mkdirSync(join(once, 'procedures'), { recursive: true });
    execFileSync('git', ['init', '-q', '-b', 'main'], { cwd: once, env });
    writeFileSync(join(once, 'procedures', 'u2-n2-su-001.md'), nitrogen);
    const dev = spawn('npm', ['exec', '--yes', '--prefer-offline', `--package=${tarball}`, '--', 'stepwright', 'dev', '--port', '0', '--host', '127.0.0.1'], { cwd: once, env, detached: true });
    // npm runs the bin as its own child: signals go to the whole group, so no preview outlives the test.
    const signal = (name: NodeJS.Signals) => { try { process.kill(-dev.pid!, name); } catch { /* already gone */ } };
    let stderr = '';
    dev.stderr.on('data', (chunk) => { stderr += chunk; });
    try {
      const url = await servedAt(dev).catch((error: Error) => { throw new Error(`${error.message}\n${stderr}`); });
      // Before the fix the server listened but every page request waited for ever.
      const page = await fetch(new URL('procedures/u2-n2-su-001/', url), { signal: AbortSignal.timeout(150_000) });
      expect(page.status).toBe(200);
      expect(await page.text()).toContain('U2-N2-SU-001');
      const exited = new Promise<number | null>((resolve) => dev.on('exit', (code) => resolve(code)));
      signal('SIGTERM');
      await exited;
    } finally {
      signal('SIGKILL');
    }
    expect(existsSync(join(once, 'node_modules'))).toBe(false);
  });

  it('npx builds the manual in a repository that has no node_modules of its own', () => {
    // Before the fix: "Cannot find package … imported from …/dist.tmp-…/.prerender/chunks/…", no site.
    const once = join(work, 'once-build');
    mkdirSync(join(once, 'procedures'), { recursive: true });
    execFileSync('git', ['init', '-q', '-b', 'main'], { cwd: once, env });
    writeFileSync(join(once, 'procedures', 'u2-n2-su-001.md'), nitrogen);
    const built = run('npm', ['exec', '--yes', '--prefer-offline', `--package=${tarball}`, '--', 'stepwright', 'build'], once);
    expect(built.status, `${built.stdout}\n${built.stderr}`).toBe(0);
    expect(readFileSync(join(once, 'dist', 'procedures', 'u2-n2-su-001', 'index.html'), 'utf8')).toContain('U2-N2-SU-001');
    expect(existsSync(join(once, 'node_modules'))).toBe(false);
  });
});

/** The URL `stepwright serve` says it serves on. */
function servedAt(server: ChildProcessWithoutNullStreams): Promise<string> {
  return new Promise<string>((resolve, reject) => {
    let seen = '';
    server.stdout.on('data', (chunk) => {
      seen += chunk;
      const m = /on (http:\/\/\S+) \(/.exec(seen);
      if (m) resolve(m[1]);
    });
    server.on('exit', (code) => reject(new Error(`serve exited ${code}: ${seen}`)));
  });
}
