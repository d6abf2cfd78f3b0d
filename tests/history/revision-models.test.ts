// A revision's pages (its own page, its redline against the one before, the procedure's page while it is the revision
// in force) read every committed revision the same way, against the plant register as the check reads a previous
// version: a procedure that takes its trips and limits from the register shows them on the page of its revision in
// force, and a redline shows neither their addition nor their removal when the texts did not change them.
import { execFileSync } from 'node:child_process';
import { cpSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadManual } from '../../src/site-data/manual.ts';
import { committedProcedure, historiesOf, inForcePage } from '../../src/site-data/history.ts';
import { redline } from '../../src/history/redline.ts';
import { tempFolder } from '../temp-folder.ts';

const demo = join(import.meta.dirname, '../..');
const file = 'procedures/u2-h220-em-001.md';

function git(dir: string, args: string[], date: string): void {
  execFileSync('git', args, {
    cwd: dir, stdio: 'ignore',
    env: { ...process.env, GIT_AUTHOR_NAME: 'Felix Brandt', GIT_AUTHOR_EMAIL: 'felix@alder-reach.example', GIT_COMMITTER_NAME: 'Felix Brandt', GIT_COMMITTER_EMAIL: 'felix@alder-reach.example', GIT_AUTHOR_DATE: `${date}T09:00:00Z`, GIT_COMMITTER_DATE: `${date}T09:00:00Z` },
  });
}

describe('the models of committed revisions', () => {
  /** A repository with the hot-oil leak response at revision 4 (effective), then revision 5 with another title. */
  async function twoRevisions(status5: string) {
    const dir = tempFolder('stepwright-revision-models-');
    cpSync(join(demo, 'register'), join(dir, 'register'), { recursive: true });
    mkdirSync(join(dir, 'procedures'));
    // It takes its burner trips, signals and limits from the register (`uses:`).
    // The demo's current text, whatever its revision number, plays revision 4 here.
    const revision4 = readFileSync(join(demo, 'procedures/h-220-hot-oil/u2-h220-em-001.md'), 'utf8').replace(/^revision: \d+$/m, 'revision: 4');
    expect(revision4).toMatch(/^uses: \[/m);
    expect(revision4).not.toMatch(/^interlocks:/m);
    writeFileSync(join(dir, file), revision4);
    git(dir, ['init', '-q', '-b', 'main'], '2026-12-01');
    git(dir, ['add', '-A'], '2026-12-01');
    git(dir, ['commit', '-q', '-m', 'Revision 4'], '2026-12-01');
    // The working copy is the last commit, which the check reads with the register too.
    const revision5 = revision4.replace(/^revision: 4$/m, 'revision: 5').replace(/^status: effective$/m, `status: ${status5}`)
      .replace(/^effective: .*\n/m, '').replace(/^title: (.*)$/m, 'title: $1, with the fire-water monitors');
    writeFileSync(join(dir, file), revision5);
    git(dir, ['commit', '-q', '-am', 'Revision 5: title'], '2026-12-03');
    // Built on the day revision 4 takes effect (an effective date still ahead would leave nothing in force).
    const today = /^effective: (\d{4}-\d{2}-\d{2})$/m.exec(revision4)![1];
    const loaded = await loadManual({ cwd: dir, env: { STEPWRIGHT_TODAY: today, STEPWRIGHT_PROCEDURES: 'procedures', STEPWRIGHT_CACHE: 'off' } });
    expect(loaded.view, loaded.run.diagnostics.filter((d) => d.severity === 'error').map((d) => d.message).join('\n')).toBeDefined();
    const history = (await historiesOf(loaded)).get('U2-H220-EM-001')!;
    expect(history.revisions.map((r) => r.revision)).toEqual([4, 5]);
    return { loaded, history };
  }

  it('give a redline that shows what the texts changed, and nothing the register adds', async () => {
    const { loaded, history } = await twoRevisions('draft');
    const [before, after] = history.revisions.map((r) => committedProcedure(r, loaded.run.register)!);
    const lines = redline(before, after);
    expect(lines.areas).toEqual(['title']);
    expect(lines.items.map((i) => `${i.area} ${i.kind} ${i.fields.map((f) => f.field).join(' ')}`)).toEqual(['identity changed title']);
    // The audit trail says the same of the commit.
    expect(history.audit.at(-1)!.events.filter((e) => e.startsWith('content'))).toEqual(['content: title']);
  });

  it('show the register\'s trips and limits on the page of an earlier revision in force, as on the newer revision\'s page', async () => {
    const { loaded, history } = await twoRevisions('in-review');
    const current = loaded.view!.procedures.find((p) => p.id === 'U2-H220-EM-001')!;
    const inForce = inForcePage(current, history, loaded.today, loaded.root, loaded.base, loaded.run.register);
    expect(inForce.state).toBe('earlier');
    expect(inForce.shown!.revision).toBe(4);
    const tags = (p: { interlocks: Array<{ tag: string }> }) => p.interlocks.map((i) => i.tag).sort();
    expect(tags(current).length).toBeGreaterThan(0);
    expect(tags(inForce.shown!)).toEqual(tags(current));
    expect(inForce.shown!.limits.map((l) => l.signal).sort()).toEqual(current.limits.map((l) => l.signal).sort());
  });
});
