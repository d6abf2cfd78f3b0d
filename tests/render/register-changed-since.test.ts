// A revision in force is told apart from register values its approvers never saw: the register entries it takes over
// that changed after it took effect.
import { describe, expect, it } from 'vitest';
import { registerChangedSince } from '../../src/render/register-changed-since.ts';
import type { RegisterEntryRevision } from '../../src/history/register-history.ts';

const entries = [{ id: 'TSHH-210', url: '/register/tshh-210/' }, { id: 'TI-210', url: '/register/ti-210/' }];
const change = (date: string | undefined, details: string[], kind: RegisterEntryRevision['change'] = 'changed'): RegisterEntryRevision => ({
  ...(date ? { commit: `c${date}`, date, when: `${date}T09:00:00Z` } : {}), subject: 'Register', change: kind, details,
});
const history = new Map<string, RegisterEntryRevision[]>([
  ['TSHH-210', [change('2026-12-04', ['trips-when: TI-210 >= 255 degC → TI-210 >= 252 degC']), change('2026-11-01', ['action: …'])]],
  ['TI-210', [change('2026-12-03', ['limits: ' + 'x'.repeat(200)])]],
]);

describe('register changes since a revision took effect', () => {
  it('lists the changes after the effective date, newest first, and only for a revision in force', () => {
    const found = registerChangedSince({ status: 'effective', effective: '2026-12-03' }, entries, history);
    expect(found).toEqual([
      { id: 'TSHH-210', url: '/register/tshh-210/', date: '2026-12-04', details: ['trips-when: TI-210 >= 255 degC → TI-210 >= 252 degC'], change: 'changed' },
    ]);
    // A change on a later day than the effective date counts; one on the same day or before does not.
    expect(registerChangedSince({ status: 'effective', effective: '2026-12-02' }, entries, history).map((c) => c.id)).toEqual(['TSHH-210', 'TI-210']);
    // A long detail (a whole block) is left to the entry's page.
    expect(registerChangedSince({ status: 'effective', effective: '2026-12-02' }, entries, history)[1].details).toEqual([]);
    for (const status of ['draft', 'in-review', 'approved', 'superseded', 'retired']) {
      expect(registerChangedSince({ status, effective: '2026-10-01' }, entries, history), status).toEqual([]);
    }
    expect(registerChangedSince({ status: 'effective' }, entries, history)).toEqual([]);
  });

  it('counts a change not committed yet', () => {
    const working = new Map([['TSHH-210', [change(undefined, ['trips-when: TI-210 >= 255 degC → TI-210 >= 250 degC'])]]]);
    expect(registerChangedSince({ status: 'effective', effective: '2026-12-03' }, entries, working)).toEqual([
      { id: 'TSHH-210', url: '/register/tshh-210/', details: ['trips-when: TI-210 >= 255 degC → TI-210 >= 250 degC'], change: 'changed' },
    ]);
  });
});
