// The repository that holds the procedures, found with one git process that also resolves the base ref.
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { openRepository, previousFromGit, repoPath } from '../../src/engine/repository.ts';

const dir = mkdtempSync(join(tmpdir(), 'stepwright-repository-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const git = (...args: string[]) => execFileSync('git', args, { cwd: dir, encoding: 'utf8', env: { ...process.env, GIT_AUTHOR_NAME: 'T', GIT_AUTHOR_EMAIL: 't@example.org', GIT_COMMITTER_NAME: 'T', GIT_COMMITTER_EMAIL: 't@example.org' } }).trim();
git('init', '-q', '-b', 'main');
writeFileSync(join(dir, 'a.md'), 'first\n');
writeFileSync(join(dir, 'b.md'), 'a procedure long enough for git to see it moved\nline two\nline three\nline four\n');
git('add', '.');
git('commit', '-q', '-m', 'first');
const head = git('rev-parse', 'HEAD');
writeFileSync(join(dir, 'a.md'), 'second\n');
// Renamed since the commit (and edited a little), and a file the base has not got at all.
git('mv', 'b.md', 'c.md');
writeFileSync(join(dir, 'c.md'), 'a procedure long enough for git to see it moved\nline two\nline three\nline four, edited\n');
writeFileSync(join(dir, 'd.md'), 'new\n');

describe('openRepository', () => {
  it('finds the root and resolves the base in the same call', async () => {
    const repo = await openRepository({ cwd: dir }, 'a.md', 'main');
    expect(repo?.commit).toBe(head);
    expect(repo?.shallow).toBe(false);
    expect((await openRepository({ cwd: dir }, 'a.md'))?.commit).toBeUndefined();
  });

  it('gives no commit for a base the clone does not have, or one that would read as an option', async () => {
    expect((await openRepository({ cwd: dir }, '.', 'origin/nowhere'))?.commit).toBeUndefined();
    const odd = await openRepository({ cwd: dir }, '.', '--all');
    expect(odd?.root).toBeTruthy();
    expect(odd?.commit).toBeUndefined();
  });
});

describe('previousFromGit', () => {
  it('reads the committed text at the base', async () => {
    const { previous } = await previousFromGit([{ file: 'a.md', text: 'second\n' }], { cwd: dir }, 'main');
    expect(previous?.('a.md')).toEqual({ text: 'first\n', commit: `main (${head.slice(0, 7)})` });
  });

  it('reads a file renamed since the base under its old name, and nothing for a file the base has not got', async () => {
    const inputs = ['a.md', 'c.md', 'd.md'].map((file) => ({ file, text: '' }));
    const { previous } = await previousFromGit(inputs, { cwd: dir }, 'main');
    expect(previous?.('a.md')?.text).toBe('first\n');
    expect(previous?.('c.md')?.text).toBe('a procedure long enough for git to see it moved\nline two\nline three\nline four\n');
    expect(previous?.('d.md')).toBeUndefined();
  });

  it('reads the files when the working folder is reached through symbolic links, and names deleted ones', async () => {
    // The repository through a link, and the file through a linked folder inside it: git names paths by the real ones.
    const outside = mkdtempSync(join(tmpdir(), 'stepwright-linked-'));
    try {
      symlinkSync(dir, join(outside, 'plant'));
      mkdirSync(join(dir, 'real-folder'), { recursive: true });
      symlinkSync(join(dir, 'real-folder'), join(dir, 'linked-folder'));
      const cwd = join(outside, 'plant');
      const { previous, repo } = await previousFromGit([{ file: 'a.md', text: 'second\n' }], { cwd }, 'main');
      expect(previous?.('a.md')?.text).toBe('first\n');
      expect(repoPath(repo!, 'linked-folder/x.md')).toBe('real-folder/x.md');
      // A file that is not there (deleted): its folder's real path, and its own name.
      expect(repoPath(repo!, 'linked-folder/gone/x.md')).toBe('real-folder/gone/x.md');
    } finally {
      rmSync(outside, { recursive: true, force: true });
    }
  });

  it('says how to fetch a base that is not in the clone', async () => {
    await expect(previousFromGit([{ file: 'a.md', text: 'second\n' }], { cwd: dir }, 'origin/nowhere')).rejects.toThrow(/not in this clone/);
    await expect(previousFromGit([{ file: 'a.md', text: 'second\n' }], { cwd: dir }, '--all')).rejects.toThrow(/not in this clone/);
  });
});
