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
    // Without a configuration: procedures/ at the top of the repository, not in the working folder.
    expect(proceduresFolder(io)).toBe(join('..', '..', 'procedures'));
    writeFileSync(join(repo, 'stepwright.config.yaml'), 'procedures: manual/sops\n');
    expect(proceduresFolder(io)).toBe(join('..', '..', 'manual', 'sops'));
    expect(proceduresFolder({ ...io, env: { STEPWRIGHT_PROCEDURES: 'here' } })).toBe('here');
    expect(proceduresFolder({ ...io, env: { STEPWRIGHT_PROCEDURES: 'here' } }, { procedures: 'there' })).toBe('there');
  });

  it('is the same procedures/ folder from any folder of the repository when nothing names one', () => {
    const repo = join(top, 'repo3');
    mkdirSync(join(repo, '.git'), { recursive: true });
    mkdirSync(join(repo, 'procedures', 'k-210', 'old'), { recursive: true });
    mkdirSync(join(repo, 'docs'), { recursive: true });
    const from = (...parts: string[]) => join(repo, ...parts, proceduresFolder({ cwd: join(repo, ...parts), env: {} }));
    for (const cwd of [[], ['docs'], ['procedures'], ['procedures', 'k-210', 'old']]) expect(from(...cwd)).toBe(join(repo, 'procedures'));
    // A configuration in a sub-folder (a second plant) is the top of its own project: its procedures/ is beside it,
    // before it exists too, never the first plant's.
    mkdirSync(join(repo, 'plant-b', 'notes'), { recursive: true });
    writeFileSync(join(repo, 'plant-b', 'stepwright.config.yaml'), 'rules: {}\n');
    expect(from('plant-b', 'notes')).toBe(join(repo, 'plant-b', 'procedures'));
    mkdirSync(join(repo, 'plant-b', 'procedures'));
    expect(from('plant-b', 'notes')).toBe(join(repo, 'plant-b', 'procedures'));
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

describe('the same check from any folder of the repository', () => {
  const repo = realpathSync(tempFolder('sw-anyfolder-'));
  mkdirSync(join(repo, '.git'));
  mkdirSync(join(repo, 'procedures', 'zz'), { recursive: true });
  mkdirSync(join(repo, 'procedures', 'k-210'), { recursive: true });
  writeFileSync(join(repo, 'stepwright.config.yaml'), 'overrides:\n  - files: procedures/zz\n    rules:\n      vague-term: error\n  - files: "**/k-210/*.md"\n    rules:\n      vague-term: off\n');
  const vague = (id: string) => `---\nid: ${id}\ntitle: Purge kettle K-210\nkind: normal\nrevision: 0\nstatus: draft\nsteps:\n  - step: purge\n    do: Purge the kettle with nitrogen as required\n    confirm: AI-210 reads below 2 percent\n---\n\n## Purpose\n\nPurges the kettle.\n`;
  writeFileSync(join(repo, 'procedures', 'zz', 'u2-example-001.md'), vague('U2-EXAMPLE-001'));
  writeFileSync(join(repo, 'procedures', 'k-210', 'u2-example-002.md'), vague('U2-EXAMPLE-002'));
  const severities = (stdout: string) => [...stdout.matchAll(/(u2-example-00\d)\.md:\d+:\d+ (\w+) vague-term/g)].map((m) => `${m[1]} ${m[2]}`);

  it.each([
    ['the repository top', [], []],
    ['the procedures folder', ['procedures'], []],
    ['the folder the override names', ['procedures', 'zz'], ['..']],
    ['a folder beside it', ['procedures', 'k-210'], ['..']],
  ])('applies the overrides by their place beside the configuration file, from %s', async (_where, cwd, args) => {
    const run = await runCli(['check', ...args], join(repo, ...cwd));
    expect(run.stderr).toBe('');
    expect(severities(run.stdout)).toEqual(['u2-example-001 error']);
    expect(run.code).toBe(1);
  });
});
