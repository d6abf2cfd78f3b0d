// Every markdown file under the procedures folder is either read or named in an info line: check, build and verify
// never leave one out in silence (dot-folders and dot-files are read; node_modules, .markdown names are named).
import { existsSync, mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { findProcedureFiles, type FileNotRead } from '../../src/engine/find-procedure-files.ts';
import { runCli } from '../cli/run-cli.ts';
import { procedureText, stepsV1 } from '../history/temp-repo.ts';
import { tempFolder } from '../temp-folder.ts';

const procedure = (id: string) => procedureText({ revision: 1, status: 'draft', steps: stepsV1 }).replace('id: U2-TEST-001', `id: ${id}`);

function folderWith(files: Record<string, string>): string {
  const dir = tempFolder('stepwright-not-read-');
  for (const [name, text] of Object.entries(files)) {
    mkdirSync(join(dir, name, '..'), { recursive: true });
    writeFileSync(join(dir, name), text);
  }
  return dir;
}

const plant = () => folderWith({
  'procedures/u2-a-001.md': procedure('U2-A-001'),
  'procedures/.hidden/u2-x-hidden.md': procedure('U2-X-HIDDEN'),
  'procedures/utilities/.u2-x-dot.md': procedure('U2-X-DOT'),
  'procedures/node_modules/u2-x-nm.md': procedure('U2-X-NM'),
  'procedures/utilities/u2-x-mkd.markdown': procedure('U2-X-MKD'),
  'procedures/README.md': '# Unit 2 procedures\n',
});

describe('files under the procedures folder that are not read', () => {
  it('check reads dot-folders and dot-files and names the rest in info lines', async () => {
    const dir = plant();
    const check = await runCli(['check', '--no-history'], dir);
    expect(check.stdout).toContain('3 files checked');
    expect(check.stdout).toMatch(/procedures\/node_modules\/u2-x-nm\.md:1:1 info file-not-read Not read: procedures\/node_modules\/u2-x-nm\.md \(it lies in procedures\/node_modules\/, a folder of installed packages/);
    expect(check.stdout).toMatch(/procedures\/utilities\/u2-x-mkd\.markdown:1:1 info file-not-read .*ends in \.markdown/);
    expect(check.stdout).toContain('Rename it to end in .md to have it checked and published (u2-x-mkd.md).');
    expect(check.stdout).toMatch(/procedures\/README\.md:1:1 info not-a-procedure/);
    expect(check.stdout).not.toMatch(/u2-x-(hidden|dot)\.md:1:1 info/);
  });

  it('build publishes the dot-folder and dot-file procedures and names the others; verify names them too', async () => {
    const dir = plant();
    const build = await runCli(['build'], dir);
    expect(build.code, build.stdout + build.stderr).toBe(0);
    expect(build.stdout).toMatch(/Built 3 procedures/);
    expect(build.stdout).toContain('info file-not-read Not read: procedures/node_modules/u2-x-nm.md');
    const pages = readdirSync(join(dir, 'dist', 'procedures')).join(' ');
    expect(pages).toMatch(/u2-x-hidden/);
    expect(pages).toMatch(/u2-x-dot/);
    expect(pages).not.toMatch(/u2-x-nm|u2-x-mkd/);
    const verify = await runCli(['verify', 'dist'], dir);
    expect(verify.code, verify.stdout + verify.stderr).toBe(0);
    expect(verify.stdout).toContain('procedures/node_modules/u2-x-nm.md: not read (it lies in procedures/node_modules/');
    expect(verify.stdout).toContain('procedures/utilities/u2-x-mkd.markdown: not read (its name ends in .markdown');
    expect(verify.stdout).toContain('All 3 procedure pages match their sources.');
  });

  it('stepwright new writes into a dot-folder that is read, and refuses a folder that is not', async () => {
    const dir = folderWith({ 'procedures/u2-a-001.md': procedure('U2-A-001') });
    const made = await runCli(['new', 'normal', 'U2-NEW-005', '--dir', 'procedures/.drafts'], dir);
    expect(made.code, made.stderr).toBe(0);
    const check = await runCli(['check', '--no-history'], dir);
    expect(check.stdout).toContain('procedures/.drafts/u2-new-005.md');
    expect(check.stdout).toContain('2 files checked');
    const refused = await runCli(['new', 'normal', 'U2-NEW-006', '--dir', 'procedures/node_modules/x'], dir);
    expect(refused.code).toBe(1);
    expect(refused.stderr).toContain('would lie in procedures/node_modules/, a folder of installed packages, which check, build and verify do not read; nothing was written.');
    expect(existsSync(join(dir, 'procedures/node_modules'))).toBe(false);
  });

  it('names the first files of a large folder that is not read one by one and counts the rest', () => {
    const files: Record<string, string> = {};
    for (let i = 0; i < 25; i++) files[`procedures/dist/p-${String(i).padStart(2, '0')}.md`] = 'x\n';
    const dir = folderWith(files);
    const notRead: FileNotRead[] = [];
    expect(findProcedureFiles(['procedures'], dir, notRead)).toEqual([]);
    expect(notRead).toHaveLength(21);
    expect(notRead.at(-1)).toMatchObject({ file: 'procedures/dist', reason: expect.stringContaining('5 more markdown files') });
  });

  it('property: every markdown-like file under the folder is found or named as not read', () => {
    const segment = fc.oneof(
      fc.constantFrom('node_modules', 'dist', '.git', '.astro', '.stepwright', '.drafts', '.hidden', 'area', 'a.md'),
      fc.stringMatching(/^\.?[a-z0-9][a-z0-9._-]{0,7}$/),
    );
    const fileName = fc.tuple(
      fc.constantFrom('', '.', '.#', '._', '-'),
      fc.stringMatching(/^[a-z0-9][a-z0-9-]{0,7}$/),
      fc.constantFrom('.md', '.MD', '.markdown', '.mkd', '.mdx', '.txt', '.md.swp'),
    ).map(([pre, stem, ext]) => `${pre}${stem}${ext}`);
    const file = fc.tuple(fc.array(segment, { maxLength: 3 }), fileName).map(([dirs, name]) => [...dirs, name].join('/'));
    fc.assert(fc.property(fc.uniqueArray(file, { minLength: 1, maxLength: 8 }), (paths) => {
      const dir = tempFolder('stepwright-not-read-');
      const written: string[] = [];
      for (const p of paths) {
        const full = join(dir, 'procedures', p);
        try {
          mkdirSync(join(full, '..'), { recursive: true });
          writeFileSync(full, 'text\n');
          written.push(`procedures/${p}`);
        } catch {
          // A name already taken as a folder (or a file in the way of one): not part of this case.
        }
      }
      const notRead: FileNotRead[] = [];
      const found = findProcedureFiles(['procedures'], dir, notRead);
      const read = new Set(found.filter((f) => !f.missing).map((f) => f.file));
      const named = new Set(notRead.map((n) => n.file));
      for (const p of written.filter((w) => existsSync(join(dir, w)))) {
        const markdownLike = /\.(md|markdown|mdown|mkdn|mkd|mdx)$/i.test(p);
        if (!markdownLike) continue;
        expect(read.has(p) || named.has(p), `${p} is neither read nor named`).toBe(true);
        expect(read.has(p) && named.has(p)).toBe(false);
      }
    }), { numRuns: 60 });
  });
});
