// A command that writes a file where the user names it writes a new file, or over its own earlier output, and
// never over anything else.
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from './run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

const procedure = '---\nid: U2-N2-SU-001\ntitle: Start-up of the nitrogen header\n---\n\n## Purpose\n\nAn engineer\'s own text.\n';

describe('schema --out', () => {
  it('writes a new file, and writes again over its own earlier schema', async () => {
    const dir = tempFolder('stepwright-output-');
    expect((await runCli(['schema', '--out', 'schema/procedure.schema.json'], dir)).code).toBe(0);
    const first = readFileSync(join(dir, 'schema', 'procedure.schema.json'), 'utf8');
    expect(JSON.parse(first).title).toBe('Stepwright procedure front-matter');
    writeFileSync(join(dir, 'schema', 'procedure.schema.json'), first.replace('"type": "object"', '"type": "object", "old": true'));
    expect((await runCli(['schema', '--out', 'schema/procedure.schema.json'], dir)).code).toBe(0);
    expect(readFileSync(join(dir, 'schema', 'procedure.schema.json'), 'utf8')).toBe(first);
  });

  it('writes into an empty file', async () => {
    const dir = tempFolder('stepwright-output-');
    writeFileSync(join(dir, 'schema.json'), '');
    expect((await runCli(['schema', '--out', 'schema.json'], dir)).code).toBe(0);
    expect(JSON.parse(readFileSync(join(dir, 'schema.json'), 'utf8')).title).toBe('Stepwright procedure front-matter');
  });

  it('leaves a procedure, a schema of the other kind and a folder as they are, and says why', async () => {
    const dir = tempFolder('stepwright-output-');
    mkdirSync(join(dir, 'procedures'));
    writeFileSync(join(dir, 'procedures', 'u2-n2-su-001.md'), procedure);
    const over = await runCli(['schema', '--out', 'procedures/u2-n2-su-001.md'], dir);
    expect(over.code).toBe(2);
    expect(over.stderr).toContain("'procedures/u2-n2-su-001.md' already exists and is not a procedure schema written by 'stepwright schema'; it was left as it is.");
    expect(readFileSync(join(dir, 'procedures', 'u2-n2-su-001.md'), 'utf8')).toBe(procedure);

    expect((await runCli(['schema', '--register', '--out', 'register.schema.json'], dir)).code).toBe(0);
    const register = readFileSync(join(dir, 'register.schema.json'), 'utf8');
    const other = await runCli(['schema', '--out', 'register.schema.json'], dir);
    expect(other.code).toBe(2);
    expect(readFileSync(join(dir, 'register.schema.json'), 'utf8')).toBe(register);

    const folder = await runCli(['schema', '--out', 'procedures'], dir);
    expect(folder.code).toBe(2);
    expect(folder.stderr).toContain("'procedures' is a folder");
    expect(existsSync(join(dir, 'procedures', 'u2-n2-su-001.md'))).toBe(true);
  });
});
