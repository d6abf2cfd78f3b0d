// The revision in force: what the procedure page shows, what search finds and what the home page lists.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { gitIn } from '../../src/history/git.ts';
import { buildHistoryView } from '../../src/history/history-view.ts';
import { canBeInForce, revisionInForce } from '../../src/history/in-force.ts';
import { readHistory } from '../../src/history/revisions.ts';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { notInForce } from '../../src/analysis/document-control.ts';
import { statusBanner } from '../../src/render/manual.ts';
import { revisionBanner } from '../../src/render/revision-banner.ts';
import { ada, buildStory, createTempRepo, procedureText, stepsV1, stepsV2, type TempRepo } from './temp-repo.ts';

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

describe('an effective status with an effective date still ahead', () => {
  it('is not in force: the last revision in force is, as for an approved one', () => {
    const r = revisionInForce({ revision: 9, status: 'effective', effective: '2027-01-15' }, [{ revision: 8, status: 'effective', effective: '2026-12-03' }], '2026-12-05');
    expect(r).toMatchObject({ state: 'earlier', entry: { revision: 8 } });
    const none = revisionInForce({ revision: 1, status: 'effective', effective: '2027-01-15' }, [], '2026-12-05');
    expect(none.state === 'none' && none.reason).toMatch(/Revision 1 is effective but takes effect on 2027-01-15\./);
    expect(revisionInForce({ revision: 9, status: 'effective', effective: '2026-12-05' }, [], '2026-12-05')).toEqual({ state: 'newest' });
  });

  it('is judged the same by the page, the rules and the history', () => {
    const status = fc.constantFrom('draft', 'in-review', 'approved', 'effective', 'superseded', 'retired');
    const date = fc.constantFrom('2026-01-01', '2026-06-01', '2027-01-01', undefined);
    fc.assert(fc.property(fc.record({ status, effective: date }), (r) => {
      const today = '2026-06-01';
      expect(canBeInForce(r, today)).toBe(notInForce({ ...r, kind: 'batch' } as Parameters<typeof notInForce>[0], today) === undefined);
      const later = (r.status === 'approved' || r.status === 'effective') && r.effective !== undefined && r.effective > today;
      expect(Boolean(statusBanner(r, today))).toBe(later || ['draft', 'in-review', 'superseded', 'retired'].includes(r.status));
    }));
  });

  it('does not supersede the revision before it, in the history or on its record page', async () => {
    const own = createTempRepo();
    try {
      own.write('procedures/k-210/u2-test-001.md', procedureText({ revision: 8, status: 'effective', effective: '2026-12-03', steps: stepsV1, change: 'Rev 8.' }));
      own.commit('rev 8', ada, '2026-12-03');
      own.write('procedures/k-210/u2-test-001.md', procedureText({ revision: 9, status: 'effective', effective: '2027-01-15', steps: stepsV2, change: 'Rev 9.' }));
      own.commit('rev 9, effective from 2027-01-15', ada, '2026-12-04');
      const history = await readHistory(gitIn(own.dir), 'procedures/k-210/u2-test-001.md');
      const identity = { id: 'U2-TEST-001', slug: 'u2-test-001', currentRevision: 9, currentStatus: 'effective', currentEffective: '2027-01-15' };
      const view = buildHistoryView(history, { ...identity, today: '2026-12-05' });
      expect(view.revisions.map((r) => [r.revision, r.superseded])).toEqual([[8, false], [9, false]]);
      expect(revisionInForce({ revision: 9, status: 'effective', effective: '2027-01-15' }, view.revisions, '2026-12-05')).toMatchObject({ state: 'earlier', entry: { revision: 8 } });
      const current = { id: 'U2-TEST-001', revision: 9, status: 'effective', effective: '2027-01-15', url: '/procedures/u2-test-001/' };
      const banner = revisionBanner({ entry: view.revisions[0], revisions: view.revisions, current, today: '2026-12-05' });
      expect(banner.title).toBe('RECORD COPY OF REVISION 8, STILL IN FORCE');
      expect(banner.text).toContain('Revision 9 is effective from 2027-01-15 and has not taken effect');
      // On its date revision 9 takes effect and replaces revision 8.
      const later = buildHistoryView(history, { ...identity, today: '2027-01-15' });
      expect(later.revisions.map((r) => [r.revision, r.superseded])).toEqual([[8, true], [9, false]]);
      expect(statusBanner(current, '2026-12-05')?.title).toBe('EFFECTIVE FROM 2027-01-15 — NOT YET IN FORCE');
      expect(statusBanner(current, '2027-01-15')).toBeUndefined();
    } finally {
      own.remove();
    }
  });
});
