// The run order names only test files that exist: a renamed or deleted file would silently lose its place.
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { slowFiles } from './slow-files-first.ts';

describe('the test files started first', () => {
  it('all exist', () => {
    const root = join(import.meta.dirname, '..');
    expect(slowFiles.filter((f) => !existsSync(join(root, f)))).toEqual([]);
    expect(new Set(slowFiles).size).toBe(slowFiles.length);
  });
});
