// `stepwright dev --cache-dir`: the preview's working folder is the user's; a 'code' entry there that is not
// the preview's own link is the user's and is never removed.
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from './run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

describe('stepwright dev --cache-dir', () => {
  it('refuses a folder whose code/ is not its link, and leaves it as it was', async () => {
    const dir = tempFolder('stepwright-dev-cache-');
    mkdirSync(join(dir, 'procedures'));
    mkdirSync(join(dir, 'mine', 'code'), { recursive: true });
    writeFileSync(join(dir, 'mine', 'code', 'notes.txt'), 'mine');
    const r = await runCli(['dev', '--cache-dir', 'mine', '--port', '0', '--host', '127.0.0.1'], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--cache-dir');
    expect(existsSync(join(dir, 'mine', 'code', 'notes.txt'))).toBe(true);
  });
});
