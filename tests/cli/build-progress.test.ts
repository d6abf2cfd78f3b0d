// A build on a terminal shows its progress: one line per phase, with a count when there is one; piped or in CI
// it writes nothing extra, so logs and tests see the same output as before.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.ts';
import { buildProgress } from '../../src/cli/progress.ts';
import { tempFolder } from '../temp-folder.ts';

const plain = (text: string) => text.replace(/\r\x1b\[K/g, '\n').replace(/\(\d+\.\d s\)/g, '(t)');

describe('build progress', () => {
  it('on a terminal: each phase numbered, ended with its count or done, failed when it failed', () => {
    let out = '';
    const progress = buildProgress({ write: (t: string) => (out += t), isTTY: true });
    progress.phase('checking procedures');
    progress.done('13 checked');
    progress.phase('building pages');
    progress.phase('indexing for search');
    progress.fail();
    expect(plain(out).split('\n').filter(Boolean)).toEqual([
      '  [1] checking procedures…',
      '  [1] checking procedures: 13 checked (t)',
      '  [2] building pages…',
      '  [2] building pages: done (t)',
      '  [3] indexing for search…',
      '  [3] indexing for search: failed (t)',
    ]);
  });

  it('writes nothing when the output is not a terminal', () => {
    let out = '';
    const progress = buildProgress({ write: (t: string) => (out += t), isTTY: false });
    progress.phase('checking procedures');
    progress.done('1 checked');
    expect(out).toBe('');
  });

  it('stepwright build on a terminal shows the check phase with its count before it stops', async () => {
    const dir = tempFolder('stepwright-progress-');
    mkdirSync(join(dir, 'procedures'));
    writeFileSync(join(dir, 'procedures', 'bad.md'), '---\nid: U9-BAD-001\ntitle: Broken\nkind: normal\nrevision: 0\nstatus: draft\nsteps:\n  - step: open\n    do: Open the valve\n    until: TI-9 >= 5 degC\n---\n');
    let stderr = '';
    const run = (tty: boolean) => main(['build'], {
      stdout: { write: () => {}, isTTY: tty },
      stderr: { write: (t: string) => (stderr += t), isTTY: tty },
      cwd: dir,
      env: { STEPWRIGHT_TODAY: '2026-12-01' },
    });
    expect(await run(true)).toBe(1);
    const lines = plain(stderr).split('\n').filter(Boolean);
    expect(lines.slice(0, 2)).toEqual(['  [1] checking procedures…', '  [1] checking procedures: 1 checked (t)']);
    expect(lines[2]).toMatch(/^stepwright build: stopped, the procedures have 1 error\./);
    stderr = '';
    expect(await run(false)).toBe(1);
    expect(stderr).not.toContain('checking procedures');
  });
});
