// The tests' temporary folders are removed, contents and all, once asked (at the end of every test file).
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { expect, it } from 'vitest';
import { removeTempFolders, tempFolder } from './temp-folder.ts';

it('removes every folder it made, with what was written into them, and only those', () => {
  const first = tempFolder('stepwright-temp-test-');
  const second = tempFolder('stepwright-temp-test-');
  mkdirSync(join(first, 'site', 'procedures'), { recursive: true });
  writeFileSync(join(first, 'site', 'procedures', 'index.html'), '<!doctype html>');
  expect(first).not.toBe(second);
  removeTempFolders();
  expect([existsSync(first), existsSync(second)]).toEqual([false, false]);
  const third = tempFolder('stepwright-temp-test-');
  expect(existsSync(third)).toBe(true);
});
