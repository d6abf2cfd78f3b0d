// `build` judges the rules that read the date at the build date (the last commit's date), `check` at today's date:
// a check made today also reports the errors the build will stop on at its own date, once, and says why.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCheckRun, type CheckRun, type CheckRunRequest } from '../../src/engine/check-run.ts';
import { loadManual } from '../../src/site-data/manual.ts';
import type { Diagnostic } from '../../src/parse/diagnostic.ts';
import { main } from '../../src/cli/main.ts';
import { ada, createTempRepo, type TempRepo } from '../history/temp-repo.ts';

// The procedure text follows tests/fixtures/rules/requires-not-in-force/ (Alder Reach Chemicals, Unit 2).
function procedure(keys: string[]): string {
  return [
    '---',
    ...keys,
    'revision: 1',
    // Certified before the last commit, and due for review after today's date: no review rule fires at either date.
    'review-by: 2026-12-20',
    'certifications:',
    '  - { name: Rui Okafor, role: Operations superintendent, date: 2025-12-20 }',
    'owner: Unit 2 Operations',
    'author: Ana Lindqvist',
    'change: First issue.',
    'approvals:',
    '  - { role: Process engineer, name: Ana Lindqvist, date: 2025-05-20, meaning: Authored and checked }',
    '  - { role: Operations superintendent, name: Rui Okafor, date: 2025-05-24, meaning: Approved for use }',
    'equipment: [K-210, XV-1]',
    'ppe: [Safety glasses]',
    'signals:',
    '  PI-1: { text: Line pressure, unit: kPa, range: [0, 600] }',
    'limits:',
    '  PI-1: { low: 90 kPa, high: 250 kPa, consequence: Above 250 kPa the relief valve lifts, correction: Close supply valve XV-1 }',
    'interlocks:',
    '  - { tag: PSHH-1, trips-when: PI-1 >= 300 kPa, action: Closes supply valve XV-1 }',
    'hazards:',
    '  - { level: caution, hazard: Pressurised line, consequence: Minor injury from a released fitting, avoid: Do not loosen fittings under pressure }',
    'steps:',
    '  - step: check',
    '    do: Check that XV-1 is closed',
    '    confirm: XV-1 shows closed',
    '---',
    '',
    '## Purpose',
    '',
    'Checks the supply line of K-210 before a charge. Site rules, training and local codes prevail.',
    '',
  ].join('\n');
}

const commitDate = '2025-12-29';
const clock = () => new Date('2026-12-05T10:00:00Z');
// In force only from a date after the last commit and before today's date.
const required = procedure(['id: U2-K210-INERT-001', 'title: Inert kettle K-210', 'kind: normal', 'status: approved', 'effective: 2026-12-01']);
const requiring = procedure(['id: U2-K210-CHARGE-001', 'title: Charge kettle K-210', 'kind: normal', 'status: effective', 'effective: 2025-06-01', 'requires:', '  - U2-K210-INERT-001']);
// A temporary procedure that expired after the last commit and before today's date: at the build date it is still in force.
const temporary = procedure(['id: U2-K210-TMP-001', 'title: Charge K-210 by hand while XV-1 is repaired', 'kind: temporary', 'status: effective', 'effective: 2025-06-01', 'expires: 2026-06-30', 'modifies: [U2-K210-CHARGE-001]']);

/** Line and column (1-based) of the first occurrence of `text` in `source`. */
function placeOf(source: string, text: string): { line: number; column: number } {
  const before = source.slice(0, source.indexOf(text)).split('\n');
  return { line: before.length, column: before.at(-1)!.length + 1 };
}

const words = /— on 2025-12-29, the date the build takes from the last commit, so `stepwright build` stops here\.$/;

