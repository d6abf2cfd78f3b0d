// One pass over git for every file's history: the same commits, paths and renames as `git log --follow` asked
// file by file, from a number of git processes that does not grow with the number of files.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fileLog } from '../../src/history/file-log.ts';
import { gitIn, type Git } from '../../src/history/git.ts';
import { commonFolder, fileLogs } from '../../src/history/repository-log.ts';
import { readHistories, readHistory } from '../../src/history/revisions.ts';
import { ada, bram, buildStory, createTempRepo, procedureText, stepsV1, stepsV2, type TempRepo } from './temp-repo.ts';

let repo: TempRepo;
/** A procedure with a long narrative of its own, so git never takes one file for a copy of another. */
const text = (n: number, revision: number, status = 'draft') =>
  procedureText({ revision, status, steps: n % 2 ? stepsV1 : stepsV2 }).replace('U2-TEST-001', `U2-TEST-${100 + n}`) +
  Array.from({ length: 400 }, (_, i) => `Note ${n}.${i}: line ${(n * 7919 + i * 104729) % 100003} of area ${n}.`).join('\n');
let paths: string[];

beforeAll(() => {
  repo = createTempRepo();
  buildStory(repo);
  // More files with their own lives: renamed within the folder, moved in from outside it, deleted and added
  // again, edited in commits that also touch other files.
  for (let n = 1; n <= 6; n++) repo.write(`procedures/area-${n % 2}/p-${n}.md`, text(n, 1));
  repo.write('drafts/outside.md', text(9, 1));
  repo.write('README.md', 'Alder Reach Chemicals, Unit 2 procedures\n');
  repo.commit('Add six procedures and a draft outside the folder', ada, '2026-03-02');
  repo.git(['mv', 'procedures/area-1/p-1.md', 'procedures/area-0/p-1-moved.md']);
  repo.git(['mv', 'drafts/outside.md', 'procedures/area-1/was-outside.md']);
  repo.write('procedures/area-0/p-2.md', text(2, 1, 'in-review'));
  repo.commit('Move two files; p-2 to review', bram, '2026-03-03');
  repo.git(['rm', '-q', 'procedures/area-1/p-3.md']);
  repo.commit('Withdraw p-3', bram, '2026-03-04');
  repo.write('procedures/area-1/p-3.md', text(3, 2));
  repo.write('procedures/area-0/p-4.md', text(4, 2));
  repo.write('README.md', 'Alder Reach Chemicals, Unit 2 procedures (2 areas)\n');
  repo.commit('Bring p-3 back as revision 2; p-4 revision 2', ada, '2026-03-05');
  paths = repo.git(['ls-files', 'procedures']).trim().split('\n');
});
afterAll(() => repo.remove());

/** Counts the git processes a reader starts. */
function counting(git: Git): { git: Git; calls: () => number } {
  let n = 0;
  const counted: Git = (args) => (n++, git(args));
  if (git.bytes) counted.bytes = (args, input) => (n++, git.bytes!(args, input));
  return { git: counted, calls: () => n };
}

describe('fileLogs', () => {
  it('gives every file the commits, paths and renames that git log --follow gives it alone', async () => {
    const git = gitIn(repo.dir);
    expect(paths.length).toBeGreaterThanOrEqual(7);
    const all = await fileLogs(git, paths);
    for (const path of paths) expect(all.get(path), path).toEqual(await fileLog(git, path));
    // The renames are really there, so the comparison above covers them.
    expect(all.get('procedures/area-0/p-1-moved.md')!.map((c) => c.change)).toEqual(['R', 'A']);
    expect(all.get('procedures/area-1/was-outside.md')!.at(-1)).toMatchObject({ path: 'drafts/outside.md', change: 'A' });
    expect(all.get('procedures/area-1/p-3.md')!.map((c) => c.change)).toEqual(['A', 'D', 'A']);
  });

  it('starts a fixed number of git processes, however many files', async () => {
    const one = counting(gitIn(repo.dir));
    await readHistories(one.git, paths.slice(0, 1).map((path) => ({ path })));
    const many = counting(gitIn(repo.dir));
    const histories = await readHistories(many.git, paths.map((path) => ({ path })));
    // log, shallow check, cat-file, the moved-in question, and one --follow for the one file moved in from outside.
    expect(many.calls()).toBeLessThanOrEqual(5);
    expect(many.calls() - one.calls()).toBeLessThanOrEqual(2);
    for (const path of paths) expect(histories.get(path)).toEqual(await readHistory(gitIn(repo.dir), path));
    expect(histories.get('procedures/area-1/p-3.md')!.revisions.map((r) => r.revision)).toEqual([1, 2]);
  });

  it('reads each committed text through the given reader, so known texts are not parsed again', async () => {
    const seen: string[] = [];
    await readHistories(gitIn(repo.dir), [{ path: 'procedures/area-0/p-2.md' }], { read: (path) => (seen.push(path), null) });
    expect(seen).toEqual(['procedures/area-0/p-2.md', 'procedures/area-0/p-2.md']);
  });
});

describe('a new file written from a template', () => {
  it('starts its own history instead of taking over the template file it resembles', async () => {
    const other = createTempRepo();
    try {
      other.write('procedures/template.md', procedureText({ revision: 4, status: 'effective', steps: stepsV1 }));
      other.commit('Template', ada, '2026-04-01');
      other.write('procedures/new.md', procedureText({ revision: 1, status: 'draft', steps: stepsV1 }));
      const added = other.commit('New procedure from the template', ada, '2026-04-02');
      const history = await readHistory(gitIn(other.dir), 'procedures/new.md');
      expect(history.revisions.map((r) => [r.revision, r.introduced.commit, r.introduced.change])).toEqual([[1, added, 'A']]);
    } finally {
      other.remove();
    }
  });
});

describe('commonFolder', () => {
  it('is the deepest folder every path is in', () => {
    expect(commonFolder(['procedures/a/x.md', 'procedures/a/b/y.md'])).toBe('procedures/a');
    expect(commonFolder(['procedures/a/x.md', 'procedures/b/y.md'])).toBe('procedures');
    expect(commonFolder(['x.md', 'procedures/y.md'])).toBe('');
    expect(commonFolder([])).toBe('');
  });
});
