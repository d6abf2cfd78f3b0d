// A procedure saved as NAME.MD is a procedure file like name.md for every command that lists procedure files:
// the folder and glob search (check, build, verify, export), the live preview's watcher and review's changes.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { findProcedureFiles, isMarkdownName } from '../../src/engine/find-procedure-files.ts';
import { procedureStamp } from '../../src/site-data/dev-manual.ts';
import { watchProcedures } from '../../src/site/watch-procedures.ts';
import { ada, createTempRepo, procedureText, stepsV1 } from '../history/temp-repo.ts';
import { runCli } from '../cli/run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

const doc = (id: string) => `---\nid: ${id}\ntitle: Close valve XV-211 on kettle K-210\nkind: normal\nrevision: 0\nstatus: draft\nsteps:\n  - step: close\n    do: Close XV-211\n    confirm: XV-211 shows closed\n---\n\n## Purpose\n\nCloses the valve.\n`;

describe('markdown file names in any case', () => {
  const dir = tempFolder('sw-md-case-');
  mkdirSync(join(dir, 'procedures', 'zz'), { recursive: true });
  writeFileSync(join(dir, 'procedures', 'zz', 'u2-example-001.md'), doc('U2-EXAMPLE-001'));
  writeFileSync(join(dir, 'procedures', 'zz', 'U2-EXAMPLE-002.MD'), doc('U2-EXAMPLE-002'));
  writeFileSync(join(dir, 'procedures', 'zz', 'u2-example-003.Md'), doc('U2-EXAMPLE-003'));
  writeFileSync(join(dir, 'procedures', 'zz', 'notes.txt'), 'not markdown');
  writeFileSync(join(dir, 'procedures', 'zz', 'old.mdx'), 'not markdown either');
  const all = ['procedures/zz/U2-EXAMPLE-002.MD', 'procedures/zz/u2-example-001.md', 'procedures/zz/u2-example-003.Md'];

  it('is the one test', () => {
    expect(['a.md', 'A.MD', 'a.Md', 'a.mD'].map(isMarkdownName)).toEqual([true, true, true, true]);
    expect(['a.mdx', 'a.txt', 'a.md.bak', 'md'].map(isMarkdownName)).toEqual([false, false, false, false]);
  });

  it('is found by a folder search and by a glob ending in .md', () => {
    expect(findProcedureFiles(['procedures'], dir).map((f) => f.file).sort()).toEqual(all);
    expect(findProcedureFiles(['procedures/**/*.md'], dir).map((f) => f.file).sort()).toEqual(all);
  });

  it('is checked with the folder, as it is when named', async () => {
    const run = await runCli(['check'], dir);
    expect(run.stdout).toContain('3 files checked');
    const diagnostics = JSON.parse((await runCli(['check', '--format', 'json'], dir)).stdout) as Array<{ file: string; rule: string }>;
    const named = [...new Set(diagnostics.filter((d) => d.rule !== 'file-not-read').map((d) => d.file))].sort();
    expect(named).toEqual(all);
    // A name that is markdown but not .md is not read, and said so.
    expect(diagnostics.filter((d) => d.rule === 'file-not-read').map((d) => d.file)).toEqual(['procedures/zz/old.mdx']);
  });

  it('is exported by its id from the folder', async () => {
    const run = await runCli(['export', 'U2-EXAMPLE-002', '--format', 'mermaid'], dir);
    expect(run.stderr).toBe('');
    expect(run.stdout).toMatch(/^flowchart/);
  });

  it('changes the live preview when saved', () => {
    const before = procedureStamp(join(dir, 'procedures'), dir);
    expect(before).toContain('U2-EXAMPLE-002.MD');
    const listeners: Array<(file: string) => void> = [];
    const sent: unknown[] = [];
    watchProcedures(join(dir, 'procedures')).configureServer({
      watcher: { add: () => undefined, on: (_event, listener) => listeners.push(listener) },
      ws: { send: (payload) => sent.push(payload) },
    });
    for (const listener of listeners) listener(join(dir, 'procedures', 'zz', 'U2-EXAMPLE-002.MD'));
    expect(sent.length).toBe(listeners.length);
    for (const listener of listeners) listener(join(dir, 'procedures', 'zz', 'notes.txt'));
    expect(sent.length).toBe(listeners.length);
  });
});

describe('review of a procedure saved as .MD', () => {
  const repo = createTempRepo();
  afterAll(() => repo.remove());
  repo.write('procedures/U2-TEST-001.MD', procedureText({ revision: 1, steps: stepsV1, status: 'draft' }));
  repo.commit('Draft rev 1', ada, '2026-01-10');
  repo.write('procedures/U2-TEST-001.MD', procedureText({ revision: 2, steps: stepsV1, status: 'draft', high: '240 degC' }));

  it('lists it among the changes', async () => {
    const run = await runCli(['review', '--base', 'HEAD'], repo.dir);
    expect(run.stderr).toBe('');
    expect(run.stdout).toContain('U2-TEST-001');
  });
});
