// A rebuild takes over the pages of procedures an edit does not reach, and its site is byte for byte the site a
// build from nothing makes of the same sources: a kept page never shows what its sources no longer say.
import { createHash } from 'node:crypto';
import { appendFileSync, cpSync, existsSync, readdirSync, readFileSync, readlinkSync, renameSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { basename, join, relative } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { repo } from './run-build.ts';
import { tempFolder } from '../temp-folder.ts';

/** Path → SHA-256 of every file under a folder (through the output's link to its version folder). */
function snapshot(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  const walk = (d: string) => {
    for (const name of readdirSync(d).sort()) {
      const full = join(d, name);
      if (statSync(full).isDirectory()) walk(full);
      else out[relative(dir, full)] = createHash('sha256').update(readFileSync(full)).digest('hex');
    }
  };
  walk(dir);
  return out;
}

function differences(a: Record<string, string>, b: Record<string, string>): string[] {
  return [...new Set([...Object.keys(a), ...Object.keys(b)])].sort().filter((k) => a[k] !== b[k]);
}

/** `stepwright build procedures --out <out>` in the plant folder, as a user runs it. */
function build(cwd: string, out: string, cache: string): string {
  const run = spawnSync(process.execPath, [join(repo, 'bin', 'stepwright.mjs'), 'build', 'procedures', '--out', out], {
    cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', STEPWRIGHT_TODAY: '2026-12-01', STEPWRIGHT_CACHE: cache },
  });
  if (run.status !== 0) throw new Error(`build failed (${run.status}):\n${run.stdout}\n${run.stderr}`);
  return run.stdout;
}

/**
 * Makes every published version of an output look `ms` older (its name holds its time), the output path pointing at
 * the same one: a build removes a version only once the next one replaced it some seconds ago. Renaming a folder
 * leaves the files in it as they are (inode, times), so the page record stays true.
 */
function ageVersions(out: string, ms: number): void {
  const versions = `${out}.versions`;
  const linked = basename(readlinkSync(out));
  for (const name of readdirSync(versions).sort()) {
    const [, time, pid] = /^site-(\d{15})-(\d+)$/.exec(name)!;
    const older = `site-${String(Number(time) - ms).padStart(15, '0')}-${pid}`;
    renameSync(join(versions, name), join(versions, older));
    if (name === linked) {
      symlinkSync(join(basename(versions), older), `${out}.link-test`, 'dir');
      renameSync(`${out}.link-test`, out);
    }
  }
}

const kept = (stdout: string) => Number(/Pages: (\d+) procedures? unchanged since the last build kept/.exec(stdout)?.[1] ?? NaN);
const inode = (file: string) => statSync(file).ino;

describe('a rebuild after an edit', () => {
  let plant: string;
  const page = (slug: string) => join(plant, 'site', 'procedures', slug, 'index.html');

  beforeAll(() => {
    // The demo manual with its register: calls, a required procedure, a temporary procedure over two others.
    plant = tempFolder('stepwright-page-reuse-');
    cpSync(join(repo, 'procedures'), join(plant, 'procedures'), { recursive: true });
    cpSync(join(repo, 'register'), join(plant, 'register'), { recursive: true });
    const first = build(plant, 'site', 'cache');
    // No record yet: nothing to say about pages kept.
    expect(first).not.toMatch(/Pages:/);
  }, 180_000);

  it('draws again what the edit reaches (callers, procedures that require it or show its title) and keeps the rest', () => {
    const before = { inert: inode(page('u2-k210-inert-001')), caller: inode(page('u2-k210-tar-su-001')), other: inode(page('u2-unl-xyl-001')) };
    const tagPages = () => readdirSync(join(plant, 'site', 'tags')).map((tag) => join(plant, 'site', 'tags', tag, 'index.html')).filter((f) => existsSync(f));
    const tagsBefore = new Map(tagPages().map((f) => [f, inode(f)]));
    const rulePage = join(plant, 'site', 'rules', 'missing-front-matter', 'index.html');
    const ruleBefore = inode(rulePage);
    // A step of a called, required procedure, and the title of the temporary procedure that modifies two others.
    const inert = join(plant, 'procedures', 'k-210-resin', 'u2-k210-inert-001.md');
    const text = readFileSync(inert, 'utf8');
    const step = /\n(\s+)do: (.+)\n/.exec(text)!;
    writeFileSync(inert, text.replace(step[0], `\n${step[1]}do: ${step[2]} Edited for the rebuild.\n`));
    const temporary = join(plant, 'procedures', 't-230-blending', 'u2-t230-tmp-001.md');
    writeFileSync(temporary, readFileSync(temporary, 'utf8').replace(/\ntitle: (.+)\n/, '\ntitle: $1 (retitled)\n'));

    const rebuilt = build(plant, 'site', 'cache');
    expect(kept(rebuilt)).toBeGreaterThan(0);
    expect(kept(rebuilt)).toBeLessThan(13);
    expect(inode(page('u2-k210-inert-001'))).not.toBe(before.inert);
    expect(inode(page('u2-k210-tar-su-001'))).not.toBe(before.caller);
    expect(inode(page('u2-unl-xyl-001'))).toBe(before.other);
    expect(readFileSync(page('u2-k210-inert-001'), 'utf8')).toContain('Edited for the rebuild.');
    // The tag pages that show the edited step are drawn again; the others, and the rule pages, are kept.
    const showingEdit = tagPages().filter((f) => readFileSync(f, 'utf8').includes('Edited for the rebuild.'));
    expect(showingEdit.length).toBeGreaterThan(0);
    for (const f of showingEdit) expect(inode(f)).not.toBe(tagsBefore.get(f));
    expect(tagPages().filter((f) => inode(f) === tagsBefore.get(f)).length).toBeGreaterThan(tagsBefore.size / 2);
    expect(inode(rulePage)).toBe(ruleBefore);

    // The same sources built with no cache and no last site.
    build(plant, 'clean', 'off');
    expect(differences(snapshot(join(plant, 'site')), snapshot(join(plant, 'clean')))).toEqual([]);
  }, 240_000);

  it('draws again a page changed by hand in the output, and nothing else', () => {
    const touched = page('u2-n2-su-001');
    appendFileSync(touched, '<!-- changed by hand -->');
    const tag = join(plant, 'site', 'tags', readdirSync(join(plant, 'site', 'tags')).find((name) => !name.endsWith('.html'))!, 'index.html');
    appendFileSync(tag, '<!-- changed by hand -->');
    // As if the first two builds were a minute ago: this build removes the first version.
    ageVersions(join(plant, 'site'), 60_000);
    const rebuilt = build(plant, 'site', 'cache');
    expect(readdirSync(join(plant, 'site.versions'))).toHaveLength(2);
    expect(kept(rebuilt)).toBe(12);
    const others = /; (\d+) of (\d+) tag, register and rule pages kept/.exec(rebuilt)!;
    expect(Number(others[1])).toBe(Number(others[2]) - 1);
    expect(readFileSync(touched, 'utf8')).not.toContain('changed by hand');
    expect(readFileSync(tag, 'utf8')).not.toContain('changed by hand');
    expect(differences(snapshot(join(plant, 'site')), snapshot(join(plant, 'clean')))).toEqual([]);
  }, 180_000);

  it('keeps every page when nothing changed, also once older versions have been removed', () => {
    // The fourth build into the same output: the third removed the first version (aged above), whose files were
    // second names of pages still in use. Whatever a build removes or links must leave the record of the pages it
    // keeps true.
    const rebuilt = build(plant, 'site', 'cache');
    expect(kept(rebuilt)).toBe(13);
    // The first version is gone; the second stays while its replacement is recent (a reader may still be on it).
    expect(readdirSync(join(plant, 'site.versions')).length).toBeLessThanOrEqual(3);
    expect(differences(snapshot(join(plant, 'site')), snapshot(join(plant, 'clean')))).toEqual([]);
  }, 180_000);
});
