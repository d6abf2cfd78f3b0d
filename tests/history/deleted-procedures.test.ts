// A procedure that was approved or in force at the base and is deleted instead of retired is an error of the check
// against that base; one moved to another file, a draft, or one kept with status retired is not.
import { execFileSync } from 'node:child_process';
import { mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../cli/run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

const repo = join(import.meta.dirname, '..', '..');
const inerting = readFileSync(join(repo, 'procedures', 'k-210-resin', 'u2-k210-inert-001.md'), 'utf8');
const draft = '---\nid: U2-K210-DRAFT-001\ntitle: A draft\nkind: normal\nrevision: 0\nstatus: draft\nsteps:\n  - { step: one, do: Check the kettle, confirm: Checked }\n---\n';

function plant(): { dir: string; git: (...args: string[]) => string } {
  const dir = tempFolder('stepwright-deleted-');
  const git = (...args: string[]) => execFileSync('git', args, { cwd: dir, encoding: 'utf8', env: { ...process.env, GIT_AUTHOR_NAME: 'Plant Engineer', GIT_AUTHOR_EMAIL: 'engineer@alder-reach.example', GIT_COMMITTER_NAME: 'Plant Engineer', GIT_COMMITTER_EMAIL: 'engineer@alder-reach.example' } }).trim();
  git('init', '-q', '-b', 'main');
  mkdirSync(join(dir, 'procedures', 'k-210'), { recursive: true });
  writeFileSync(join(dir, 'procedures', 'k-210', 'u2-k210-inert-001.md'), inerting);
  writeFileSync(join(dir, 'procedures', 'k-210', 'draft.md'), draft);
  git('add', '-A');
  git('commit', '-q', '-m', 'Inerting in force, and a draft');
  git('checkout', '-q', '-b', 'change');
  return { dir, git };
}

const deletions = (stdout: string) => stdout.split('\n').filter((l) => / error procedure-deleted /.test(l));

describe('a procedure deleted since the base', () => {
  it('is an error when it was in force there, committed or not, and names what to do', async () => {
    const { dir, git } = plant();
    rmSync(join(dir, 'procedures', 'k-210', 'u2-k210-inert-001.md'));
    rmSync(join(dir, 'procedures', 'k-210', 'draft.md'));
    const uncommitted = await runCli(['check', 'procedures', '--base', 'main'], dir);
    expect(deletions(uncommitted.stdout)).toEqual([
      'procedures/k-210/u2-k210-inert-001.md:1:1 error procedure-deleted U2-K210-INERT-001 (revision 3) was effective at main and its file is deleted: a procedure that was approved or in force is kept, with status retired or superseded, so that its revisions, its audit trail and the procedures that name it stay readable.',
    ]);
    expect(uncommitted.code).toBe(1);
    git('add', '-A');
    git('commit', '-q', '-m', 'Remove the inerting procedure');
    const committed = await runCli(['check', 'procedures', '--base', 'main'], dir);
    expect(deletions(committed.stdout)).toHaveLength(1);
    expect(committed.stdout).toContain('hint: Restore the file (git checkout main -- procedures/k-210/u2-k210-inert-001.md)');
    // The review of the change says the same, and fails.
    const review = await runCli(['review', '--base', 'main'], dir);
    expect(review.code).toBe(1);
    expect(review.stdout).toContain('`procedure-deleted` U2-K210-INERT-001 (revision 3) was effective at main and its file is deleted');
    // Against the branch's own last commit there is nothing deleted any more.
    expect(deletions((await runCli(['check', 'procedures'], dir)).stdout)).toEqual([]);
  });

  it('is not reported when the procedure moved to another file, or was a draft', async () => {
    const { dir } = plant();
    mkdirSync(join(dir, 'procedures', 'moved'));
    renameSync(join(dir, 'procedures', 'k-210', 'u2-k210-inert-001.md'), join(dir, 'procedures', 'moved', 'inerting.md'));
    rmSync(join(dir, 'procedures', 'k-210', 'draft.md'));
    const run = await runCli(['check', 'procedures', '--base', 'main'], dir);
    expect(deletions(run.stdout)).toEqual([]);
    expect((await runCli(['review', '--base', 'main'], dir)).stdout).not.toContain('procedure-deleted');
  });
});
