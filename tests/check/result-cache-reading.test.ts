// A file found in the result cache is not read again: its diagnostics and a small summary come from the cache,
// and the source is parsed only when something needs it (a waiver to place, a caller asking for the model).
// An entry in an old or foreign shape, even one with a valid checksum, is ignored and the file read afresh.
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { checkSources, type SourceInput } from '../../src/check/run-checks.ts';
import { openResultCache } from '../../src/check/result-cache.ts';
import { readProcedureFiles } from '../../src/cli/read-procedure-files.ts';
import * as reading from '../../src/read/read-procedure.ts';
import { walkSteps } from '../../src/model/walk-steps.ts';

// Every parse of a procedure goes through the one front door; count the calls.
vi.mock('../../src/read/read-procedure.ts', async (original) => {
  const real = await original<typeof import('../../src/read/read-procedure.ts')>();
  return { ...real, readProcedure: vi.fn(real.readProcedure) };
});
const parses = () => vi.mocked(reading.readProcedure).mock.calls.length;

const today = '2026-12-01';
const demo = readProcedureFiles(['procedures'], process.cwd());
let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'stepwright-cache-read-'));
  vi.mocked(reading.readProcedure).mockClear();
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

const check = (inputs: SourceInput[]) => {
  const store = openResultCache(dir);
  return { store, result: checkSources(inputs, { today, cache: { store, salt: 'v1' } }) };
};
const entryFiles = () => readdirSync(dir, { recursive: true }).map(String).filter((f) => f.endsWith('.json')).map((f) => join(dir, f));
/** A procedure with a warning of its own and no waivers, so its cached diagnostics matter. */
/** Files with a line-up: each has one more entry, its line-up judged against the procedures it requires. */
const lineUps = demo.filter((i) => 'text' in i && /^line-up:/m.test(i.text)).length;
const noisy = (text: string) => text.replace(/\bdo: /, 'do: Adjust the valve as required and check it. ');

describe('a cache hit skips reading', () => {
  it('parses no file when nothing changed, and answers exactly as a cold check, waivers included', () => {
    const inputs = demo.map((i, n) => (n === 0 && 'text' in i ? { file: i.file, text: noisy(i.text) } : i));
    const cold = check(inputs).result;
    expect(parses()).toBe(inputs.length);
    vi.mocked(reading.readProcedure).mockClear();
    const warm = check(inputs).result;
    // Nothing is read, not even the files whose findings a step waiver sets aside: the split is cached too.
    const withWaivedFindings = cold.files.filter((f) => f.waived?.length && f.procedure
      && walkSteps(f.procedure.steps).some(({ step }) => step.waivers?.length)).length;
    expect(withWaivedFindings).toBeGreaterThan(0);
    expect(parses()).toBe(0);
    expect(warm.diagnostics).toEqual(cold.diagnostics);
    expect(warm.diagnostics.length).toBeGreaterThan(0);
    expect(warm.files.map((f) => [f.file, f.diagnostics, f.waived])).toEqual(cold.files.map((f) => [f.file, f.diagnostics, f.waived]));
    // The model is still there for a caller that asks (read then, once).
    const before = parses();
    expect(warm.files[0].procedure?.id).toBe(cold.files[0].procedure?.id);
    expect(warm.files[0].source?.text).toBe(cold.files[0].source?.text);
    expect(parses()).toBeLessThanOrEqual(before + 1);
  });

  it('after an edit, reads the edited file and lets the cross-file rules read the others', () => {
    check(demo);
    vi.mocked(reading.readProcedure).mockClear();
    const [first, second] = demo.filter((i): i is { file: string; text: string } => 'text' in i);
    const id = /^id: (.+)$/m.exec(first.text)![1];
    const edited = demo.map((i) => (i.file === second.file ? { file: i.file, text: second.text.replace(/^id: .+$/m, `id: ${id}`) } : i));
    const { store, result } = check(edited);
    // Every other file's results, and what reading it found (its parts), which the cross-file rules take instead of
    // reading the file again, and its plant state judged twice against the manual's hazards (hazards that can occur,
    // hazards ruled out only by an old reading); the caller's findings with its calls expanded and the waiving file's
    // split. The edited file's own judgements miss with it.
    expect(store.stats).toMatchObject({ hits: 4 * (demo.length - 1) + lineUps + 2, misses: 4 });
    expect(result.diagnostics.filter((d) => d.rule === 'duplicate-procedure-id')).toHaveLength(2);
    expect(result.diagnostics).toEqual(checkSources(edited, { today }).diagnostics);
  });

  it('ignores entries of another shape even when their checksum is right', () => {
    const inputs = demo.map((i, n) => (n === 0 && 'text' in i ? { file: i.file, text: noisy(i.text) } : i));
    const cold = check(inputs).result.diagnostics;
    // Rewritten through the store itself, so each entry is well-formed for the store but wrong for the checker:
    // an old layout (a bare list), a summary of the wrong shape, findings for a file that is not in the run.
    const store = openResultCache(dir);
    const forged = { file: 'x.md', line: 1, column: 1, severity: 'info', rule: 'forged', message: 'forged' };
    for (const [n, path] of entryFiles().entries()) {
      const { key, value } = JSON.parse(readFileSync(path, 'utf8')) as { key: string; value: Record<string, unknown> };
      if ('summary' in value) store.set(key, n % 2 ? [forged] : { diagnostics: [forged], summary: { id: 3 } });
      else store.set(key, { files: [{ file: 'x.md', diagnostic: forged }], register: [] });
    }
    vi.mocked(reading.readProcedure).mockClear();
    const again = check(inputs);
    expect(again.result.diagnostics).toEqual(cold);
    expect(again.result.diagnostics.some((d) => d.rule === 'forged')).toBe(false);
    expect(parses()).toBe(inputs.length);
  });
});
