// Register pages' data: every demo register entry has a page model; where-used lists the procedures that use an
// entry (directly, or through the trips that start a shutdown function) with the steps that name it; the history
// lists every commit that changed an entry, key by key, and the uncommitted change in the working copy.
import { cpSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { readProcedureFiles } from '../../src/cli/read-procedure-files.ts';
import { loadRegister } from '../../src/engine/load-register.ts';
import { buildManualView } from '../../src/render/manual.ts';
import { buildRegisterView } from '../../src/render/register-view.ts';
import { registerHistory, revisedSince } from '../../src/history/register-history.ts';
import { registerPlace } from '../../src/engine/register-place.ts';
import { openRepository } from '../../src/engine/repository.ts';
import { createTempRepo, ada, bram, type TempRepo } from '../history/temp-repo.ts';

const root = join(import.meta.dirname, '..', '..');
const register = loadRegister(root, undefined, undefined)!;
const result = checkSources(readProcedureFiles(['procedures'], root), { today: '2026-12-02', register });
const manual = buildManualView({ files: result.files, root: 'procedures', today: '2026-12-02', register });
const view = buildRegisterView(register, result.files, manual, { href: (p) => `/manual${p}` });
const procedures = result.files.flatMap((f) => (f.procedure ? [f.procedure] : []));
const entry = (id: string) => view.entries.find((e) => e.id === id)!;

describe('register page models', () => {
  it('has one page per register entry, with unique URLs under the base, in every section', () => {
    expect(view.entries.map((e) => e.id).sort()).toEqual([...register.entries.keys()].sort());
    expect(new Set(view.entries.map((e) => e.url)).size).toBe(view.entries.length);
    for (const e of view.entries) expect(e.url).toBe(`/manual/register/${e.slug}/`);
    expect(view.sections.map((s) => s.section)).toEqual(['areas', 'equipment', 'signals', 'safety-functions', 'relief-devices', 'chemicals']);
    expect(view.indexUrl).toBe('/manual/register/');
  });

  it('lists as users exactly the procedures whose register uses name the entry', () => {
    for (const e of view.entries.filter((x) => x.section !== 'areas' && x.section !== 'safety-functions')) {
      const expected = procedures.filter((p) => p.registerUses?.some((u) => u.id === e.id)).map((p) => p.id).sort();
      expect(e.usedBy.map((u) => u.procedure.id), e.id).toEqual(expected);
    }
  });

  it('reaches the users of the shutdown function through the trips that start it', () => {
    const esd = entry('ESD-210');
    const starters = ['HS-2190', 'TSHH-210', 'PSHH-210'];
    const expected = procedures.filter((p) => p.registerUses?.some((u) => starters.includes(u.id))).map((p) => p.id).sort();
    expect(esd.usedBy.map((u) => u.procedure.id)).toEqual(expected);
    expect(esd.usedBy.find((u) => u.procedure.id === 'U2-K210-ESD-001')!.how).toMatch(/^Through .*HS-2190/);
    expect(esd.facts.find((f) => f.label === 'Started by')!.parts.filter((p) => p.href).map((p) => p.text).sort()).toEqual([...starters].sort());
  });

  it('names the steps that touch an entry, in step order, linked to their rows', () => {
    const tshh = entry('TSHH-210').usedBy.find((u) => u.procedure.id === 'U2-K210-TAR-SU-001')!;
    const test = tshh.steps.find((s) => s.id === 'test-trips');
    // Procedure URLs come from the manual view as they are.
    expect(test?.url).toBe(`${manual.procedures.find((p) => p.id === 'U2-K210-TAR-SU-001')!.url}#step-test-trips`);
    const xylene = entry('xylene').usedBy.find((u) => u.procedure.id === 'U2-K210-BATCH-001')!;
    expect(xylene.steps.map((s) => s.id)).toContain('charge-solvent');
    for (const s of xylene.steps) expect(s.action.toLowerCase()).toContain('xylene');
  });

  it('shows a signal with its limits, alarms and the trips on it, linked', () => {
    const ti = entry('TI-210');
    const fact = (label: string) => ti.facts.find((f) => f.label === label)?.parts.map((p) => p.text).join('');
    expect(fact('Operating limit, high')).toBe('245 degC');
    expect(fact('Alarm, high')).toBe('240 degC');
    expect(fact('Trips on this signal')).toContain('TSHH-210 at TI-210 >= 255 degC');
    expect(ti.facts.find((f) => f.label === 'Equipment')!.parts[0]).toEqual({ text: 'K-210', href: '/manual/register/k-210/' });
  });

  it('keeps the safety data sheet flag on chemicals only', () => {
    expect(view.entries.filter((e) => e.chemical).map((e) => e.id).sort()).toEqual([...register.chemicals.keys()].sort());
  });
});

describe('register history from git', () => {
  let repo: TempRepo;
  beforeAll(() => {
    repo = createTempRepo();
    cpSync(join(root, 'register'), join(repo.dir, 'register'), { recursive: true });
    repo.commit('Register for Unit 2', ada, '2026-11-30');
    const file = join(repo.dir, 'register', 'k-210.yaml');
    writeFileSync(file, readFileSync(file, 'utf8').replace('trips-when: TI-210 >= 255 degC', 'trips-when: TI-210 >= 265 degC'));
    repo.commit('Raise the K-210 high-high temperature trip', bram, '2026-12-01');
  });
  afterAll(() => repo.remove());

  it('lists each commit that changed an entry, newest first, key by key, and the uncommitted change', async () => {
    const r = (await openRepository({ cwd: repo.dir }, repo.dir))!;
    const place = registerPlace(r, join(repo.dir, 'register'), repo.dir);
    const now = loadRegister(repo.dir, undefined, undefined)!;
    const committed = await registerHistory(place, now);
    expect(committed.commits).toBe(2);
    expect(committed.uncommitted).toBe(false);
    const tshh = committed.byEntry.get('TSHH-210')!;
    expect(tshh.map((h) => [h.change, h.date, h.author])).toEqual([['changed', '2026-12-01', bram.name], ['added', '2026-11-30', ada.name]]);
    expect(tshh[0].details).toEqual(['trips-when: TI-210 >= 255 degC → TI-210 >= 265 degC']);
    expect(committed.byEntry.get('PSHH-210')).toHaveLength(1);

    const edited = loadRegister(repo.dir, undefined, undefined)!;
    edited.reliefDevices.get('PSV-210')!.setPressure = { ...edited.reliefDevices.get('PSV-210')!.setPressure, value: '240 kPag' };
    const working = await registerHistory(place, edited);
    expect(working.uncommitted).toBe(true);
    const psv = working.byEntry.get('PSV-210')!;
    expect(psv[0].commit).toBeUndefined();
    expect(psv[0].details).toEqual(['set-pressure: 250 kPag → 240 kPag']);
  });
});

describe('change impact on the register pages', () => {
  const revision = (n: number, commit: string, date: string) => ({ revision: n, introduced: { commit, date, author: 'A', subject: 's' } });
  const history = (revisions: Array<ReturnType<typeof revision>>, draft?: { revision: number | null; status: string }) =>
    ({ revisions, ...(draft ? { draft } : {}) }) as unknown as Parameters<typeof revisedSince>[0];

  it('counts a procedure as revised when its newest revision came with the change or after it', () => {
    const change = { commit: 'c2', when: '2026-12-01T10:00:00+00:00' };
    expect(revisedSince(history([revision(1, 'c1', '2026-11-01T10:00:00+00:00'), revision(2, 'c2', '2026-12-01T10:00:00+00:00')]), change)).toBe(true);
    expect(revisedSince(history([revision(1, 'c1', '2026-11-01T10:00:00+00:00'), revision(2, 'c3', '2026-12-02T08:00:00+01:00')]), change)).toBe(true);
    expect(revisedSince(history([revision(1, 'c1', '2026-11-01T10:00:00+00:00')]), change)).toBe(false);
    // Dates compare as instants, offsets included: 10:30+01:00 is 09:30 UTC, before the change.
    expect(revisedSince(history([revision(1, 'c0', '2026-12-01T10:30:00+01:00')]), change)).toBe(false);
    expect(revisedSince(undefined, change)).toBe(false);
  });

  it('for an uncommitted change, counts only a newer revision in the working copy', () => {
    const change = { commit: undefined, when: undefined };
    expect(revisedSince(history([revision(3, 'c1', '2026-11-01T10:00:00+00:00')], { revision: 4, status: 'draft' }), change)).toBe(true);
    expect(revisedSince(history([revision(3, 'c1', '2026-11-01T10:00:00+00:00')], { revision: 3, status: 'effective' }), change)).toBe(false);
    expect(revisedSince(history([revision(3, 'c1', '2026-11-01T10:00:00+00:00')]), change)).toBe(false);
  });
});
