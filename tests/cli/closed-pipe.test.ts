// A reader that stops early (`stepwright check --explain | head`) closes the pipe: the command stops quietly,
// with no stack trace on the terminal.
import { spawn } from 'node:child_process';
import { cpSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { tempFolder } from '../temp-folder.ts';

const root = join(import.meta.dirname, '..', '..');

describe('a closed output pipe', () => {
  it('ends the command without an error trace when the reader stops after the first lines', async () => {
    // Four copies of the demo procedures (each id then found four times): far more output than a pipe holds (64 KiB
    // on Linux), so the command is still writing when the reader goes.
    const copies = tempFolder('stepwright-closed-pipe-');
    for (let i = 1; i <= 4; i++) cpSync(join(root, 'procedures'), join(copies, `copy-${i}`), { recursive: true });
    const child = spawn(process.execPath, ['bin/stepwright.mjs', 'check', '--explain', '--no-history', copies], {
      cwd: root, env: { ...process.env, NO_COLOR: '1', STEPWRIGHT_CACHE: 'off' }, stdio: ['ignore', 'pipe', 'pipe'],
    });
    let stderr = '';
    child.stderr.on('data', (chunk) => (stderr += chunk));
    let first = '';
    // Read one chunk, then close our end, as `head -1` does.
    await new Promise<void>((resolve) => child.stdout.once('data', (chunk) => { first = String(chunk); child.stdout.destroy(); resolve(); }));
    const code = await new Promise<number | null>((resolve) => child.on('close', (c) => resolve(c)));
    expect(first.length).toBeGreaterThan(0);
    expect(stderr).not.toMatch(/EPIPE|\n\s+at |Node\.js v/);
    expect([0, 1]).toContain(code);
  }, 120_000);
});
