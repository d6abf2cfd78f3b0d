// The revision in force: what the procedure page shows, what search finds and what the home page lists.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { gitIn } from '../../src/history/git.ts';
import { buildHistoryView } from '../../src/history/history-view.ts';
import { canBeInForce, revisionInForce } from '../../src/history/in-force.ts';
import { readHistory } from '../../src/history/revisions.ts';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { ada, buildStory, createTempRepo, procedureText, stepsV2, type TempRepo } from './temp-repo.ts';

let repo: TempRepo;

beforeAll(() => {
  repo = createTempRepo();
  buildStory(repo);
  repo.write('procedures/k-210/u2-test-001.md', procedureText({ revision: 3, status: 'in-review', steps: stepsV2, change: 'Cook time raised.' }));
  repo.commit('U2-TEST-001 rev 3 in review', ada, '2026-04-01');
});
afterAll(() => repo.remove());

describe('revisionInForce', () => {
  it('keeps the effective revision 2 in force while revision 3 is committed as in review', async () => {
    const history = await readHistory(gitIn(repo.dir), 'procedures/k-210/u2-test-001.md');
    const view = buildHistoryView(history, { id: 'U2-TEST-001', slug: 'u2-test-001', currentRevision: 3, currentStatus: 'in-review' });
    const inForce = revisionInForce({ revision: 3, status: 'in-review' }, view.revisions, '2026-04-02');
    expect(inForce.state).toBe('earlier');
    if (inForce.state === 'earlier') {
      expect(inForce.entry.revision).toBe(2);
      expect(inForce.entry.status).toBe('effective');
      expect(readProcedure(inForce.entry.path, inForce.entry.text).procedure?.revision).toBe(2);
    }
  });

  it('shows the newest text once it is effective, or approved with its date reached', () => {
    expect(revisionInForce({ revision: 3, status: 'effective' }, [{ revision: 2, status: 'effective' }], '2026-01-01')).toEqual({ state: 'newest' });
    expect(revisionInForce({ revision: 3, status: 'approved', effective: '2026-01-01' }, [], '2026-01-01')).toEqual({ state: 'newest' });
    const early = revisionInForce({ revision: 3, status: 'approved', effective: '2026-02-01' }, [{ revision: 2, status: 'effective' }], '2026-01-01');
    expect(early).toMatchObject({ state: 'earlier', entry: { revision: 2 } });
  });

  it('says plainly that nothing is in force when no earlier revision took effect', () => {
    const none = revisionInForce({ revision: 3, status: 'in-review' }, [{ revision: 2, status: 'draft' }], '2026-01-01');
    expect(none.state).toBe('none');
    if (none.state === 'none') expect(none.reason).toMatch(/^No revision of this procedure is in force\. Revision 3 is in review\./);
    expect(revisionInForce({ revision: 4, status: 'retired' }, [{ revision: 3, status: 'effective' }], '2026-01-01').state).toBe('none');
  });

  it('never picks a revision that is not in force, nor one newer than the file', () => {
    const status = fc.constantFrom('draft', 'in-review', 'approved', 'effective', 'superseded', 'retired');
    const date = fc.constantFrom('2026-01-01', '2026-06-01', '2027-01-01', undefined);
    fc.assert(fc.property(
      fc.record({ revision: fc.integer({ min: 1, max: 9 }), status, effective: date }),
      fc.array(fc.record({ revision: fc.integer({ min: 1, max: 9 }), status, effective: date }), { maxLength: 8 }),
      (newest, committed) => {
        const today = '2026-06-01';
        const r = revisionInForce(newest, committed, today);
        if (r.state === 'newest') expect(canBeInForce(newest, today)).toBe(true);
        if (r.state === 'earlier') {
          expect(canBeInForce(r.entry, today)).toBe(true);
          expect(r.entry.revision).toBeLessThan(newest.revision);
          // The newest earlier one in force wins.
          for (const c of committed) if (c.revision < newest.revision && canBeInForce(c, today)) expect(c.revision).toBeLessThanOrEqual(r.entry.revision);
        }
        if (r.state === 'none') expect(r.reason.length).toBeGreaterThan(20);
      },
    ));
  });
});
