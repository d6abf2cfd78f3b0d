// Hostile folders: link loops, FIFOs, devices, huge files, and a history reader that is cut off.
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findProcedureFiles, maxProcedureBytes, readProcedureFiles } from '../../src/cli/read-procedure-files.ts';
import { gitIn, showFiles } from '../../src/history/git.ts';

const base = readFileSync(join(import.meta.dirname, '../fixtures/rules/front-matter-not-mapping/valid-base.md'), 'utf8');

describe('reading a procedures folder that fights back', () => {
  let dir: string;
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'sw-hostile-'));
    writeFileSync(join(dir, 'real.md'), base);
    mkdirSync(join(dir, 'sub'));
    writeFileSync(join(dir, 'sub', 'other.md'), base.replace('FX-K210-001', 'FX-K210-002'));
    symlinkSync('.', join(dir, 'x'));
    symlinkSync('.', join(dir, 'y'));
    symlinkSync('..', join(dir, 'sub', 'up'));
    symlinkSync('loop.md', join(dir, 'loop.md'));
    symlinkSync('real.md', join(dir, 'alias.md'));
    symlinkSync('/dev/zero', join(dir, 'zero.md'));
    execFileSync('mkfifo', [join(dir, 'pipe.md')]);
    writeFileSync(join(dir, 'huge.md'), Buffer.alloc(maxProcedureBytes + 10, 0x61));
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('ends, reads each real file once, and reports every odd entry', () => {
    const found = readProcedureFiles([dir], dir);
    const byName = new Map(found.map((f) => [f.file, f]));
    expect([...byName.keys()].sort()).toEqual(['alias.md', 'huge.md', 'loop.md', 'pipe.md', 'real.md', 'sub/other.md', 'sub/up', 'x', 'y', 'zero.md']);
    expect('text' in byName.get('real.md')!).toBe(true);
    expect('text' in byName.get('sub/other.md')!).toBe(true);
    const errorOf = (name: string) => { const f = byName.get(name)!; return 'error' in f ? f.error : ''; };
    expect(errorOf('x')).toMatch(/already read/);
    expect(errorOf('y')).toMatch(/already read/);
    expect(errorOf('sub/up')).toMatch(/already read/);
    expect(errorOf('alias.md')).toMatch(/second name .* real\.md/);
    expect(errorOf('loop.md')).toMatch(/link loop/);
    expect(errorOf('pipe.md')).toMatch(/named pipe/);
    expect(errorOf('zero.md')).toMatch(/device/);
    expect(errorOf('huge.md')).toMatch(new RegExp(`limit .* ${maxProcedureBytes} bytes`));
  });

  it('reads a file under its own name when a link to it sits in a folder read earlier, and reports the link', () => {
    const plant = mkdtempSync(join(tmpdir(), 'sw-hostile-'));
    try {
      mkdirSync(join(plant, 'a-first'));
      mkdirSync(join(plant, 'z-last'));
      writeFileSync(join(plant, 'z-last', 'real.md'), base);
      symlinkSync(join('..', 'z-last', 'real.md'), join(plant, 'a-first', 'alias.md'));
      const found = readProcedureFiles([plant], plant);
      const real = found.find((f) => f.file === 'z-last/real.md')!;
      const alias = found.find((f) => f.file === 'a-first/alias.md')!;
      expect('text' in real).toBe(true);
      expect('error' in alias && alias.error).toMatch(/second name \(a link\) for z-last\/real\.md/);
    } finally {
      rmSync(plant, { recursive: true, force: true });
    }
  });

  it('a FIFO given by name is refused without being opened', () => {
    const [only] = findProcedureFiles([join(dir, 'pipe.md')], dir);
    expect(only.missing).toMatch(/named pipe/);
  });
});

describe('the history reader outside a repository', () => {
  it('a long list of files for git fails as a value, never as an unhandled pipe error', async () => {
    const outside = mkdtempSync(join(tmpdir(), 'sw-nogit-'));
    try {
      const git = gitIn(outside, { ...process.env, GIT_CEILING_DIRECTORIES: tmpdir(), GIT_DIR: join(outside, 'none') });
      const specs = Array.from({ length: 20000 }, (_, i) => `HEAD:procedures/some-long-folder-name/procedure-${i}.md`);
      await expect(showFiles(git, specs)).rejects.toThrow(/git cat-file failed/);
    } finally {
      rmSync(outside, { recursive: true, force: true });
    }
  });
});
