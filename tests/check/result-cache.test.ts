// The per-file result cache: a warm check says exactly what a cold one says; an edited file, another config or
// another Stepwright misses; a corrupt or stale entry is refused, never trusted; cross-file rules always run.
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { checkSources, type SourceInput } from '../../src/check/run-checks.ts';
import { defineManualRule, type FileContext } from '../../src/check/define-rule.ts';
import { cacheKey, openResultCache } from '../../src/check/result-cache.ts';
import { stepwrightStamp } from '../../src/check/code-stamp.ts';
import { readProcedureFiles } from '../../src/cli/read-procedure-files.ts';

const today = '2026-12-01';
const demo = readProcedureFiles(['procedures'], process.cwd());
let dir: string;

beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'stepwright-cache-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

const entries = () => readdirSync(dir, { recursive: true }).map(String).filter((f) => f.endsWith('.json')).map((f) => join(dir, f));
const check = (inputs: SourceInput[], salt = 'v1', store = openResultCache(dir)) => ({ store, result: checkSources(inputs, { today, cache: { store, salt } }) });
const withText = (inputs: SourceInput[], file: string, edit: (text: string) => string): SourceInput[] =>
  inputs.map((i) => (i.file === file && 'text' in i ? { file, text: edit(i.text) } : i));
/** A demo procedure with a warning of its own, so a wrong cached answer would show. */
/** Files with a line-up: each has one more entry, its line-up judged against the procedures it requires. */
const lineUps = demo.filter((i) => 'text' in i && /^line-up:/m.test(i.text)).length;
const noisy = (text: string) => text.replace(/\bdo: /, 'do: Adjust the valve as required and check it. ');

