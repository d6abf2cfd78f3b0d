// A procedure moved to another file and changed so much (or not yet added to git) that git does not take it for a
// rename still has its previous version: the file deleted since the base that holds the same procedure id.
import { execFileSync } from 'node:child_process';
import { mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { previousFromGit } from '../../src/engine/repository.ts';
import { procedureIdIn } from '../../src/history/previous-version.ts';
import { runCli } from '../cli/run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

const repo = join(import.meta.dirname, '..', '..');
const inerting = readFileSync(join(repo, 'procedures', 'k-210-resin', 'u2-k210-inert-001.md'), 'utf8');

function plant(): { dir: string; git: (...args: string[]) => string } {
  const dir = tempFolder('stepwright-moved-');
  const git = (...args: string[]) => execFileSync('git', args, { cwd: dir, encoding: 'utf8', env: { ...process.env, GIT_AUTHOR_NAME: 'Plant Engineer', GIT_AUTHOR_EMAIL: 'engineer@alder-reach.example', GIT_COMMITTER_NAME: 'Plant Engineer', GIT_COMMITTER_EMAIL: 'engineer@alder-reach.example' } }).trim();
  git('init', '-q', '-b', 'main');
  mkdirSync(join(dir, 'procedures', 'k-210'), { recursive: true });
  writeFileSync(join(dir, 'procedures', 'k-210', 'u2-k210-inert-001.md'), inerting);
  writeFileSync(join(dir, 'procedures', 'k-210', 'other.md'), '---\nid: U2-K210-OTHER-001\n---\n');
  git('add', '-A');
  git('commit', '-q', '-m', 'Inerting, effective');
  return { dir, git };
}

/** The inerting procedure with its steps rewritten (too different for git to call it a rename). */
const rewritten = inerting.replace(/\nsteps:[\s\S]*?\n---/, '\nsteps:\n  - step: vent\n    do: Vent the kettle to the scrubber\n    until: elapsed >= 10 min\n---');

describe('a procedure moved since the base', () => {
  it('is compared with the deleted file of the same id, added to git or not', async () => {
    const { dir, git } = plant();
    mkdirSync(join(dir, 'procedures', 'moved'));
    rmSync(join(dir, 'procedures', 'k-210', 'u2-k210-inert-001.md'));
    writeFileSync(join(dir, 'procedures', 'moved', 'inert.md'), rewritten);
    const input = [{ file: 'procedures/moved/inert.md', text: rewritten }];
    const untracked = await previousFromGit(input, { cwd: dir });
    expect(untracked.previous?.('procedures/moved/inert.md')?.text).toBe(inerting);
    git('add', '-A');
    const added = await previousFromGit(input, { cwd: dir });
    expect(added.previous?.('procedures/moved/inert.md')?.text).toBe(inerting);
    // And the check says the effective procedure was edited in place, as it does for the file under its old name.
    const check = await runCli(['check', 'procedures'], dir);
    expect(check.stdout).toMatch(/procedures\/moved\/inert\.md:\d+:\d+ error effective-edited-in-place/);
  });

  it('is not matched when two files claim the id, or when the old file is still there', async () => {
    const { dir } = plant();
    renameSync(join(dir, 'procedures', 'k-210', 'u2-k210-inert-001.md'), join(dir, 'procedures', 'a.md'));
    writeFileSync(join(dir, 'procedures', 'a.md'), rewritten);
    writeFileSync(join(dir, 'procedures', 'b.md'), rewritten);
    const twice = await previousFromGit([{ file: 'procedures/a.md', text: rewritten }, { file: 'procedures/b.md', text: rewritten }], { cwd: dir });
    expect(twice.previous?.('procedures/a.md')).toBeUndefined();
    expect(twice.previous?.('procedures/b.md')).toBeUndefined();
    const kept = plant();
    writeFileSync(join(kept.dir, 'procedures', 'copy.md'), rewritten);
    const copy = await previousFromGit([{ file: 'procedures/copy.md', text: rewritten }], { cwd: kept.dir });
    expect(copy.previous?.('procedures/copy.md')).toBeUndefined();
  });

  it('reads the id as YAML writes it: plain, quoted, with a comment, after a byte-order mark (property)', () => {
    const id = fc.stringMatching(/^[A-Z][A-Z0-9]{0,5}(-[A-Z0-9]{1,5}){0,3}$/);
    fc.assert(
      fc.property(id, fc.constantFrom('', '"', "'"), fc.boolean(), fc.boolean(), fc.boolean(), (value, quote, comment, bom, crlf) => {
        const eol = crlf ? '\r\n' : '\n';
        const text = `${bom ? '\uFEFF' : ''}---${eol}title: T${eol}id: ${quote}${value}${quote}${comment ? ' # the id' : ''}${eol}kind: normal${eol}---${eol}${eol}id: NOT-THIS${eol}`;
        expect(procedureIdIn(text)).toBe(value);
      }),
      { numRuns: 300 },
    );
    expect(procedureIdIn('# no front-matter\nid: X\n')).toBeUndefined();
  });
});
