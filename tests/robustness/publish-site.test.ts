// The output path holds a complete site at every instant: a reader polling it while another process publishes
// over and over never finds it missing or half-written, and a kill at any moment leaves a complete site (or one
// that start-up recovery puts back, which `verify` reports).
import { spawn, spawnSync } from 'node:child_process';
import { lstatSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, renameSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { describeSite, publishSite, recoverSite, replacedVersionKeptMs, startRetiring, versionsFolder } from '../../src/cli/publish-site.ts';

let dir: string;
beforeEach(() => (dir = mkdtempSync(join(tmpdir(), 'stepwright-publish-'))));
afterEach(() => rmSync(dir, { recursive: true, force: true }));

function stage(name: string, marker: string): string {
  const staged = join(dir, name);
  mkdirSync(join(staged, 'procedures'), { recursive: true });
  writeFileSync(join(staged, 'procedures', 'a.html'), `page ${marker}`);
  writeFileSync(join(staged, 'index.html'), `site ${marker}`);
  return staged;
}

/** A child that publishes `count` sites in a row, each complete before it is published. */
function publisher(out: string, count: number) {
  const module = join(import.meta.dirname, '../../src/cli/publish-site.ts');
  const script = `
    import { mkdirSync, writeFileSync } from 'node:fs';
    import { join } from 'node:path';
    const { publishSite } = await import(${JSON.stringify(module)});
    const out = ${JSON.stringify(out)};
    for (let i = 0; i < ${count}; i++) {
      const staged = out + '.tmp-' + process.pid;
      mkdirSync(join(staged, 'procedures'), { recursive: true });
      writeFileSync(join(staged, 'procedures', 'a.html'), 'page ' + i);
      writeFileSync(join(staged, 'index.html'), 'site ' + i);
      publishSite(staged, out);
      if (i === 0) process.stdout.write('first\\n');
    }`;
  const child = spawn(process.execPath, ['--input-type=module', '-e', script], { stdio: ['ignore', 'pipe', 'pipe'] });
  let stderr = '';
  child.stderr.on('data', (d) => (stderr += d));
  const first = new Promise<void>((resolve) => child.stdout.once('data', () => resolve()));
  const done = new Promise<{ code: number | null; signal: NodeJS.Signals | null; stderr: string }>((resolve) => child.on('close', (code, signal) => resolve({ code, signal, stderr })));
  return { child, first, done };
}

describe('publishing a site', () => {
  it('makes the output path a link to a complete version, and keeps the last two versions and those replaced moments ago', () => {
    const out = join(dir, 'site');
    for (let i = 0; i < 4; i++) publishSite(stage(`s${i}`, String(i)), out);
    expect(lstatSync(out).isSymbolicLink()).toBe(true);
    expect(readFileSync(join(out, 'index.html'), 'utf8')).toBe('site 3');
    // Replaced within the last seconds: a reader may still be on its way into any of them.
    expect(readdirSync(versionsFolder(out))).toHaveLength(4);
    expect(describeSite(out).text).toMatch(/site links to the published version site-/);
    // A publication once they were replaced long enough ago removes them, and keeps the one it replaced.
    publishSite(stage('s4', '4'), out, Date.now() + replacedVersionKeptMs + 1000);
    expect(readdirSync(versionsFolder(out))).toHaveLength(2);
    expect(readFileSync(join(out, 'index.html'), 'utf8')).toBe('site 4');
  });

  it('retires, on a thread, what a publication now would remove: never the version in use, the newest or one replaced moments ago', async () => {
    const out = join(dir, 'site');
    for (let i = 0; i < 4; i++) publishSite(stage(`s${i}`, String(i)), out);
    const versions = versionsFolder(out);
    const before = readdirSync(versions).sort();
    // Replaced moments ago: nothing goes.
    await startRetiring(out);
    expect(readdirSync(versions).sort()).toEqual(before);
    // What a kill left of a retired version (its build is gone) goes too; one of a running build is left to it.
    const dead = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' }).stdout;
    mkdirSync(join(versions, `retired-${dead}-site-000000000000001-1`, 'procedures'), { recursive: true });
    mkdirSync(join(versions, `retired-${process.ppid}-site-000000000000002-1`));
    // Later: every version but the newest, which the output path links to, goes; the site reads the same throughout.
    await startRetiring(out, Date.now() + replacedVersionKeptMs + 1000);
    expect(readdirSync(versions).sort()).toEqual([`retired-${process.ppid}-site-000000000000002-1`, before.at(-1)]);
    expect(readFileSync(join(out, 'index.html'), 'utf8')).toBe('site 3');
    // Never the version in use, even when it is not the newest.
    publishSite(stage('s5', '5'), out);
    const newest = readdirSync(versions).filter((n) => n.startsWith('site-')).sort().at(-1)!;
    rmSync(out);
    symlinkSync(join(`${out.split('/').at(-1)}.versions`, before.at(-1)!), out);
    await startRetiring(out, Date.now() + replacedVersionKeptMs + 1000);
    expect(readdirSync(versions).filter((n) => n.startsWith('site-')).sort()).toEqual([before.at(-1), newest]);
  });

  it('takes over an output folder from before links were used', () => {
    const out = join(dir, 'site');
    renameSync(stage('old', 'old'), out);
    publishSite(stage('new', 'new'), out);
    expect(readFileSync(join(out, 'index.html'), 'utf8')).toBe('site new');
  });

  it('a kill between moving the old folder aside and linking the new one is repaired at start-up, and verify says so', () => {
    const out = join(dir, 'site');
    publishSite(stage('a', 'a'), out);
    // The state such a kill leaves: complete versions, nothing at the output path.
    rmSync(out);
    expect(describeSite(out)).toMatchObject({ exists: false });
    expect(describeSite(out).text).toMatch(/a build was stopped while publishing/);
    expect(recoverSite(out)).toMatch(/put back/);
    expect(readFileSync(join(out, 'index.html'), 'utf8')).toBe('site a');
  });

  it('a reader never finds the output path missing or incomplete while another process publishes', async () => {
    const out = join(dir, 'site');
    publishSite(stage('first', 'first'), out);
    const run = publisher(out, 150);
    let reads = 0;
    const failures: string[] = [];
    let finished = false;
    void run.done.then(() => (finished = true));
    while (!finished) {
      try {
        const site = readFileSync(join(out, 'index.html'), 'utf8');
        const page = readFileSync(join(out, 'procedures', 'a.html'), 'utf8');
        if (!site.startsWith('site ') || !page.startsWith('page ')) failures.push(`odd content ${site} / ${page}`);
      } catch (error) {
        failures.push((error as Error).message);
      }
      reads++;
      await new Promise((r) => setImmediate(r));
    }
    const result = await run.done;
    expect(result.code, result.stderr).toBe(0);
    expect(reads).toBeGreaterThan(10);
    expect(failures).toEqual([]);
    expect(readFileSync(join(out, 'index.html'), 'utf8')).toBe('site 149');
  }, 60_000);

  it('after a SIGKILL at any moment of publishing, the output path holds a complete site', async () => {
    const out = join(dir, 'site');
    publishSite(stage('first', 'first'), out);
    for (let round = 0; round < 8; round++) {
      const run = publisher(out, 1000);
      await run.first;
      await new Promise((r) => setTimeout(r, 5 + round * 7));
      run.child.kill('SIGKILL');
      await run.done;
      recoverSite(out);
      expect(readFileSync(join(out, 'index.html'), 'utf8')).toMatch(/^site /);
      expect(readFileSync(join(out, 'procedures', 'a.html'), 'utf8')).toMatch(/^page /);
    }
  }, 60_000);
});