describe('result cache', () => {
  it('writes a large run\'s entries on its own thread: all of them are there, whole, once the run is flushed', async () => {
    const store = openResultCache(dir);
    const values = Array.from({ length: 300 }, (_, i) => ({ i, text: `XV-${2100 + i} ${'x'.repeat(i * 37)}` }));
    values.forEach((v, i) => store.set(cacheKey([`entry ${i}`]), v));
    await store.flush();
    expect(entries()).toHaveLength(300);
    // No half-written file is left beside them.
    expect(readdirSync(dir, { recursive: true }).map(String).filter((f) => f.includes('.tmp-'))).toEqual([]);
    const again = openResultCache(dir);
    values.forEach((v, i) => expect(again.get(cacheKey([`entry ${i}`]))).toEqual(v));
    expect(again.stats).toMatchObject({ hits: 300, misses: 0, refused: 0 });
    // Flushing again, or a store that wrote nothing, waits for nothing.
    await store.flush();
    await openResultCache(dir).flush();
  });

  it('writes entries set after a flush too (the build keeps more once the check is done)', async () => {
    const store = openResultCache(dir);
    const batch = (from: number) => Array.from({ length: 100 }, (_, i) => from + i);
    for (const i of batch(0)) store.set(cacheKey([`before ${i}`]), { i });
    await store.flush();
    for (const i of batch(100)) store.set(cacheKey([`after ${i}`]), { i });
    await store.flush();
    const again = openResultCache(dir);
    for (const i of batch(0)) expect(again.get(cacheKey([`before ${i}`]))).toEqual({ i });
    for (const i of batch(100)) expect(again.get(cacheKey([`after ${i}`]))).toEqual({ i });
    expect(again.stats).toMatchObject({ hits: 200, misses: 0, refused: 0 });
  });

  it('gives up on caching, not on the check, when the folder cannot be written from the writing thread', async () => {
    const file = join(dir, 'not-a-folder');
    writeFileSync(file, '');
    const store = openResultCache(file);
    for (let i = 0; i < 200; i++) store.set(cacheKey([`entry ${i}`]), { i });
    await store.flush();
    expect(openResultCache(file).get(cacheKey(['entry 150']))).toBeUndefined();
  });

  it('gives the same diagnostics warm as cold, from the cache', () => {
    const inputs = withText(demo, demo[0].file, noisy);
    const cold = check(inputs);
    // One entry per file, two per file for its plant state judged against the hazards of the manual (hazards that
    // can occur, hazards ruled out by an old reading), one for the
    // cross-file rules' findings over all of them, one for the one caller's findings with its calls expanded, and one
    // for the split of the one file that waives a finding.
    expect(cold.store.stats).toMatchObject({ hits: 0, misses: 3 * inputs.length + lineUps + 3 });
    const warm = check(inputs);
    expect(warm.store.stats).toMatchObject({ hits: inputs.length + 1, misses: 0, refused: 0 });
    expect(warm.result.diagnostics).toEqual(cold.result.diagnostics);
    expect(warm.result.diagnostics).toEqual(checkSources(inputs, { today }).diagnostics);
    expect(cold.result.diagnostics.length).toBeGreaterThan(0);
  });

  it('re-checks only the edited file, and cross-file rules still see every file', () => {
    check(demo);
    const first = demo.find((i) => 'text' in i)!;
    const id = /^id: (.+)$/m.exec((first as { text: string }).text)![1];
    // A second file now claims the first one's id: only it is re-read by the file rules.
    const second = demo.find((i) => i !== first && 'text' in i)!;
    const edited = withText(demo, second.file, (t) => t.replace(/^id: .+$/m, `id: ${id}`));
    const { store, result } = check(edited);
    // The edited file and the cross-file findings miss; every other file's results are found, and so are its parts
    // (what reading it found), which the cross-file rules read instead of the file.
    // The caller's expansion (the edit is not among the procedures it calls) and the waiving file's split are found too,
    // and so is every other file's plant state judged against the manual's hazards; the edited file's is judged again.
    expect(store.stats).toMatchObject({ hits: 4 * (demo.length - 1) + lineUps + 2, misses: 4 });
    expect(result.diagnostics.filter((d) => d.rule === 'duplicate-procedure-id').length).toBeGreaterThan(0);
    expect(result.diagnostics).toEqual(checkSources(edited, { today }).diagnostics);
  });

  it('misses for another Stepwright, another config, another date or another previous version', () => {
    const inputs = demo.slice(0, 3);
    check(inputs, 'v1');
    expect(check(inputs, 'v2').store.stats.hits).toBe(0);
    const store = openResultCache(dir);
    checkSources(inputs, { today: '2027-01-01', cache: { store, salt: 'v1' } });
    expect(store.stats.hits).toBe(0);
    const withPrevious = openResultCache(dir);
    checkSources(inputs, { today, cache: { store: withPrevious, salt: 'v1' }, previous: () => ({ text: (inputs[0] as { text: string }).text, commit: 'abc1234' }) });
    expect(withPrevious.stats.hits).toBe(0);
  });

  it('refuses an entry cut short, garbled or altered, and answers as a cold check does', () => {
    const inputs = withText(demo, demo[0].file, noisy);
    const cold = check(inputs).result.diagnostics;
    const files = entries();
    expect(files.length).toBe(3 * inputs.length + lineUps + 3);
    const text = readFileSync(files[0], 'utf8');
    writeFileSync(files[0], text.slice(0, Math.floor(text.length / 2)));
    writeFileSync(files[1], '\u0000\u00ff garbage');
    // Valid JSON whose diagnostics were changed by hand: the checksum no longer fits.
    for (const file of files.slice(2)) {
      const entry = JSON.parse(readFileSync(file, 'utf8'));
      const forged = { file: 'x.md', line: 1, column: 1, severity: 'info', rule: 'forged', message: 'forged' };
      if (Array.isArray(entry.value)) entry.value.unshift(forged);
      else if (Array.isArray(entry.value.diagnostics)) entry.value.diagnostics.unshift(forged);
      else if (Array.isArray(entry.value.kept)) entry.value.kept.unshift(forged);
      else entry.value.files.unshift({ file: forged.file, diagnostic: forged });
      writeFileSync(file, JSON.stringify(entry));
    }
    const { store, result } = check(inputs);
    expect(store.stats).toMatchObject({ hits: 0, refused: 3 * inputs.length + lineUps + 3 });
    expect(result.diagnostics).toEqual(cold);
    // The refused entries were replaced with good ones.
    expect(check(inputs).store.stats.hits).toBe(inputs.length + 1);
  });

  it('refuses kept parts that are cut short, garbled, altered or moved, and reads those files again', () => {
    const inputs = withText(demo, demo[0].file, noisy);
    check(inputs);
    const kept = readdirSync(dir, { recursive: true }).map(String).filter((f) => f.endsWith('.bin')).map((f) => join(dir, f));
    expect(kept.length).toBe(inputs.length);
    const bytes = readFileSync(kept[0]);
    writeFileSync(kept[0], bytes.subarray(0, Math.floor(bytes.length / 2)));
    writeFileSync(kept[1], '\u0000\u00ff garbage');
    // One byte of the parts changed: the sum in the first line no longer fits.
    const altered = readFileSync(kept[2]);
    altered[altered.length - 5] ^= 1;
    writeFileSync(kept[2], altered);
    // Another file's parts under this file's name.
    writeFileSync(kept[3], readFileSync(kept[4]));
    // Run as part of a larger manual: every file's own results come from the cache, and the cross-file rules run
    // again and read every file.
    const partial = { folder: 'procedures', left: 1 };
    const store = openResultCache(dir);
    const result = checkSources(inputs, { today, partial, cache: { store, salt: 'v1' } });
    // Results, parts (less the four refused) and plant-state judgements of every file, the caller's expansion and the
    // waiving file's split.
    expect(store.stats).toMatchObject({ hits: 4 * inputs.length + lineUps - 4 + 2, refused: 4 });
    expect(result.diagnostics).toEqual(checkSources(inputs, { today, partial }).diagnostics);
  });

  it('expands a caller again when a procedure it calls changes, and only then', () => {
    const fixtures = join('tests', 'fixtures', 'rules', 'call-expansion-problem');
    const caller = { file: 'caller.md', text: readFileSync(join(fixtures, 'invalid-caller.md'), 'utf8').replace(/  # expect: call-expansion-problem.*$/m, '') };
    const callee200 = readFileSync(join(fixtures, 'valid-callee.md'), 'utf8');
    // The callee pressurises to 140 kPa: within the caller's 150 kPa limit, nothing to say in combination.
    const callee140 = callee200.replace('PI-1: 200 kPa', 'PI-1: 140 kPa').replace('PI-1 >= 195 kPa', 'PI-1 >= 135 kPa');
    const other = demo.find((i) => 'text' in i)!;
    const run = (callee: string, otherText = (other as { text: string }).text) => {
      const inputs: SourceInput[] = [caller, { file: 'callee.md', text: callee }, { file: other.file, text: otherText }];
      const { store, result } = check(inputs);
      const combined = result.diagnostics.filter((d) => d.rule === 'call-expansion-problem' && d.file === 'caller.md');
      expect(result.diagnostics).toEqual(checkSources(inputs, { today }).diagnostics);
      return { store, combined };
    };
    expect(run(callee140).combined).toEqual([]);
    // The caller's own results come from the cache; its expansion must not.
    const raised = run(callee200);
    // Its setpoint (200 kPa) and its wait (195 kPa) are both above the caller's 150 kPa limit.
    expect(raised.combined).toHaveLength(2);
    for (const d of raised.combined) expect(d.message).toContain('150 kPa');
    expect(run(callee140).combined).toEqual([]);
    // An edit to a procedure the caller does not call leaves its expansion as it was (taken from the cache).
    const elsewhere = run(callee200, noisy((other as { text: string }).text));
    expect(elsewhere.combined).toHaveLength(2);
    // The edited file, its two plant-state judgements (hazards, old readings) and the findings over all files.
    expect(elsewhere.store.stats.misses).toBe(4);
  });

  it('judges a procedure\'s plant state again when another procedure\'s hazard that applies to it changes, and only then', () => {
    const fixtures = join('tests', 'fixtures', 'rules', 'hazard-can-occur');
    // The batch opens the cooling-oil valve while hot; the shutdown states that hazard about the same signals.
    const batch = { file: 'batch.md', text: readFileSync(join(fixtures, 'invalid-other-procedures-caution.md'), 'utf8').replace('  # expect: hazard-can-occur', '') };
    const shutdown = readFileSync(join(fixtures, 'valid-shutdown-states-caution.md'), 'utf8');
    const other = demo.find((i) => 'text' in i)! as { file: string; text: string };
    const run = (shutdownText: string, otherText = other.text) => {
      const inputs: SourceInput[] = [batch, { file: 'shutdown.md', text: shutdownText }, { file: other.file, text: otherText }];
      const { store, result } = check(inputs);
      // Whatever the cache held, the answer is the one a check without a cache gives.
      expect(result.diagnostics).toEqual(checkSources(inputs, { today }).diagnostics);
      return { store, found: result.diagnostics.filter((d) => d.rule === 'hazard-can-occur' && d.file === 'batch.md') };
    };
    const first = run(shutdown);
    expect(first.found).toHaveLength(1);
    expect(first.found[0].message).toContain("'Cooling oil into a hot jacket'");
    // Another name for the hazard: the batch's own results come from the cache, its hazard finding must not.
    const renamed = run(shutdown.replace('hazard: Cooling oil into a hot jacket', 'hazard: Cold oil on a hot jacket'));
    expect(renamed.found.map((d) => d.message)).toEqual([first.found[0].message.replace('Cooling oil into a hot jacket', 'Cold oil on a hot jacket')]);
    // A condition that cannot hold where the batch opens the valve: nothing to report any more.
    expect(run(shutdown.replace('TI-210 > 200 degC', 'TI-210 > 300 degC')).found).toEqual([]);
    expect(run(shutdown).found).toEqual(first.found);
    // An edit to a procedure whose hazards do not apply leaves the batch's judgement as it was, taken from the cache:
    // only the edited file, its own judgement and the findings over all files miss.
    const elsewhere = run(shutdown, noisy(other.text));
    expect(elsewhere.found).toEqual(first.found);
    expect(elsewhere.store.stats.misses).toBe(4);
  });

  it('judges a caller\'s plant state again when a procedure it calls changes', () => {
    const fixtures = join('tests', 'fixtures', 'rules', 'call-expansion-problem');
    // The caller starts with the line below 110 kPa and states a hazard above 170 kPa: whether it can be present
    // depends on how far the procedure it calls pressurises the line.
    const caller = {
      file: 'caller.md',
      text: readFileSync(join(fixtures, 'invalid-caller.md'), 'utf8').replace(/  # expect: call-expansion-problem.*$/m, '').replace('steps:\n', [
        'line-up: [PI-1 <= 110 kPa]',
        'hazards:',
        '  - { level: warning, hazard: Hose connection bursts, consequence: A nitrogen jet at the hose, avoid: Keep the line below 170 kPa, when: PI-1 > 170 kPa, at: [connect] }',
        'steps:\n',
      ].join('\n')),
    };
    const callee200 = readFileSync(join(fixtures, 'valid-callee.md'), 'utf8');
    const callee140 = callee200.replace('PI-1: 200 kPa', 'PI-1: 140 kPa').replace('PI-1 >= 195 kPa', 'PI-1 >= 135 kPa');
    const run = (callee: string) => {
      const inputs: SourceInput[] = [caller, { file: 'callee.md', text: callee }];
      const { result } = check(inputs);
      expect(result.diagnostics).toEqual(checkSources(inputs, { today }).diagnostics);
      return result.diagnostics.filter((d) => d.rule === 'hazard-can-occur' && d.file === 'caller.md');
    };
    expect(run(callee140)).toEqual([]);
    const raised = run(callee200);
    // While the line is pressurised to 200 kPa, and while it is vented from there.
    expect(raised.map((d) => /at step '([^']+)'/.exec(d.message)?.[1])).toEqual(['inert/pressurise', 'inert/vent']);
    expect(raised.every((d) => d.message.includes("'Hose connection bursts'"))).toBe(true);
    expect(run(callee140)).toEqual([]);
  });

  it('judges a line-up again when a procedure it requires changes, appears or goes', () => {
    const fixtures = join('tests', 'fixtures', 'rules', 'line-up-contradicts-required');
    // The batch's line-up wants XV-1 closed and PI-1 below 100 kPa; the inerting it requires ends with neither.
    const batch = { file: 'batch.md', text: readFileSync(join(fixtures, 'invalid-batch-line-up.md'), 'utf8').replaceAll('  # expect: line-up-contradicts-required', '') };
    const inerting = readFileSync(join(fixtures, 'valid-required-inerting.md'), 'utf8');
    const closesChute = inerting.replace(/\n---\s*$/, '\n  - step: close-chute\n    do: Close charge chute valve XV-1\n    state: { XV-1: closed }\n    until: XV-1 == closed\n---\n');
    const run = (inertingText?: string) => {
      const inputs: SourceInput[] = [batch, ...(inertingText ? [{ file: 'inerting.md', text: inertingText }] : [])];
      const { result } = check(inputs);
      expect(result.diagnostics).toEqual(checkSources(inputs, { today }).diagnostics);
      return result.diagnostics.filter((d) => d.rule === 'line-up-contradicts-required').map((d) => /The line-up says ([^,]+),/.exec(d.message)?.[1]);
    };
    expect(run(inerting)).toEqual(['XV-1 == closed', 'PI-1 < 100 kPa']);
    expect(run(closesChute)).toEqual(['PI-1 < 100 kPa']);
    expect(run(inerting)).toEqual(['XV-1 == closed', 'PI-1 < 100 kPa']);
    expect(run()).toEqual([]);
    expect(run(inerting)).toEqual(['XV-1 == closed', 'PI-1 < 100 kPa']);
  });

  it('does not keep a file\'s work that also reported elsewhere, so nothing it said is lost the next time', () => {
    const meta = { id: 'test-elsewhere', category: 'sequence', defaultSeverity: 'warning', summary: 'reports on a neighbour', docs: 'A rule of this test.' } as const;
    const rule = defineManualRule(meta, (ctx) => {
      ctx.files.forEach((file: FileContext, i: number) => ctx.perFile(file, '', () => {
        ctx.report(file, { message: `about ${file.file}`, hint: 'none' });
        // The first file's work also speaks about the second file.
        if (i === 0 && ctx.files[1]) ctx.report(ctx.files[1], { message: `about ${ctx.files[1].file}, from ${file.file}`, hint: 'none' });
      }));
    });
    const run = (inputs: SourceInput[]) => {
      const store = openResultCache(dir);
      const result = checkSources(inputs, { today, rules: [rule], cache: { store, salt: 'v1' } });
      expect(result.diagnostics).toEqual(checkSources(inputs, { today, rules: [rule] }).diagnostics);
      return { store, messages: result.diagnostics.map((d) => d.message) };
    };
    const two = demo.slice(0, 2);
    expect(run(two).messages).toHaveLength(3);
    // Another file joins: the findings over all files are made again; the first file's work runs again (it was not
    // kept), the second file's is taken from the cache.
    const three = run(demo.slice(0, 3));
    expect(three.messages).toHaveLength(4);
    expect(three.messages).toContain(`about ${two[1].file}, from ${two[0].file}`);
  });

  it('does not write kept parts again when every file is checked again (another date)', async () => {
    const store = openResultCache(dir);
    checkSources(demo, { today, cache: { store, salt: 'v1' } });
    await store.flush();
    const kept = () => new Map(readdirSync(dir, { recursive: true }).map(String).filter((f) => f.endsWith('.bin'))
      .map((f) => [f, statSync(join(dir, f)).mtimeMs]));
    const before = kept();
    expect(before.size).toBe(demo.length);
    const next = openResultCache(dir);
    checkSources(demo, { today: '2026-12-02', cache: { store: next, salt: 'v1' } });
    await next.flush();
    expect(kept()).toEqual(before);
  });

  it('refuses an entry moved to another key', () => {
    const store = openResultCache(dir);
    store.set(cacheKey(['a']), ['answer for a']);
    const [file] = entries();
    const other = cacheKey(['b']);
    mkdirSync(join(dir, other.slice(0, 2)), { recursive: true });
    writeFileSync(join(dir, other.slice(0, 2), `${other}.json`), readFileSync(file));
    expect(openResultCache(dir).get(other)).toBeUndefined();
    expect(openResultCache(dir).get(cacheKey(['a']))).toEqual(['answer for a']);
  });

  it('works when the folder is deleted between runs or cannot be written', () => {
    check(demo.slice(0, 2));
    rmSync(dir, { recursive: true, force: true });
    expect(check(demo.slice(0, 2)).store.stats.misses).toBe(7);
    expect(existsSync(dir)).toBe(true);
    // A file where the folder should be: nothing can be written, and the check goes on without the cache.
    rmSync(dir, { recursive: true, force: true });
    writeFileSync(dir, 'a file where the folder should be');
    expect(check(demo.slice(0, 2)).result.diagnostics).toEqual(checkSources(demo.slice(0, 2), { today }).diagnostics);
    rmSync(dir, { force: true });
  });

  it('keys by every part, framed so parts cannot run together', () => {
    expect(cacheKey(['ab', 'c'])).not.toBe(cacheKey(['a', 'bc']));
    expect(cacheKey(['a', undefined])).not.toBe(cacheKey(['a', '']));
    expect(cacheKey(['a'])).toBe(cacheKey(['a']));
    expect(stepwrightStamp()).toMatch(/^[0-9a-f]{64}$/);
  });
});
