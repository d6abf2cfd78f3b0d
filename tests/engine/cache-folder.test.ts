// Where a command keeps its result cache, and whether anything is in it (a large check starts its reading thread
// early only when no cache can answer for its files).
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { resultCacheFolder, resultCacheHoldsEntries } from '../../src/engine/cache-folder.ts';
import { tempFolder } from '../temp-folder.ts';

describe('result cache folder', () => {
  it('is .stepwright/cache under the working folder, the folder STEPWRIGHT_CACHE names, or none when it is off', () => {
    expect(resultCacheFolder({ cwd: '/plant', env: {} })).toBe(join('/plant', '.stepwright', 'cache'));
    expect(resultCacheFolder({ cwd: '/plant', env: { STEPWRIGHT_CACHE: 'tmp/c' } })).toBe(join('/plant', 'tmp', 'c'));
    expect(resultCacheFolder({ cwd: '/plant', env: { STEPWRIGHT_CACHE: 'off' } })).toBeUndefined();
    expect(resultCacheFolder({ cwd: '/plant', env: { STEPWRIGHT_CACHE: '0' } })).toBeUndefined();
  });

  it('holds entries only once something is written into it', () => {
    const cwd = tempFolder('stepwright-cache-folder-');
    expect(resultCacheHoldsEntries({ cwd, env: {} })).toBe(false);
    mkdirSync(join(cwd, '.stepwright', 'cache'), { recursive: true });
    expect(resultCacheHoldsEntries({ cwd, env: {} })).toBe(false);
    mkdirSync(join(cwd, '.stepwright', 'cache', 'ab'));
    writeFileSync(join(cwd, '.stepwright', 'cache', 'ab', 'abc.json'), '{}');
    expect(resultCacheHoldsEntries({ cwd, env: {} })).toBe(true);
    expect(resultCacheHoldsEntries({ cwd, env: { STEPWRIGHT_CACHE: 'off' } })).toBe(false);
  });
});
