// Reading many files through one `git cat-file --batch`: byte counts, not characters, and missing files.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { gitIn, showFile, showFiles } from '../../src/history/git.ts';
import { ada, createTempRepo, type TempRepo } from './temp-repo.ts';

let repo: TempRepo;
let commit: string;
const texts = {
  'a.md': 'Signed by Tomás Reyes — hold at 235 °C ✓\n',
  'b/c d.md': 'second file\nwith two lines and no final newline',
  'empty.md': '',
};

beforeAll(() => {
  repo = createTempRepo();
  for (const [path, text] of Object.entries(texts)) repo.write(path, text);
  commit = repo.commit('files', ada, '2026-05-01');
});
afterAll(() => repo.remove());

describe('showFiles', () => {
  it('returns each file exactly as git show does, and undefined for a missing one', async () => {
    const git = gitIn(repo.dir);
    const specs = [...Object.keys(texts).map((p) => `${commit}:${p}`), `${commit}:missing.md`];
    const shown = await showFiles(git, specs);
    for (const [path, text] of Object.entries(texts)) {
      expect(shown.get(`${commit}:${path}`)).toBe(text);
      expect(await showFile(git, commit, path)).toBe(text);
    }
    expect(shown.get(`${commit}:missing.md`)).toBeUndefined();
  });

  it('falls back to one git show per file for a runner without standard input', async () => {
    const full = gitIn(repo.dir);
    const plain = (args: string[]) => full(args);
    const shown = await showFiles(plain, [`${commit}:a.md`, `${commit}:nope.md`]);
    expect(shown.get(`${commit}:a.md`)).toBe(texts['a.md']);
    expect(shown.get(`${commit}:nope.md`)).toBeUndefined();
  });
});
