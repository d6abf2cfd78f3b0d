// review reports the errors a change leaves in files it did not touch (a caller of a deleted procedure): the build
// stops on them, so the review must not pass over them.
import { execFileSync } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../cli/run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

const fixtures = join(import.meta.dirname, '..', 'fixtures', 'rules', 'call-expansion-problem');

describe('review and files the change did not touch', () => {
  it('lists the error a deleted procedure leaves in its caller, counts it, and fails', async () => {
    const dir = tempFolder('stepwright-review-other-');
    const env = { ...process.env, GIT_AUTHOR_NAME: 'Plant Engineer', GIT_AUTHOR_EMAIL: 'engineer@alder-reach.example', GIT_COMMITTER_NAME: 'Plant Engineer', GIT_COMMITTER_EMAIL: 'engineer@alder-reach.example' };
    const git = (...args: string[]) => execFileSync('git', args, { cwd: dir, env, encoding: 'utf8' });
    git('init', '-q', '-b', 'main');
    mkdirSync(join(dir, 'procedures'));
    writeFileSync(join(dir, 'procedures', 'caller.md'), readFileSync(join(fixtures, 'valid-caller.md'), 'utf8'));
    writeFileSync(join(dir, 'procedures', 'callee.md'), readFileSync(join(fixtures, 'valid-callee.md'), 'utf8'));
    git('add', '-A');
    git('commit', '-q', '-m', 'Caller and the shared operation it calls');
    const unchanged = await runCli(['review', '--base', 'main', '--format', 'json'], dir);
    expect(JSON.parse(unchanged.stdout).otherErrors.filter((d: { rule: string }) => d.rule === 'call-unknown-procedure')).toEqual([]);

    git('checkout', '-q', '-b', 'retire-shared-operation');
    rmSync(join(dir, 'procedures', 'callee.md'));
    git('commit', '-q', '-am', 'Delete the shared operation');
    const review = await runCli(['review', '--base', 'main'], dir);
    expect(review.code).toBe(1);
    expect(review.stdout).toMatch(/1 procedure changed, .*in the changed procedures\. And \d+ errors? in files this change did not touch \(listed below\)\./);
    expect(review.stdout).toContain('#### Errors in files this change did not touch');
    expect(review.stdout).toMatch(/- `procedures\/caller\.md:\d+:\d+` \*\*call-unknown-procedure\*\*/);
    const json = JSON.parse((await runCli(['review', '--base', 'main', '--format', 'json'], dir)).stdout);
    expect(json.otherErrors.some((d: { rule: string; file: string }) => d.rule === 'call-unknown-procedure' && d.file === 'procedures/caller.md')).toBe(true);
    expect(json.errors).toBeGreaterThanOrEqual(json.otherErrors.length);
  });
});