describe('a check judges the dated rules at the build date too', () => {
  let repo: TempRepo;
  const check = (request: Partial<CheckRunRequest> = {}) =>
    runCheckRun({ cwd: repo.dir, env: {}, paths: ['procedures'], now: clock, date: 'clock', cache: false, ...request });
  const ofRule = (run: Pick<CheckRun, 'diagnostics'>, rule: string) => run.diagnostics.filter((d) => d.rule === rule);

  beforeAll(() => {
    repo = createTempRepo();
    repo.write('procedures/u2-k210-inert-001.md', required);
    repo.write('procedures/u2-k210-charge-001.md', requiring);
    repo.write('procedures/u2-k210-tmp-001.md', temporary);
    repo.commit('Unit 2 K-210 procedures', ada, commitDate);
  });
  afterAll(() => repo.remove());

  it('reports the error the build stops on, at its place, with the build date and where it comes from', async () => {
    const run = await check();
    const found = ofRule(run, 'requires-not-in-force');
    expect(found).toHaveLength(1);
    const [d] = found;
    // The entry under 'requires', where the build reports it.
    expect(`${d.file}:${d.line}:${d.column} ${d.severity}`).toBe(`procedures/u2-k210-charge-001.md:${placeOf(requiring, '  - U2-K210-INERT-001').line}:5 error`);
    expect(d.message).toBe("U2-K210-CHARGE-001 requires 'U2-K210-INERT-001', which is in force only from 2026-12-01 — on 2025-12-29, the date the build takes from the last commit, so `stepwright build` stops here.");
    expect(d.hint).toBe('Bring the required procedure into force first (or together with this one), or require one that is in force. '
      + "The build dates the manual by the date of the last commit (2025-12-29), not by today's date (2026-12-05); a new commit moves that date, or set STEPWRIGHT_TODAY to the date the build should use.");
    expect(d.hint).not.toMatch(/\n\s+at /);
    // Nothing else: the procedures are clean at both dates but for these two findings.
    expect(run.diagnostics.map((x) => `${x.file} ${x.severity} ${x.rule}`)).toEqual([
      'procedures/u2-k210-charge-001.md error requires-not-in-force', 'procedures/u2-k210-tmp-001.md error temporary-expired',
    ]);
    // It counts as an error of the run and is among the file's own findings (what review shows per file).
    expect(run.errors).toBe(2);
    expect(run.result.diagnostics).toEqual(run.diagnostics);
    const file = run.result.files.find((f) => f.file === 'procedures/u2-k210-charge-001.md')!;
    expect(file.diagnostics).toContainEqual(d);
    // The file's result still reads its procedure.
    expect(file.procedure?.id).toBe('U2-K210-CHARGE-001');
  });

  it('reports what the build itself reports, at the same place', async () => {
    const run = await check();
    const built = await loadManual({ cwd: repo.dir, env: { STEPWRIGHT_PROCEDURES: 'procedures' } });
    expect(built.today).toBe(commitDate);
    expect(built.errors).toBeGreaterThan(0);
    const buildErrors = built.run.diagnostics.filter((d) => d.severity === 'error');
    const place = (d: Diagnostic) => `${d.file}:${d.line}:${d.column} ${d.rule}`;
    // Every error that stops the build is an error of the check, at the same place.
    expect(run.diagnostics.filter((d) => d.severity === 'error').map(place)).toEqual(expect.arrayContaining(buildErrors.map(place)));
    const [atBuild] = buildErrors.filter((d) => d.rule === 'requires-not-in-force');
    const [atCheck] = ofRule(run, 'requires-not-in-force');
    expect({ ...atCheck, message: undefined, hint: undefined }).toEqual({ ...atBuild, message: undefined, hint: undefined });
    expect(atCheck.message.startsWith(atBuild.message.replace(/\.$/, ''))).toBe(true);
  });

  it("leaves the build's own check as it was: one finding, in its own words", async () => {
    const run = await check({ date: 'build' });
    expect(run.today).toBe(commitDate);
    expect(run.todaySource).toBe('last commit');
    expect(run.diagnostics.some((d) => words.test(d.message))).toBe(false);
    const found = ofRule(run, 'requires-not-in-force');
    expect(found.map((d) => d.message)).toEqual(["U2-K210-CHARGE-001 requires 'U2-K210-INERT-001', which is in force only from 2026-12-01."]);
    // The same as a check whose date is set to the build date.
    const fixed = await check({ env: { STEPWRIGHT_TODAY: commitDate } });
    expect(run.diagnostics).toEqual(fixed.diagnostics);
  });

  it('with STEPWRIGHT_TODAY set, judges at that one date and reports nothing twice', async () => {
    const atCommit = await check({ env: { STEPWRIGHT_TODAY: commitDate } });
    expect(atCommit.todaySource).toBe('STEPWRIGHT_TODAY');
    expect(ofRule(atCommit, 'requires-not-in-force').map((d) => d.message)).toEqual(["U2-K210-CHARGE-001 requires 'U2-K210-INERT-001', which is in force only from 2026-12-01."]);
    expect(atCommit.diagnostics.some((d) => words.test(d.message))).toBe(false);
    // Set to today's date, the build uses it too: nothing to report from the build date.
    const atToday = await check({ env: { STEPWRIGHT_TODAY: '2026-12-05' } });
    expect(ofRule(atToday, 'requires-not-in-force')).toEqual([]);
    expect(atToday.diagnostics.some((d) => / stops here\.$/.test(d.message))).toBe(false);
  });

  it('when today is the date of the last commit, finds exactly what it found before', async () => {
    const sameDay = await check({ now: () => new Date(`${commitDate}T18:00:00Z`) });
    const fixed = await check({ env: { STEPWRIGHT_TODAY: commitDate } });
    expect(sameDay.todaySource).toBe('clock');
    expect(sameDay.diagnostics).toEqual(fixed.diagnostics);
    expect(ofRule(sameDay, 'requires-not-in-force')).toHaveLength(1);
    expect(sameDay.diagnostics.some((d) => words.test(d.message))).toBe(false);
  });

  it('still reports once what only today\'s date finds (a temporary procedure expired since the last commit)', async () => {
    const run = await check();
    const expired = ofRule(run, 'temporary-expired');
    expect(expired.map((d) => `${d.file}:${d.line} ${d.severity} ${d.message}`)).toEqual([
      `procedures/u2-k210-tmp-001.md:${placeOf(temporary, 'expires:').line} error Temporary procedure U2-K210-TMP-001 expired on 2026-06-30 but is still 'effective'.`,
    ]);
    // At the build date it is in force, and the build does not report it.
    expect(ofRule(await check({ date: 'build' }), 'temporary-expired')).toEqual([]);
  });

  it('gives the same findings from its result cache, and keeps the two dates apart there', async () => {
    const cold = await check({ cache: true });
    const warm = await check({ cache: true });
    expect(warm.diagnostics).toEqual(cold.diagnostics);
    expect(ofRule(warm, 'requires-not-in-force').filter((d) => words.test(d.message))).toHaveLength(1);
    // The build reads the same cache and still finds its own finding in its own words.
    const built = await check({ cache: true, date: 'build' });
    expect(ofRule(built, 'requires-not-in-force').map((d) => d.message)).toEqual(["U2-K210-CHARGE-001 requires 'U2-K210-INERT-001', which is in force only from 2026-12-01."]);
  });
});

