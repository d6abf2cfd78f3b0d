// The stamp that names Stepwright's code for the result cache: it survives the same code written again (a
// reinstall), and changes with any change to the code.
import { mkdirSync, mkdtempSync, readFileSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { codeStamps, stampIndexPath, stepwrightStamp } from '../../src/check/code-stamp.ts';

let root: string;
let cache: string;

/** A package named stepwright with two files of code under lib/, every file given the same time. */
function install(files: Record<string, string>, time: number) {
  rmSync(join(root, 'lib'), { recursive: true, force: true });
  writeFileSync(join(root, 'package.json'), JSON.stringify({ name: 'stepwright', version: '1.2.3' }));
  for (const [name, text] of Object.entries(files)) {
    const file = join(root, 'lib', name);
    mkdirSync(join(file, '..'), { recursive: true });
    writeFileSync(file, text);
    utimesSync(file, time, time);
  }
}

const code = { 'cli/main.js': 'export const rule = 1;\n', 'check/rule.js': 'export const limit = 80;\n' };

beforeEach(() => {
  root = mkdtempSync(join(tmpdir(), 'stepwright-stamp-'));
  cache = join(root, 'cache');
});
afterEach(() => rmSync(root, { recursive: true, force: true }));

describe('code stamps', () => {
  it('gives the same content stamp when the same code is installed again with new file times', () => {
    install(code, 1_000_000);
    const first = codeStamps(root);
    const stamp = first.inFolder(cache);
    install(code, 2_000_000);
    const again = codeStamps(root);
    expect(again.quick).not.toBe(first.quick);
    expect(again.inFolder(cache)).toBe(stamp);
    expect(stamp).toMatch(/^[0-9a-f]{64}$/);
    expect(stamp).not.toBe(first.quick);
  });

  it('changes the content stamp when a file of the code changes, even at its old size', () => {
    install(code, 1_000_000);
    const before = codeStamps(root).inFolder(cache);
    install({ ...code, 'check/rule.js': 'export const limit = 90;\n' }, 2_000_000);
    expect(codeStamps(root).inFolder(cache)).not.toBe(before);
    // The version is part of it too.
    install(code, 1_000_000);
    writeFileSync(join(root, 'package.json'), JSON.stringify({ name: 'stepwright', version: '1.2.4' }));
    expect(codeStamps(root).inFolder(cache)).not.toBe(before);
  });

  it('answers from the index without reading the code while every file keeps its size and time', () => {
    install(code, 1_000_000);
    const stamp = codeStamps(root).inFolder(cache);
    const quick = codeStamps(root).quick;
    expect(readFileSync(stampIndexPath(cache), 'utf8')).toContain(quick);
    // The same sizes and times with other bytes: the quick stamp cannot see it, and the index answers as before.
    // (This is what the quick stamp alone always trusted; a reinstall or an edit gives the file a new time.)
    install({ ...code, 'check/rule.js': 'export const limit = 90;\n' }, 1_000_000);
    expect(codeStamps(root).quick).toBe(quick);
    expect(codeStamps(root).inFolder(cache)).toBe(stamp);
    // Without the index, the bytes are read and the stamp differs.
    rmSync(stampIndexPath(cache));
    expect(codeStamps(root).inFolder(cache)).not.toBe(stamp);
  });

  it('ignores a damaged or altered index and writes it again', () => {
    install(code, 1_000_000);
    const stamp = codeStamps(root).inFolder(cache);
    const file = stampIndexPath(cache);
    const stored = JSON.parse(readFileSync(file, 'utf8')) as { sum: string; body: string };
    // Another content stamp put in by hand, without a matching sum: not trusted.
    const altered = stored.body.replace(stamp, 'f'.repeat(64));
    writeFileSync(file, JSON.stringify({ sum: stored.sum, body: altered }));
    expect(codeStamps(root).inFolder(cache)).toBe(stamp);
    writeFileSync(file, '{"sum": "cut sh');
    expect(codeStamps(root).inFolder(cache)).toBe(stamp);
    expect(JSON.parse(readFileSync(file, 'utf8')).sum).toBe(stored.sum);
  });

  it('never names code outside a Stepwright package, so nothing is reused', () => {
    writeFileSync(join(root, 'package.json'), JSON.stringify({ name: 'something-else' }));
    const a = codeStamps(root);
    const b = codeStamps(root);
    expect(a.quick).toMatch(/^unknown-/);
    expect(a.inFolder(cache)).not.toBe(b.inFolder(cache));
  });

  it('names the running code by its content when given a cache folder', () => {
    const withFolder = stepwrightStamp(cache);
    expect(withFolder).toMatch(/^[0-9a-f]{64}$/);
    expect(withFolder).not.toBe(stepwrightStamp());
    expect(stepwrightStamp(cache)).toBe(withFolder);
  });
});
