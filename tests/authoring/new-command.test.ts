// `stepwright new`: scaffolds that check clean apart from their TODO placeholders, and never overwrite.
import { readFileSync, writeFileSync, mkdirSync, existsSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.ts';
import type { CliIo } from '../../src/cli/io.ts';
import { checkSources } from '../../src/check/run-checks.ts';
import { kinds } from '../../src/model/schema.ts';
import { scaffoldProcedure } from '../../src/render/procedure-scaffold.ts';
import { tempFolder } from '../temp-folder.ts';

function fakeIo(cwd: string) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIo = { stdout: { write: (t: string) => out.push(t) }, stderr: { write: (t: string) => err.push(t) }, cwd, env: { STEPWRIGHT_TODAY: '2026-12-01' } };
  return { io, out: () => out.join(''), err: () => err.join('') };
}

describe('scaffolded procedures', () => {
  it.each([...kinds])('a new %s procedure has no errors, and every finding is on a TODO line', (kind) => {
    const text = scaffoldProcedure({ kind, id: 'U2-NEW-001' });
    const { diagnostics } = checkSources([{ file: 'new.md', text }], { today: '2026-12-01' });
    const lines = text.split('\n');
    expect(diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    for (const d of diagnostics) expect(lines[d.line - 1], `${d.rule}: ${d.message}`).toContain('TODO');
    // Every line that carries a placeholder is reported by placeholder-text.
    const reported = new Set(diagnostics.filter((d) => d.rule === 'placeholder-text').map((d) => d.line));
    lines.forEach((line, i) => {
      if (/\bTODO\b/.test(line)) expect(reported.has(i + 1), `line ${i + 1}: ${line}`).toBe(true);
    });
  });

  it('uses the given title, and checks clean of placeholders once the TODOs are replaced', () => {
    const text = scaffoldProcedure({ kind: 'shutdown', id: 'U2-NEW-002', title: 'Shut down kettle K-210' });
    expect(text).toContain('title: "Shut down kettle K-210"');
    const filled = text.replace(/"TODO: ([^"]*)"/g, (_m, what: string) => `"${what[0].toUpperCase()}${what.slice(1)}"`)
      .replace(/TODO-/g, 'XX-').replace(/^TODO: (.*)$/gm, '$1').replace(/^- TODO: (.*)$/gm, '- $1');
    const { diagnostics } = checkSources([{ file: 'filled.md', text: filled }], { today: '2026-12-01' });
    expect(diagnostics.filter((d) => d.rule === 'placeholder-text' || d.severity === 'error')).toEqual([]);
  });

  it('asks for the sections the kind needs', () => {
    expect(scaffoldProcedure({ kind: 'emergency-shutdown', id: 'U2-A-1' })).toMatch(/conditions-requiring:\n {2}- "TODO: [^\n]*\nresponsible: "TODO: /);
    expect(scaffoldProcedure({ kind: 'startup-after-turnaround', id: 'U2-A-1' })).toContain('## Pre-startup safety review');
    expect(scaffoldProcedure({ kind: 'temporary', id: 'U2-A-1' })).toContain('## Why temporary, and until when');
    expect(scaffoldProcedure({ kind: 'batch', id: 'U2-A-1' })).toMatch(/phase: charge[\s\S]*repeat:/);
  });
});