describe('the result cache', () => {
  let repo: TempRepo;
  beforeAll(() => {
    repo = createTempRepo();
    repo.write('procedures/u2-k210-inert-001.md', required);
    repo.write('procedures/u2-k210-charge-001.md', requiring);
    repo.commit('Unit 2 K-210 procedures', ada, commitDate);
  });
  afterAll(() => repo.remove());
  // Without the history rules, a new commit changes nothing the first run depends on: only the build date moves.
  const check = () => runCheckRun({ cwd: repo.dir, env: {}, paths: ['procedures'], now: clock, history: false });
  const atBuildDate = (run: CheckRun) => run.diagnostics.filter((d) => words.test(d.message) || / stops here\.$/.test(d.message)).map((d) => d.message);

  it('does not keep the errors of one build date for another: a new commit moves the date', async () => {
    expect(atBuildDate(await check())).toHaveLength(1);
    expect(atBuildDate(await check())).toHaveLength(1);
    // A commit dated after the required procedure came into force: the build no longer stops.
    repo.write('notes.txt', 'Shift handover notes are kept elsewhere.\n');
    repo.commit('A note, no procedure changed', ada, '2026-12-02');
    const later = await check();
    expect(atBuildDate(later)).toEqual([]);
    expect(later.errors).toBe(0);
  });
});

describe('a finding at both dates', () => {
  let repo: TempRepo;
  beforeAll(() => {
    repo = createTempRepo();
    // In force only from a date after today's: not in force at the build date either.
    repo.write('procedures/u2-k210-inert-001.md', required.replace('effective: 2026-12-01', 'effective: 2027-01-15'));
    repo.write('procedures/u2-k210-charge-001.md', requiring);
    repo.commit('Unit 2 K-210 procedures', ada, commitDate);
  });
  afterAll(() => repo.remove());

  it('is reported once, in the words of today\'s date', async () => {
    const run = await runCheckRun({ cwd: repo.dir, env: {}, paths: ['procedures'], now: clock, cache: false });
    expect(run.diagnostics.map((d) => `${d.file}:${d.line}:${d.column} ${d.severity} ${d.rule} ${d.message}`)).toEqual([
      `procedures/u2-k210-charge-001.md:${placeOf(requiring, '  - U2-K210-INERT-001').line}:5 error requires-not-in-force U2-K210-CHARGE-001 requires 'U2-K210-INERT-001', which is in force only from 2027-01-15.`,
    ]);
  });
});

