// Fuzzes the reader and the checker: no input may throw, leak a stack trace, trip a rule's internal guard or hang.
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { readSource } from '../../src/parse/read-source.ts';
import { grammarFile, mutate, mutation, oddText } from './fuzz-inputs.ts';

// STEPWRIGHT_FUZZ_RUNS sets the number of inputs (npm run fuzz: 100,000); the CI default is a short run.
const runs = Number(process.env.STEPWRIGHT_FUZZ_RUNS ?? 2000);
const long = runs >= 10_000;
// A file that takes more than this is a hang. Only the long run fails on it: CI machines are noisy.
const hangMs = 1000;
const today = '2026-12-01';
const repo = join(import.meta.dirname, '../..');
const crashDir = join(repo, 'tests/fixtures/fuzz');
const file = 'fuzz/input.md';

const seeds = [join(repo, 'procedures'), join(repo, 'tests/fixtures/rules')].flatMap((dir) => listMarkdown(dir)).map((p) => readFileSync(p, 'utf8'));

function listMarkdown(dir: string): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = join(dir, e.name);
    return e.isDirectory() ? listMarkdown(p) : e.name.endsWith('.md') ? [p] : [];
  }).sort();
}

const timing = new Map<string, { count: number; total: number; slowest: number; slowestSize: number }>();

function timed<T>(kind: string, text: string, run: () => T): T {
  const start = performance.now();
  const result = run();
  const ms = performance.now() - start;
  const t = timing.get(kind) ?? { count: 0, total: 0, slowest: 0, slowestSize: 0 };
  t.count++;
  t.total += ms;
  if (ms > t.slowest) Object.assign(t, { slowest: ms, slowestSize: text.length });
  timing.set(kind, t);
  if (long && ms > hangMs) throw new Error(`took ${ms.toFixed(0)} ms (limit ${hangMs} ms)`);
  return result;
}

const stackTrace = /\n\s+at\s|Maximum call stack|\bat Object\.|node:internal|\.ts:\d+:\d+\)/;

function assertCleanDiagnostics(diagnostics: ReturnType<typeof readSource>['diagnostics']) {
  for (const d of diagnostics) {
    expect(d.file).toBe(file);
    expect(Number.isInteger(d.line) && d.line >= 1 && Number.isInteger(d.column) && d.column >= 1, `position of ${d.rule}`).toBe(true);
    expect(d.endLine >= d.line, `end of ${d.rule} before its start`).toBe(true);
    expect(typeof d.rule === 'string' && d.rule.length > 0).toBe(true);
    for (const text of [d.message, d.hint ?? '', ...(d.trace ?? [])]) expect(text).not.toMatch(stackTrace);
    // run-checks turns a rule that throws into this diagnostic: for the fuzzer that is a crash.
    expect(d.message, `rule ${d.rule} failed on this input`).not.toMatch(/could not finish on this file/);
  }
}

/** One input through the reader alone. */
function readOne(text: string) {
  const source = timed('read', text, () => readSource(file, text));
  assertCleanDiagnostics(source.diagnostics);
}

/** One input through the whole checker, with a well-formed neighbour so the manual-wide rules run too. */
function checkOne(text: string) {
  const result = timed('check', text, () => checkSources([{ file, text }], { today }));
  assertCleanDiagnostics(result.diagnostics);
}

/** Runs a property; a failing input is saved as a regression fixture before the test fails. */
function fuzz(name: string, inputs: fc.Arbitrary<string>, numRuns: number, run: (text: string) => void) {
  const details = fc.check(fc.property(inputs, (text) => { run(text); }), { numRuns, seed: long ? undefined : 20261201 });
  if (!details.failed || !details.counterexample) return;
  const text = details.counterexample[0];
  mkdirSync(crashDir, { recursive: true });
  const path = join(crashDir, `${name}-${createHash('sha256').update(text).digest('hex').slice(0, 12)}.md`);
  writeFileSync(path, text);
  throw new Error(`${name}: input saved to ${relative(repo, path)} (seed ${details.seed}) failed: ${String(details.errorInstance).slice(0, 600)}`);
}

const timeout = Math.max(60_000, runs * 60);
const share = (fraction: number) => Math.max(10, Math.round(runs * fraction));
const mutated = fc.tuple(fc.constantFrom(...seeds), fc.array(mutation, { minLength: 1, maxLength: 6 })).map(([seed, m]) => mutate(seed, m));

describe('fuzzing the reader and the checker', () => {
  it('keeps every saved crashing input fixed', () => {
    const saved = existsSync(crashDir) ? readdirSync(crashDir).filter((f) => f.endsWith('.md')).sort() : [];
    for (const name of saved) {
      const text = readFileSync(join(crashDir, name), 'utf8');
      readOne(text);
      checkOne(text);
    }
  });

  it(`reads ${share(0.5)} arbitrary and mutated texts without throwing`, () => {
    const anyText = fc.oneof(
      fc.string({ unit: 'grapheme', maxLength: 400 }),
      fc.array(oddText, { maxLength: 30 }).map((parts) => `---\n${parts.join('\n')}\n---\n${parts.reverse().join(' ')}`),
      mutated,
    );
    fuzz('read', anyText, share(0.5), readOne);
  }, timeout);

  it(`checks ${share(0.075)} grammar-generated procedures without a crash`, () => {
    fuzz('grammar', grammarFile, share(0.075), checkOne);
  }, timeout);

  it(`checks ${share(0.425)} mutated real procedures without a crash`, () => {
    expect(seeds.length).toBeGreaterThan(10);
    fuzz('mutation', mutated, share(0.425), checkOne);
  }, timeout);
});

afterAll(() => {
  // Timing is reported, not asserted, in the short run.
  for (const [kind, t] of timing) {
    console.log(`fuzz ${kind}: ${t.count} inputs, mean ${(t.total / t.count).toFixed(1)} ms, slowest ${t.slowest.toFixed(0)} ms (${t.slowestSize} chars)${t.slowest > hangMs ? '  <-- over the 1 s limit' : ''}`);
  }
});
