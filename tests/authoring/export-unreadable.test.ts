// `stepwright export ID` when the file holding ID could not be read: it names that file and its first problem
// (file:line:column), never "no procedure with id".
import { chmodSync, mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../cli/run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

const doc = (id: string) => `---\nid: ${id}\ntitle: Close valve XV-211 on kettle K-210\nkind: normal\nrevision: 0\nstatus: draft\nsteps:\n  - step: close\n    do: Close XV-211\n    confirm: XV-211 shows closed\n---\n\n## Purpose\n\nCloses the valve.\n`;

function manual(files: Record<string, string>): string {
  const dir = tempFolder('sw-export-unread-');
  // A plant repository: its commands find procedures/ from any folder in it.
  mkdirSync(join(dir, '.git'));
  for (const [name, text] of Object.entries(files)) {
    mkdirSync(join(dir, 'procedures', name, '..'), { recursive: true });
    writeFileSync(join(dir, 'procedures', name), text);
  }
  return dir;
}

describe('stepwright export of a procedure whose file could not be read', () => {
  const dir = manual({
    'zz/u2-example-001.md': doc('U2-EXAMPLE-001'),
    'zz/u2-broken-001.md': '---\nid: U2-BROKEN-001\ntitle: [\n---\n',
    'README.md': '# Unit 2 procedures\n\nRead me first.\n',
  });

  it('names the file and its first problem with file:line:column, from the top and from inside the folder', async () => {
    for (const [cwd, shown] of [[dir, 'procedures/zz/u2-broken-001.md'], [join(dir, 'procedures', 'zz'), 'u2-broken-001.md']]) {
      const run = await runCli(['export', 'U2-BROKEN-001'], cwd);
      expect(run.code).toBe(1);
      expect(run.stdout).toBe('');
      expect(run.stderr).not.toMatch(/no procedure with id|Did you mean/);
      expect(run.stderr).toContain(`${shown} names 'U2-BROKEN-001' on its id line but could not be read as a procedure`);
      expect(run.stderr).toMatch(new RegExp(`${shown.replace(/[.]/g, '\\.')}:4:1 The front-matter is not valid YAML`));
      expect(run.stderr).toContain(`stepwright check ${shown}`);
    }
  });

  it('says which files could not be read when no readable file has the id', async () => {
    const run = await runCli(['export', 'U2-OTHER-009'], dir);
    expect(run.code).toBe(1);
    expect(run.stderr).toContain("no procedure with id 'U2-OTHER-009' in procedures.");
    expect(run.stderr).toContain('1 file could not be read and may hold it: procedures/zz/u2-broken-001.md:4:1 The front-matter is not valid YAML');
    // A README is markdown that is no procedure, not a file that could not be read.
    expect(run.stderr).not.toContain('README');
  });

  it('names a file it was not allowed to read', async () => {
    const locked = manual({ 'u2-example-001.md': doc('U2-EXAMPLE-001'), 'u2-locked-001.md': doc('U2-LOCKED-001') });
    chmodSync(join(locked, 'procedures', 'u2-locked-001.md'), 0);
    const run = await runCli(['export', 'U2-LOCKED-001'], locked);
    chmodSync(join(locked, 'procedures', 'u2-locked-001.md'), 0o644);
    // Root reads any file: then the export simply works.
    if (process.getuid?.() === 0) return;
    expect(run.code).toBe(1);
    expect(run.stderr).toContain('1 file could not be read and may hold it: procedures/u2-locked-001.md');
  });

  it('still exports a readable procedure beside a broken one', async () => {
    const run = await runCli(['export', 'U2-EXAMPLE-001', '--format', 'mermaid'], dir);
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
  });
});
