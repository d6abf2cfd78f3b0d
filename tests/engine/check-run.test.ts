// One engine for every command: what fails `check` stops `build` with the same report — configuration
// problems, history rules against the last commit — and markdown that is not a procedure is skipped with a note.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCheckRun } from '../../src/engine/check-run.ts';
import { findProcedureFiles } from '../../src/engine/find-procedure-files.ts';
import { loadManual, formatCheckFailure } from '../../src/site-data/manual.ts';
import { formatHuman, summarize } from '../../src/render/format-diagnostics.ts';
import { runCli } from '../cli/run-cli.ts';
import { ada, createTempRepo, procedureText, stepsV1, type TempRepo } from '../history/temp-repo.ts';
import { tempFolder } from '../temp-folder.ts';

const env = { STEPWRIGHT_TODAY: '2026-12-01' };

function folderWith(files: Record<string, string>): string {
  const dir = tempFolder('stepwright-engine-');
  for (const [name, text] of Object.entries(files)) {
    mkdirSync(join(dir, name, '..'), { recursive: true });
    writeFileSync(join(dir, name), text);
  }
  return dir;
}

const good = procedureText({ revision: 1, status: 'draft', steps: stepsV1 });

describe('configuration problems', () => {
  it('a config naming an unknown rule fails check and stops the build with the same report', async () => {
    const dir = folderWith({ 'procedures/a.md': good, 'stepwright.config.yaml': 'rules:\n  no-such-rule: off\n' });
    const check = await runCli(['check', 'procedures'], dir);
    expect(check.code).toBe(1);
    expect(check.stdout).toMatch(/stepwright\.config\.yaml:2:3 error bad-config 'no-such-rule' is not a Stepwright rule/);

    const loaded = await loadManual({ cwd: dir, env: { ...env, STEPWRIGHT_PROCEDURES: 'procedures' } });
    expect(loaded.errors).toBe(1);
    expect(loaded.view).toBeUndefined();
    // The build prints exactly what check prints.
    expect(formatCheckFailure(loaded, false)).toBe(check.stdout);

    const build = await runCli(['build', '--out', join(dir, 'site')], dir);
    expect(build.code).toBe(1);
    expect(build.stdout).toBe(check.stdout);
    expect(build.stderr).toMatch(/stopped, the procedures have 1 error/);
  });
});

describe('history rules stop a build', () => {
  let repo: TempRepo;
  beforeAll(() => {
    repo = createTempRepo();
    const signed = [{ role: 'Process engineer', name: 'Ada Ferrand', date: '2026-01-15' }, { role: 'Operations superintendent', name: 'Bram Okonjo', date: '2026-01-18' }];
    repo.write('procedures/a.md', procedureText({ revision: 1, status: 'effective', effective: '2026-01-20', approvals: signed, steps: stepsV1 }));
    repo.commit('rev 1 effective', ada, '2026-01-20');
    // Edited in place: same revision, still effective, a limit raised.
    repo.write('procedures/a.md', procedureText({ revision: 1, status: 'effective', effective: '2026-01-20', approvals: signed, steps: stepsV1, high: '250 degC' }));
  });
  afterAll(() => repo.remove());

  it('effective-edited-in-place fails check and the build alike', async () => {
    const check = await runCli(['check', 'procedures'], repo.dir);
    expect(check.code).toBe(1);
    expect(check.stdout).toMatch(/effective-edited-in-place|revision-not-bumped/);
    const loaded = await loadManual({ cwd: repo.dir, env: { ...env, STEPWRIGHT_PROCEDURES: 'procedures' } });
    expect(loaded.view).toBeUndefined();
    expect(loaded.run.diagnostics.map((d) => d.rule)).toEqual(JSON.parse((await runCli(['check', '--format', 'json', 'procedures'], repo.dir)).stdout).map((d: { rule: string }) => d.rule));
    const build = await runCli(['build', '--out', join(repo.dir, 'site')], repo.dir);
    expect(build.code).toBe(1);
    expect(build.stdout).toBe(check.stdout);
  });
});

