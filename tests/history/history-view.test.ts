// The site's view of a procedure's past: stable revision URLs, redline links, superseded flags and the audit trail.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { gitIn } from '../../src/history/git.ts';
import { buildHistoryView } from '../../src/history/history-view.ts';
import { readHistory } from '../../src/history/revisions.ts';
import { ada, buildStory, createTempRepo, procedureText, stepsV1, stepsV2, type TempRepo } from './temp-repo.ts';

let repo: TempRepo;
let commits: ReturnType<typeof buildStory>;

beforeAll(() => {
  repo = createTempRepo();
  commits = buildStory(repo);
});
afterAll(() => repo.remove());

describe('buildHistoryView', () => {
  it('gives every revision a stable URL, a redline link to its predecessor and a superseded flag', async () => {
    const history = await readHistory(gitIn(repo.dir), 'procedures/k-210/u2-test-001.md');
    const view = buildHistoryView(history, { id: 'U2-TEST-001', slug: 'u2-test-001', currentRevision: 2 });
    expect(view.revisions.map((r) => [r.revision, r.url, r.redlineUrl ?? null, r.superseded])).toEqual([
      [1, '/procedures/u2-test-001/rev/1/', null, true],
      [2, '/procedures/u2-test-001/rev/2/', '/procedures/u2-test-001/rev/2/redline/', false],
    ]);
    expect(view.revisions[1].introduced).toMatchObject({ author: 'Ada Ferrand', commit: commits.draft2 });
  });

  it('keeps a revision in force while the next one is only drafted or in review', async () => {
    const history = await readHistory(gitIn(repo.dir), 'procedures/k-210/u2-test-001.md');
    const pending = buildHistoryView(history, { id: 'U2-TEST-001', slug: 'u2-test-001', currentRevision: 3, currentStatus: 'in-review' });
    expect(pending.revisions.map((r) => r.superseded)).toEqual([true, false]);
    const effective = buildHistoryView(history, { id: 'U2-TEST-001', slug: 'u2-test-001', currentRevision: 3, currentStatus: 'effective' });
    expect(effective.revisions.map((r) => r.superseded)).toEqual([true, true]);
  });

  it('lists every commit in order with who, when and what happened, including the edit made in place', async () => {
    const history = await readHistory(gitIn(repo.dir), 'procedures/k-210/u2-test-001.md');
    const view = buildHistoryView(history, { id: 'U2-TEST-001', slug: 'u2-test-001', currentRevision: 2 });
    expect(view.audit.map((a) => [a.date.slice(0, 10), a.author, a.revision, a.events])).toEqual([
      ['2026-01-10', 'Ada Ferrand', 1, ['revision 1 created']],
      ['2026-01-20', 'Bram Okonjo', 1, ['status draft → effective', 'signed: Process engineer Ada Ferrand (2026-01-15, Approved for use)', 'signed: Operations superintendent Bram Okonjo (2026-01-18, Approved for use)']],
      ['2026-02-05', 'Ada Ferrand', 2, ['revision 1 → 2', 'status effective → draft', 'content: hazards, steps']],
      ['2026-02-10', 'Ada Ferrand', 2, ['file moved from procedures/u2-test-001.md']],
      ['2026-02-20', 'Bram Okonjo', 2, ['status draft → effective', 'signed: Process engineer Ada Ferrand (2026-02-15, Approved for use)', 'signed: Operations superintendent Bram Okonjo (2026-02-18, Approved for use)']],
      ['2026-03-01', 'Ada Ferrand', 2, ['content edited in place: limits, interlocks']],
    ]);
    expect(view.audit.at(-1)?.editedInPlace).toEqual(['limits', 'interlocks']);
    expect(view.audit.every((a, i) => i === 0 || a.date >= view.audit[i - 1].date)).toBe(true);
  });

  it('names signatures copied into a new revision as copies, not as new signatures', async () => {
    const other = createTempRepo();
    try {
      const approvals = [{ role: 'Process engineer', name: 'Ada Ferrand', date: '2026-01-15' }];
      other.write('p.md', procedureText({ revision: 1, status: 'effective', effective: '2026-01-20', approvals, steps: stepsV1 }));
      other.commit('rev 1', ada, '2026-01-20');
      other.write('p.md', procedureText({ revision: 2, status: 'effective', effective: '2026-01-20', approvals, steps: stepsV2 }));
      other.commit('rev 2', ada, '2026-02-01');
      const view = buildHistoryView(await readHistory(gitIn(other.dir), 'p.md'), { id: 'P', slug: 'p', currentRevision: 2 });
      expect(view.audit[0].events).toContain('signed: Process engineer Ada Ferrand (2026-01-15, Approved for use)');
      expect(view.audit[1].events).toContain('approval copied from revision 1, not a new signature: Process engineer Ada Ferrand (2026-01-15, Approved for use)');
    } finally {
      other.remove();
    }
  });
});
