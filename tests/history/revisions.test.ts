// Revisions read from a real git repository built in the test: renames followed, drafts, shallow clones.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { gitIn } from '../../src/history/git.ts';
import { readHistory } from '../../src/history/revisions.ts';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { previousVersions } from '../../src/history/previous-version.ts';
import { buildStory, createTempRepo, procedureText, stepsV2, type TempRepo } from './temp-repo.ts';

let repo: TempRepo;
let commits: ReturnType<typeof buildStory>;
const path = 'procedures/k-210/u2-test-001.md';

beforeAll(() => {
  repo = createTempRepo();
  commits = buildStory(repo);
});
afterAll(() => repo.remove());

describe('readHistory', () => {
  it('lists every committed revision, following the rename, with the commit that introduced it and its author and date', async () => {
    const history = await readHistory(gitIn(repo.dir), path);
    expect(history.shallow).toBe(false);
    expect(history.notice).toBeUndefined();
    expect(history.revisions.map((r) => r.revision)).toEqual([1, 2]);
    const [rev1, rev2] = history.revisions;
    expect(rev1.introduced).toMatchObject({ commit: commits.draft1, author: 'Ada Ferrand', date: '2026-01-10T09:00:00+00:00' });
    expect(rev1.latest.commit).toBe(commits.effective1);
    expect(rev1.path).toBe('procedures/u2-test-001.md');
    expect(rev1.commits.map((c) => c.status)).toEqual(['draft', 'effective']);
    expect(rev1.status).toBe('effective');
    expect(rev1.effective).toBe('2026-01-20');
    expect(rev1.approvals.map((a) => a.name)).toEqual(['Ada Ferrand', 'Bram Okonjo']);

    expect(rev2.introduced.commit).toBe(commits.draft2);
    expect(rev2.commits.map((c) => c.commit)).toEqual([commits.draft2, commits.renamed, commits.effective2, commits.unbumped]);
    expect(rev2.commits[1]).toMatchObject({ change: 'R', renamedFrom: 'procedures/u2-test-001.md', path });
    expect(rev2.latest).toMatchObject({ commit: commits.unbumped, author: 'Ada Ferrand', subject: 'Raise the K-210 high limit' });
    expect(rev2.record?.revision).toBe(2);
    expect(readProcedure(rev2.path, rev2.text).procedure?.limits[0].high?.value).toBe('250 degC');
    expect(rev2.change).toContain('MOC-2026-011');
    expect(history.draft).toBeUndefined();
  });

  it('treats uncommitted work as the next draft', async () => {
    const working = procedureText({ revision: 3, status: 'draft', steps: stepsV2 });
    const history = await readHistory(gitIn(repo.dir), path, working);
    expect(history.draft).toMatchObject({ revision: 3, status: 'draft' });
    const same = await readHistory(gitIn(repo.dir), path, history.revisions[1].text);
    expect(same.draft).toBeUndefined();
  });

  it('has no revisions for a file that was never committed', async () => {
    const history = await readHistory(gitIn(repo.dir), 'procedures/new.md', procedureText({ revision: 0, status: 'draft', steps: stepsV2 }));
    expect(history.revisions).toEqual([]);
    expect(history.draft?.revision).toBe(0);
  });

  it('says what is missing in a shallow clone', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'stepwright-shallow-'));
    try {
      execFileSync('git', ['clone', '-q', '--depth', '2', `file://${repo.dir}`, dir]);
      const git = gitIn(dir);
      const history = await readHistory(git, path);
      expect(history.shallow).toBe(true);
      // Only the last two commits are here: both belong to revision 2, whose start is cut off.
      expect(history.revisions.map((r) => r.revision)).toEqual([2]);
      expect(history.revisions[0].complete).toBe(false);
      expect(history.revisions[0].commits.map((c) => c.commit)).toEqual([commits.effective2, commits.unbumped]);
      expect(history.notice).toMatch(/shallow clone/);
      expect(history.notice).toContain(commits.effective2.slice(0, 7));
      expect(history.notice).toContain('fetch-depth: 0');
      await expect(previousVersions(git, [{ path }], commits.draft1)).rejects.toThrow(/not in this clone/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('previousVersions', () => {
  it('reads each file at the base under its old name', async () => {
    const found = await previousVersions(gitIn(repo.dir), [{ path }], commits.effective1);
    const previous = found.get(path);
    expect(previous?.commit).toBe(commits.effective1.slice(0, 7));
    expect(previous?.text).toContain('revision: 1');
  });
});