describe('markdown that is not a procedure', () => {
  const readme = '# Procedures of Unit 2\n\nEach file here is one operating procedure. Ask the shift supervisor before editing.\n';

  it('is skipped with an info line when found in a folder, and the rest checks clean', async () => {
    const dir = folderWith({ 'procedures/a.md': good, 'procedures/README.md': readme, 'procedures/notes/handover.md': 'Notes only.\n' });
    const run = await runCheckRun({ cwd: dir, env, paths: ['procedures'], history: false });
    expect(run.skipped.map((s) => s.file)).toEqual(['procedures/README.md', 'procedures/notes/handover.md']);
    expect(run.inputs.map((i) => i.file)).toEqual(['procedures/a.md']);
    expect(run.errors).toBe(0);
    const notes = run.diagnostics.filter((d) => d.rule === 'not-a-procedure');
    expect(notes.map((d) => [d.file, d.severity]).sort()).toEqual([['procedures/README.md', 'info'], ['procedures/notes/handover.md', 'info']]);
    const check = await runCli(['check', 'procedures'], dir);
    expect(check.code).toBe(0);
    expect(check.stdout).toMatch(/procedures\/README\.md:1:1 info not-a-procedure Skipped: procedures\/README\.md is not a procedure/);
  });

  it('a file named on the command line is always checked as a procedure', async () => {
    const dir = folderWith({ 'procedures/README.md': readme });
    const check = await runCli(['check', 'procedures/README.md'], dir);
    expect(check.code).toBe(1);
    expect(check.stdout).toContain('missing-front-matter');
  });

  // Files that look like a procedure but yield none stay errors: never a silent drop.
  const lookalikes: Record<string, string> = {
    'empty front-matter': '---\n---\n# Start-up\n',
    'a list as front-matter': '---\n- one\n- two\n---\n',
    'a scalar as front-matter': '---\njust text\n---\n',
    'an extra fence on top': '---\n---\nid: U2-X-001\ntitle: X\n---\n',
    'keys without fences': 'id: U2-X-001\ntitle: Start-up of X\nsteps:\n  - step: a\n    do: Open valve\n',
    'blank lines before the fence': '\n\n---\nid: U2-X-001\n---\n',
    'unclosed front-matter': '---\nid: U2-X-001\ntitle: X\n',
  };
  for (const [name, text] of Object.entries(lookalikes)) {
    it(`${name} stays an error`, async () => {
      const dir = folderWith({ 'procedures/x.md': text });
      const run = await runCheckRun({ cwd: dir, env, paths: ['procedures'], history: false });
      expect(run.skipped).toEqual([]);
      expect(run.errors).toBeGreaterThan(0);
    });
  }
});

describe('paths', () => {
  it('expands globs with braces and classes, and reports a glob that matches nothing', async () => {
    const dir = folderWith({ 'procedures/u1/a.md': good, 'procedures/u2/b.md': good.replace('U2-TEST-001', 'U2-TEST-002'), 'procedures/u3/c.md': good.replace('U2-TEST-001', 'U2-TEST-003') });
    const braces = await runCheckRun({ cwd: dir, env, paths: ['procedures/{u1,u3}/*.md'], history: false });
    expect(braces.inputs.map((i) => i.file)).toEqual(['procedures/u1/a.md', 'procedures/u3/c.md']);
    const klass = await runCheckRun({ cwd: dir, env, paths: ['procedures/u[2]/**/*.md'], history: false });
    expect(klass.inputs.map((i) => i.file)).toEqual(['procedures/u2/b.md']);
    const none = await runCli(['check', 'procedures/u9*/*.md'], dir);
    expect(none.code).toBe(1);
    expect(none.stdout).toMatch(/no markdown file matches the pattern procedures\/u9\*\/\*\.md/);
  });

  it("reads one procedure from standard input for '-'", async () => {
    const dir = folderWith({});
    const run = await runCheckRun({ cwd: dir, env, paths: ['-'], history: { base: undefined }, stdin: async () => good.replace('status: draft', 'status: nonsense') });
    expect(run.inputs.map((i) => i.file)).toEqual(['<stdin>']);
    expect(run.diagnostics.some((d) => d.file === '<stdin>' && d.severity === 'error')).toBe(true);
    const report = formatHuman(run.diagnostics, run.texts, false) + summarize(run.diagnostics, run.inputs.length);
    expect(report).toMatch(/^<stdin>:\d+:\d+ error/m);
  });
});

describe('part of the manual', () => {
  const root = join(import.meta.dirname, '..', '..');
  const unused = (paths: string[] | undefined) => runCheckRun({ cwd: root, env, paths, history: false, cache: false })
    .then((run) => run.diagnostics.filter((d) => d.rule === 'register-entry-unused'));

  it('does not call register entries unused when only some procedures were checked, and says so once', async () => {
    // The demo register holds H-220 entries that only the H-220 procedures use.
    const some = await unused(['procedures/k-210-resin']);
    expect(some).toHaveLength(1);
    expect(some[0]).toMatchObject({ severity: 'info', file: 'register/areas.yaml' });
    const left = findProcedureFiles(['procedures'], root).filter((f) => !f.file.includes('k-210-resin')).length;
    expect(some[0].message).toMatch(new RegExp(`^Register entries that no procedure uses were not looked for: ${left} files in procedures/ were not checked`));
    // The whole folder, named or by default: every entry is used, nothing to say.
    expect(await unused(['procedures'])).toEqual([]);
    expect(await unused(undefined)).toEqual([]);
  });

  it('reports a call or a requirement outside the files checked as not checked (info), not as an unknown procedure', async () => {
    const run = await runCheckRun({ cwd: root, env, paths: ['procedures/k-210-resin/u2-k210-tar-su-001.md', 'procedures/k-210-resin/u2-k210-batch-001.md'], history: false, cache: false });
    const refs = run.diagnostics.filter((d) => d.rule === 'call-unknown-procedure' || d.rule === 'requires-unknown-procedure');
    expect(refs.map((d) => [d.rule, d.severity])).toEqual([['requires-unknown-procedure', 'info'], ['call-unknown-procedure', 'info']]);
    expect(refs.every((d) => d.message.includes("'U2-K210-INERT-001', which is not among the files checked"))).toBe(true);
    expect(run.errors).toBe(0);
    // With the inerting procedure among the files, nothing is left to say.
    const all = await runCheckRun({ cwd: root, env, paths: ['procedures/k-210-resin'], history: false, cache: false });
    expect(all.diagnostics.filter((d) => d.rule === 'call-unknown-procedure' || d.rule === 'requires-unknown-procedure')).toEqual([]);
  });
});