describe('stepwright check prints the build-date error in every format and fails', () => {
  let repo: TempRepo;
  let first: string;
  beforeAll(() => {
    repo = createTempRepo();
    repo.write('procedures/u2-k210-inert-001.md', required);
    first = repo.commit('Inerting procedure for K-210', ada, '2025-12-20');
    repo.write('procedures/u2-k210-charge-001.md', requiring);
    repo.commit('Charging procedure for K-210', ada, commitDate);
  });
  afterAll(() => repo.remove());

  async function cli(argv: string[]) {
    let stdout = '';
    let stderr = '';
    const code = await main(argv, {
      stdout: { write: (t: string) => (stdout += t), isTTY: false },
      stderr: { write: (t: string) => (stderr += t), isTTY: false },
      cwd: repo.dir, env: { STEPWRIGHT_CACHE: 'off' }, now: clock,
    });
    return { code, stdout, stderr };
  }
  const line = placeOf(requiring, '  - U2-K210-INERT-001').line;

  it('human', async () => {
    const r = await cli(['check', 'procedures']);
    expect(r.code).toBe(1);
    expect(r.stdout).toContain(`procedures/u2-k210-charge-001.md:${line}:5 error requires-not-in-force U2-K210-CHARGE-001 requires 'U2-K210-INERT-001', which is in force only from 2026-12-01 — on 2025-12-29, the date the build takes from the last commit, so \`stepwright build\` stops here.`);
    expect(r.stdout).toContain("not by today's date (2026-12-05)");
    expect(r.stderr).toBe('');
  });

  it('json', async () => {
    const r = await cli(['check', '--format', 'json', 'procedures']);
    expect(r.code).toBe(1);
    const found = (JSON.parse(r.stdout) as Diagnostic[]).filter((d) => d.rule === 'requires-not-in-force');
    expect(found.map((d) => [d.file, d.line, d.column, d.severity, words.test(d.message)])).toEqual([['procedures/u2-k210-charge-001.md', line, 5, 'error', true]]);
  });

  it('github', async () => {
    const r = await cli(['check', '--format', 'github', 'procedures']);
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(new RegExp(`^::error file=procedures/u2-k210-charge-001\\.md,line=${line},endLine=${line},col=5,endColumn=\\d+,title=requires-not-in-force::.*2025-12-29, the date the build takes from the last commit`, 'm'));
  });

  it('sarif', async () => {
    const r = await cli(['check', '--format', 'sarif', 'procedures']);
    expect(r.code).toBe(1);
    const results = JSON.parse(r.stdout).runs[0].results as Array<{ ruleId: string; level: string; message: { text: string }; locations: Array<{ physicalLocation: { artifactLocation: { uri: string }; region: { startLine: number; startColumn: number } } }> }>;
    const found = results.filter((x) => x.ruleId === 'requires-not-in-force');
    expect(found).toHaveLength(1);
    expect(found[0].level).toBe('error');
    expect(found[0].message.text).toContain('the date the build takes from the last commit');
    expect(found[0].locations[0].physicalLocation.artifactLocation.uri).toBe('procedures/u2-k210-charge-001.md');
    expect(found[0].locations[0].physicalLocation.region).toMatchObject({ startLine: line, startColumn: 5 });
  });

  it('review shows it with the changed file, and fails', async () => {
    const r = await cli(['review', '--base', first, '--format', 'json']);
    expect(r.code).toBe(1);
    const review = JSON.parse(r.stdout) as { files: Array<{ path: string; diagnostics: Diagnostic[] }> };
    expect(review.files.map((f) => f.path)).toEqual(['procedures/u2-k210-charge-001.md']);
    const found = review.files[0].diagnostics.filter((d) => d.rule === 'requires-not-in-force');
    expect(found.map((d) => [d.line, d.column, d.severity, words.test(d.message)])).toEqual([[line, 5, 'error', true]]);
  });

  it('passes with STEPWRIGHT_TODAY set to a date at which the required procedure is in force', async () => {
    let stdout = '';
    const code = await main(['check', '--quiet', 'procedures'], {
      stdout: { write: (t: string) => (stdout += t), isTTY: false }, stderr: { write: () => {}, isTTY: false },
      cwd: repo.dir, env: { STEPWRIGHT_CACHE: 'off', STEPWRIGHT_TODAY: '2026-12-05' }, now: clock,
    });
    expect(stdout).not.toContain('requires-not-in-force');
    expect(code).toBe(0);
  });
});
