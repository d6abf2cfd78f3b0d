// A build from a shallow clone says in its log that the history it publishes is cut short (the pages say it too).
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { tempFolder } from '../temp-folder.ts';

const repo = join(import.meta.dirname, '..', '..');
const nitrogen = readFileSync(join(repo, 'procedures', 'utilities', 'u2-n2-su-001.md'), 'utf8');
const env = { ...process.env, NO_COLOR: '1', STEPWRIGHT_TODAY: '2026-12-01', GIT_AUTHOR_NAME: 'Plant Engineer', GIT_AUTHOR_EMAIL: 'engineer@alder-reach.example', GIT_COMMITTER_NAME: 'Plant Engineer', GIT_COMMITTER_EMAIL: 'engineer@alder-reach.example' };

describe('a build from a shallow clone', () => {
  it('says that the history stops at the clone and how to fetch it', () => {
    const dir = tempFolder('stepwright-shallow-');
    const origin = join(dir, 'origin');
    mkdirSync(join(origin, 'procedures'), { recursive: true });
    const git = (cwd: string, ...args: string[]) => execFileSync('git', args, { cwd, env, encoding: 'utf8' });
    git(origin, 'init', '-q', '-b', 'main');
    writeFileSync(join(origin, 'procedures', 'u2-n2-su-001.md'), nitrogen.replace('revision: 1', 'revision: 0'));
    git(origin, 'add', '-A');
    git(origin, 'commit', '-q', '-m', 'Nitrogen start-up, revision 0');
    writeFileSync(join(origin, 'procedures', 'u2-n2-su-001.md'), nitrogen);
    git(origin, 'commit', '-q', '-am', 'Nitrogen start-up, revision 1');
    git(dir, 'clone', '-q', '--depth', '1', `file://${origin}`, 'shallow');
    const build = (cwd: string) => spawnSync(process.execPath, [join(repo, 'bin', 'stepwright.mjs'), 'build'], { cwd, env, encoding: 'utf8', timeout: 200_000 });
    const shallow = build(join(dir, 'shallow'));
    expect(shallow.status, shallow.stderr).toBe(0);
    expect(shallow.stdout).toContain("History: this is a shallow clone, so the revision pages, redlines and audit trail show only the commits it holds. Fetch the full history with 'git fetch --unshallow'");
    // (A build from a full clone says nothing of the kind: tests/cli/output-place.test.ts.)
  }, 420_000);
});
