// Any folder, any repository: the configuration is found upward to the repository top, the procedures folder
// is decided in one place, and history comes from the repository that holds the procedures.
import { mkdirSync, realpathSync, writeFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { findConfigFile, proceduresFolder, projectRoot } from '../../src/cli/project.ts';
import { buildDate } from '../../src/site-data/manual.ts';
import { ada, bram, createTempRepo, procedureText, stepsV1 } from '../history/temp-repo.ts';
import { runCli } from './run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

describe('the configuration file', () => {
  const top = realpathSync(tempFolder('sw-project-'));
  mkdirSync(join(top, 'repo', '.git'), { recursive: true });
  mkdirSync(join(top, 'repo', 'area', 'unit'), { recursive: true });

  it('is the nearest one from the working folder up to the repository top, never above it', () => {
    // One above the repository belongs to someone else.
    writeFileSync(join(top, 'stepwright.config.yaml'), 'rules: {}\n');
    expect(findConfigFile(join(top, 'repo', 'area', 'unit'))).toBeUndefined();
    writeFileSync(join(top, 'repo', 'stepwright.config.yaml'), 'rules: {}\n');
    expect(findConfigFile(join(top, 'repo', 'area', 'unit'))).toBe(join(top, 'repo', 'stepwright.config.yaml'));
    writeFileSync(join(top, 'repo', 'area', 'stepwright.config.yaml'), 'rules: {}\n');
    expect(findConfigFile(join(top, 'repo', 'area', 'unit'))).toBe(join(top, 'repo', 'area', 'stepwright.config.yaml'));
    expect(projectRoot(join(top, 'repo', 'area', 'unit'))).toBe(join(top, 'repo'));
  });

  it('names the procedures folder relative to itself; the option and the environment come first', () => {
    const repo = join(top, 'repo2');
    mkdirSync(join(repo, '.git'), { recursive: true });
    mkdirSync(join(repo, 'docs', 'sub'), { recursive: true });
    const io = { cwd: join(repo, 'docs', 'sub'), env: {} };
    expect(proceduresFolder(io)).toBe('procedures');
    writeFileSync(join(repo, 'stepwright.config.yaml'), 'procedures: manual/sops\n');
    expect(proceduresFolder(io)).toBe(join('..', '..', 'manual', 'sops'));
    expect(proceduresFolder({ ...io, env: { STEPWRIGHT_PROCEDURES: 'here' } })).toBe('here');
    expect(proceduresFolder({ ...io, env: { STEPWRIGHT_PROCEDURES: 'here' } }, { procedures: 'there' })).toBe('there');
  });
});

describe('history from the repository that holds the procedures', () => {
  const repo = createTempRepo();
  afterAll(() => repo.remove());
  const v1 = { revision: 1, steps: stepsV1, change: 'First issue.' };
  repo.write('plant/procedures/u2-test-001.md', procedureText({ ...v1, status: 'draft' }));
  repo.commit('Draft rev 1', ada, '2026-01-10');
  repo.write('plant/procedures/u2-test-001.md', procedureText({ ...v1, status: 'effective', effective: '2026-01-20', approvals: [{ role: 'Process engineer', name: 'Ada Ferrand', date: '2026-01-15' }] }));
  repo.commit('Rev 1 effective', bram, '2026-01-20');
  // An edit of the effective revision without a new revision number: only history can see it.
  repo.write('plant/procedures/u2-test-001.md', procedureText({ ...v1, status: 'effective', effective: '2026-01-20', approvals: [{ role: 'Process engineer', name: 'Ada Ferrand', date: '2026-01-15' }], high: '250 degC' }));
  // Started from a folder outside the repository (another git repository, as the tool's own checkout would be).
  const elsewhere = createTempRepo();
  afterAll(() => elsewhere.remove());
  const procedures = join(repo.dir, 'plant', 'procedures');

  it('check judges revisions against the procedures\' repository, not the working folder\'s', async () => {
    const run = await runCli(['check', '--procedures', relative(elsewhere.dir, procedures)], elsewhere.dir);
    expect(run.stdout).toMatch(/revision-not-bumped|effective-edited-in-place/);
  });

  it('review compares against a base in the procedures\' repository', async () => {
    const run = await runCli(['review', '--base', 'HEAD~1', '--procedures', procedures], elsewhere.dir);
    expect(run.stderr).toBe('');
    expect(run.stdout).toContain('U2-TEST-001');
  });

  it('the build date is the last commit of the procedures\' repository', () => {
    elsewhere.write('x.txt', 'x');
    elsewhere.commit('Unrelated', ada, '2030-06-01');
    expect(buildDate({ cwd: elsewhere.dir, env: { STEPWRIGHT_PROCEDURES: procedures } }, [])).toEqual({ today: '2026-01-20', source: 'last commit' });
  });
});
