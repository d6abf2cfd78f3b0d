// Reading a procedure file: the whole file whatever its size up to the limit (the buffer grows from the size the
// file claims), and a clear refusal one byte over it.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { readRegularFile } from '../../src/engine/find-procedure-files.ts';

const dir = mkdtempSync(join(tmpdir(), 'stepwright-read-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('readRegularFile', () => {
  it('returns every byte of files of any size up to the limit, and refuses one byte more', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 200_000 }), fc.integer({ min: 1, max: 200_000 }), (size, limit) => {
      const path = join(dir, 'p.md');
      const bytes = Buffer.alloc(size, 'ab\n');
      writeFileSync(path, bytes);
      const read = readRegularFile(path, limit);
      if (size > limit) expect(read).toHaveProperty('error');
      else {
        expect(read).toHaveProperty('bytes');
        expect(Buffer.from((read as { bytes: Uint8Array }).bytes).equals(bytes)).toBe(true);
      }
    }), { numRuns: 60 });
  });

  it('reads a file larger than its first buffer exactly at the limit', () => {
    const path = join(dir, 'edge.md');
    const bytes = Buffer.alloc(70_000, 'xyz');
    writeFileSync(path, bytes);
    expect(Buffer.from((readRegularFile(path, 70_000) as { bytes: Uint8Array }).bytes).equals(bytes)).toBe(true);
    expect(readRegularFile(path, 69_999)).toHaveProperty('error');
  });
});