describe('stepwright new', () => {
  it('writes the file with a schema modeline relative to it', async () => {
    const dir = tempFolder('sw-new-');
    mkdirSync(join(dir, 'schema'));
    writeFileSync(join(dir, 'schema', 'procedure.schema.json'), '{}');
    const { io, out } = fakeIo(dir);
    expect(await main(['new', 'startup', 'U2-H220-SU-009', '--dir', 'procedures/h-220'], io)).toBe(0);
    const text = readFileSync(join(dir, 'procedures', 'h-220', 'u2-h220-su-009.md'), 'utf8');
    expect(text).toContain('# yaml-language-server: $schema=../../schema/procedure.schema.json');
    expect(text).toContain('kind: startup');
    expect(out()).toContain('procedures/h-220/u2-h220-su-009.md');
  });

  it('never overwrites an existing file', async () => {
    const dir = tempFolder('sw-new-');
    mkdirSync(join(dir, 'procedures'));
    const file = join(dir, 'procedures', 'u2-x-001.md');
    writeFileSync(file, 'my work');
    const { io, err } = fakeIo(dir);
    expect(await main(['new', 'normal', 'U2-X-001'], io)).toBe(1);
    expect(readFileSync(file, 'utf8')).toBe('my work');
    expect(err()).toMatch(/already exists; nothing was written/);
  });

  it('refuses an id another file of the manual already uses', async () => {
    const dir = tempFolder('sw-new-');
    mkdirSync(join(dir, 'procedures', 'area'), { recursive: true });
    writeFileSync(join(dir, 'procedures', 'area', 'other-name.md'), scaffoldProcedure({ kind: 'normal', id: 'U2-X-002' }));
    const { io, err } = fakeIo(dir);
    expect(await main(['new', 'normal', 'U2-X-002', '--dir', 'procedures/elsewhere'], io)).toBe(1);
    expect(existsSync(join(dir, 'procedures', 'elsewhere', 'u2-x-002.md'))).toBe(false);
    expect(err()).toContain('procedures/area/other-name.md');
  });

  it('quotes a path with a space or a shell character in the command it suggests', async () => {
    const dir = tempFolder('sw-new-');
    for (const [folder, shown] of [
      ['procedures/new folder', '"procedures/new folder/u2-new-001.md"'],
      ["procedures/it's $unit", `'procedures/it'\\''s $unit/u2-new-001.md'`],
    ]) {
      const { io, out } = fakeIo(dir);
      expect(await main(['new', 'normal', 'U2-NEW-001', '--dir', folder], io)).toBe(0);
      expect(out()).toContain(`\n  npx stepwright check ${shown}\n`);
      rmSync(join(dir, 'procedures'), { recursive: true });
    }
  });

  it('refuses a folder outside the procedures folder and names the procedures folder', async () => {
    const dir = tempFolder('sw-new-');
    const elsewhere = tempFolder('sw-new-elsewhere-');
    mkdirSync(join(dir, 'procedures'));
    const { io, err, out } = fakeIo(dir);
    expect(await main(['new', 'normal', 'U2-NEW-002', '--dir', elsewhere], io)).toBe(1);
    expect(await main(['new', 'normal', 'U2-NEW-002', '--dir', 'procedure/k-210'], io)).toBe(1);
    expect(existsSync(join(elsewhere, 'u2-new-002.md'))).toBe(false);
    expect(existsSync(join(dir, 'procedure'))).toBe(false);
    expect(out()).toBe('');
    expect(err()).toContain(`${elsewhere} is outside the procedures folder procedures/`);
    expect(err()).toContain('procedure/k-210 is outside the procedures folder procedures/');
    expect(err()).toContain('--dir procedures/new-area');
    // Another procedures folder, named as for every command, makes it the place.
    expect(await main(['new', 'normal', 'U2-NEW-002', '--dir', join(elsewhere, 'area'), '--procedures', elsewhere], io)).toBe(0);
    expect(existsSync(join(elsewhere, 'area', 'u2-new-002.md'))).toBe(true);
  });

  it.each([
    [['new', 'weekly', 'U2-X-003']],
    [['new', 'normal', 'u2-lower']],
    [['new', 'normal']],
    [['new', 'normal', 'U2-X-003', 'extra']],
  ])('rejects bad arguments %j with exit 2 and no stack trace', async (argv) => {
    const dir = tempFolder('sw-new-');
    const { io, err } = fakeIo(dir);
    expect(await main(argv, io)).toBe(2);
    expect(err()).not.toMatch(/\n\s+at /);
    expect(existsSync(join(dir, 'procedures'))).toBe(false);
  });
});
