// A large run's files are read on a second thread too: what it sends makes the same sources as reading here, and a
// check that uses it finds exactly what a check without it finds.
import { describe, expect, it } from 'vitest';
import { readSource, readSourceParts } from '../../src/parse/read-source.ts';
import { readerThreshold, startSourceReader, warmSourceReader } from '../../src/read/source-reader.ts';
import { validateFrontMatter } from '../../src/model/validate.ts';
import { checkSources, type SourceInput } from '../../src/check/run-checks.ts';
import { readProcedureFiles } from '../../src/cli/read-procedure-files.ts';
import { openResultCache } from '../../src/check/result-cache.ts';
import { tempFolder } from '../temp-folder.ts';

const demo = readProcedureFiles(['procedures'], process.cwd()).flatMap((i) => ('text' in i ? [i] : []));

/** Copies of the demo manual with their own ids (and, in every other copy, a vague step to report; in every fifth, a key the schema does not know). */
function copies(count: number): Array<{ file: string; text: string }> {
  return Array.from({ length: count }, (_, n) => {
    const { file, text } = demo[n % demo.length];
    let copy = text.replace(/\bU2-/g, `C${Math.floor(n / demo.length)}-U2-`);
    if (n % 2) copy = copy.replace(/\bdo: /, 'do: Adjust the valve as required. ');
    if (n % 5 === 0) copy = copy.replace(/^id: /m, 'colour: red\nid: ');
    return { file: `copy-${n}/${file}`, text: copy };
  });
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('source reader', () => {
  it('is not started for a small run', () => {
    expect(startSourceReader(copies(readerThreshold - 1))).toBeUndefined();
  });

  it('sends parts that make the same source as reading it here', async () => {
    const files = copies(readerThreshold + 20);
    const reader = startSourceReader(files)!;
    expect(reader).toBeDefined();
    // Let the thread read ahead (however busy the machine is), then take every file in order.
    const deadline = Date.now() + 30_000;
    while (reader.readAhead() < 20 && Date.now() < deadline) await sleep(50);
    expect(reader.readAhead()).toBeGreaterThanOrEqual(20);
    let taken = 0;
    let withIssues = 0;
    for (const { file, text } of files) {
      const ahead = reader.take(file);
      if (!ahead) continue;
      const parts = ahead.parts;
      taken++;
      expect(parts).toEqual(readSourceParts(file, text));
      // The schema's findings are those of the data read here.
      expect(ahead.schemaIssues).toEqual(validateFrontMatter(readSourceParts(file, text).data));
      if (ahead.schemaIssues!.length) withIssues++;
      const here = readSource(file, text);
      const there = readSource(file, text, parts);
      expect(there.data).toEqual(here.data);
      expect(there.diagnostics).toEqual(here.diagnostics);
      for (const path of [['id'], ['steps', 0, 'do'], ['steps', 1], ['hazards', 0, 'hazard'], ['nowhere']]) {
        expect(there.rangeOf(path)).toEqual(here.rangeOf(path));
        expect(there.rangeOf(path, 'key')).toEqual(here.rangeOf(path, 'key'));
        expect(there.rangeInScalar(path, 1, 3)).toEqual(here.rangeInScalar(path, 1, 3));
      }
    }
    expect(taken).toBeGreaterThan(0);
    if (taken >= 10) expect(withIssues).toBeGreaterThan(0);
    expect(reader.take('not-a-file.md')).toBeUndefined();
    reader.stop();
    expect(reader.take(files[files.length - 1].file)).toBeUndefined();
  }, 60_000);

  it('starts ahead of the files, and reads them when they are given; a thread started ahead and not needed is let go', async () => {
    warmSourceReader();
    // Too few files for a thread: the one started ahead is ended, and no reader is made.
    expect(startSourceReader(copies(readerThreshold - 1))).toBeUndefined();
    warmSourceReader();
    const files = copies(readerThreshold + 5);
    const reader = startSourceReader(files)!;
    const deadline = Date.now() + 30_000;
    while (reader.readAhead() < 5 && Date.now() < deadline) await sleep(20);
    expect(reader.readAhead()).toBeGreaterThanOrEqual(5);
    expect(reader.take(files[0].file)?.parts).toEqual(readSourceParts(files[0].file, files[0].text));
    reader.stop();
  }, 60_000);

  it('hands each file once: read on the thread, or here when the thread has not started it', async () => {
    const files = copies(readerThreshold + 20);
    const reader = startSourceReader(files)!;
    const deadline = Date.now() + 30_000;
    while (reader.readAhead() < 5 && Date.now() < deadline) await sleep(20);
    // From the last file back, as a warm check's passes do: the thread reads from the first on, and they meet.
    const fromThread = new Set<string>();
    for (const { file, text } of [...files].reverse()) {
      const parts = reader.take(file)?.parts;
      if (parts) {
        fromThread.add(file);
        expect(parts).toEqual(readSourceParts(file, text));
      }
      // Taken once: asked again, the file is read here.
      expect(reader.take(file)).toBeUndefined();
    }
    expect(fromThread.has(files[0].file)).toBe(true);
    reader.stop();
  }, 60_000);

  it('gives a warm check after one edit (the files the cache answered for read from both ends) the findings of a check without cache', async () => {
    const dir = tempFolder('stepwright-reader-cache-');
    const inputs: SourceInput[] = copies(readerThreshold + 30);
    const cold = openResultCache(dir);
    checkSources(inputs, { today: '2026-12-01', cache: { store: cold, salt: 'reader' } });
    // The entries are written on a thread of their own; a command waits for them before it ends, and so does this.
    await cold.flush();
    const edited = inputs.map((input, i) => (i === 40 && 'text' in input ? { ...input, text: input.text.replace(/\bdo: /, 'do: Check the valve as necessary. ') } : input));
    const store = openResultCache(dir);
    const warm = checkSources(edited, { today: '2026-12-01', cache: { store, salt: 'reader' } });
    // The results of every file but the edited one, and the parts of the same files (read for the cross-file rules);
    // besides, every other file's plant state judged twice against the manual's hazards, the callers' expansions and
    // the waiving files' splits. Only the edited file's results, its two judgements and the cross-file findings miss.
    expect(store.stats.hits).toBeGreaterThan(4 * (inputs.length - 1));
    expect(store.stats.misses).toBe(4);
    expect(warm.diagnostics).toEqual(checkSources(edited, { today: '2026-12-01', readAhead: false }).diagnostics);
  }, 120_000);

  it('gives a check the same findings with it as without it', () => {
    const inputs: SourceInput[] = copies(readerThreshold + 30);
    const withReader = checkSources(inputs, { today: '2026-12-01' });
    const without = checkSources(inputs, { today: '2026-12-01', readAhead: false });
    expect(withReader.diagnostics.length).toBeGreaterThan(0);
    expect(withReader.diagnostics).toEqual(without.diagnostics);
  }, 120_000);
});
