// A rule whose work ahead (the English model's tagging on its own thread) is not done for a file is left for later:
// the other rules check that file and the next ones meanwhile. The findings are the same, and few files wait.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkSources, type SourceInput } from '../../src/check/run-checks.ts';
import { defineFileRule, defineManualRule, type FileContext, type RuleMeta, type WorkAhead } from '../../src/check/define-rule.ts';
import { openResultCache } from '../../src/check/result-cache.ts';
import { readProcedureFiles } from '../../src/cli/read-procedure-files.ts';

const today = '2026-12-01';
const demo = readProcedureFiles(['procedures'], process.cwd()).filter((i): i is Extract<SourceInput, { text: string }> => 'text' in i);

const meta = (id: string): RuleMeta => ({ id, category: 'writing', defaultSeverity: 'warning', summary: `${id} for the test`, docs: 'A rule of this test.' });

/** Two rules that log the order they check files in: one plain, one with work ahead whose readiness the test sets. */
function rules(ready: (file: string) => boolean) {
  const order: string[] = [];
  // Both kinds of call, in the order they came.
  const events: string[] = [];
  const name = (context: FileContext) => context.file.replace(/.*\//, '');
  const plain = defineFileRule(meta('test-plain'), (context) => {
    order.push(`plain ${name(context)}`);
    events.push(`plain ${name(context)}`);
    context.report({ message: 'plain finding', hint: 'none' });
  });
  const prepared: string[] = [];
  const ahead: WorkAhead = {
    prepare: (context) => {
      prepared.push(name(context));
      events.push(`prepare ${name(context)}`);
    },
    ready: (context) => ready(name(context)),
  };
  const waiting = defineFileRule(meta('test-ahead'), (context) => {
    order.push(`ahead ${name(context)}`);
    context.report({ message: `ahead finding in ${name(context)}`, hint: 'none' });
  }, ahead);
  return { order, prepared, events, list: [plain, waiting] };
}

const three = demo.slice(0, 3);
const names = three.map((i) => i.file.replace(/.*\//, ''));

describe('work ahead', () => {
  it('prepares every file before any rule runs', () => {
    const { order, prepared, list } = rules(() => true);
    checkSources(three, { today, rules: list });
    expect(prepared).toEqual(names);
    expect(order).toEqual(names.flatMap((n) => [`plain ${n}`, `ahead ${n}`]));
  });

  it('starts the work ahead a stretch of 64 files ahead of the file being checked, once for each file', () => {
    const inputs: SourceInput[] = Array.from({ length: 100 }, (_, i) => ({ ...demo[i % demo.length], file: `copies/p${String(i).padStart(2, '0')}.md` }));
    const { events, prepared, list } = rules(() => true);
    checkSources(inputs, { today, rules: list });
    const at = (event: string) => events.indexOf(`${event}.md`);
    // The first 64 before any rule runs; then one more before each file is checked.
    expect(at('prepare p63')).toBeLessThan(at('plain p00'));
    expect(at('prepare p64')).toBeGreaterThan(at('plain p00'));
    expect(at('prepare p64')).toBe(at('plain p01') - 1);
    expect(at('prepare p99')).toBe(at('plain p36') - 1);
    expect(prepared).toEqual(inputs.map((i) => i.file.replace(/.*\//, '')));
  });

  it('checks the next files while a file waits, then comes back to it, with the same findings', () => {
    const ran = { plain: 0 };
    // Ready only once the plain rule has checked all three files.
    const waited = rules(() => ran.plain >= 3);
    const counting = waited.list.map((rule) => (rule.meta.id === 'test-plain' && rule.scope === 'file'
      ? { ...rule, check: (c: FileContext) => { ran.plain++; rule.check(c); } }
      : rule));
    const late = checkSources(three, { today, rules: counting });
    // The third file's rule finds its work done at once; the two that waited follow, in the order they came.
    expect(waited.order).toEqual([
      `plain ${names[0]}`, `plain ${names[1]}`, `plain ${names[2]}`, `ahead ${names[2]}`, `ahead ${names[0]}`, `ahead ${names[1]}`,
    ]);
    const prompt = checkSources(three, { today, rules: rules(() => true).list });
    expect(late.diagnostics).toEqual(prompt.diagnostics);
    expect(late.diagnostics.filter((d) => d.rule === 'test-ahead')).toHaveLength(3);
  });

  it('lets at most 16 files wait: the oldest is finished, waiting, before a 17th joins', () => {
    const inputs: SourceInput[] = Array.from({ length: 20 }, (_, i) => ({ ...demo[i % demo.length], file: `copies/p${String(i).padStart(2, '0')}.md` }));
    const { order, list } = rules(() => false);
    checkSources(inputs, { today, rules: list });
    // The first file's waiting rule runs as soon as 17 files wait, i.e. right after the 17th file's plain rule.
    expect(order.indexOf('ahead p00.md')).toBe(order.indexOf('plain p16.md') + 1);
    expect(order.filter((o) => o.startsWith('ahead'))).toEqual(inputs.map((i) => `ahead ${i.file.replace(/.*\//, '')}`));
  });

  it('keeps a waiting rule\'s findings with its file in the result cache', () => {
    const dir = mkdtempSync(join(tmpdir(), 'stepwright-ahead-'));
    try {
      let ready = false;
      const first = rules(() => ready);
      const cold = checkSources(three, { today, rules: first.list, cache: { store: openResultCache(dir), salt: 't' } });
      ready = true;
      const second = rules(() => true);
      const warm = checkSources(three, { today, rules: second.list, cache: { store: openResultCache(dir), salt: 't' } });
      // Every file came from the cache (no rule ran), with the waiting rule's findings.
      expect(second.order).toEqual([]);
      expect(warm.diagnostics).toEqual(cold.diagnostics);
      expect(warm.diagnostics.filter((d) => d.rule === 'test-ahead')).toHaveLength(3);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('runs the rules still waiting at the end after the cross-file rules, and keeps only a file\'s own findings with it', () => {
    const dir = mkdtempSync(join(tmpdir(), 'stepwright-ahead-'));
    try {
      const run = (inputs: SourceInput[], ready: () => boolean) => {
        const logged = rules(ready);
        const manual = defineManualRule(meta('test-manual'), (ctx) => {
          logged.order.push('manual');
          for (const file of ctx.files) ctx.report(file, { message: 'a finding about the whole manual', hint: 'none' });
        });
        const result = checkSources(inputs, { today, rules: [...logged.list, manual], cache: { store: openResultCache(dir), salt: 't' } });
        return { order: logged.order, result };
      };
      // Never ready while the files are checked: the waiting rules run once the cross-file rule has.
      const cold = run(three, () => false);
      expect(cold.order).toEqual([...names.map((n) => `plain ${n}`), 'manual', ...names.map((n) => `ahead ${n}`)]);
      expect(cold.result.diagnostics).toEqual(checkSources(three, { today, rules: [...rules(() => true).list, defineManualRule(meta('test-manual'), (ctx) => {
        for (const file of ctx.files) ctx.report(file, { message: 'a finding about the whole manual', hint: 'none' });
      })] }).diagnostics);
      // A fourth file: the three come from the cache, the cross-file rule runs again over all four. Had a file's
      // entry kept the cross-file finding, that file would show it twice.
      const four = demo.slice(0, 4);
      const warm = run(four, () => true);
      expect(warm.order).toEqual([`plain ${four[3].file.replace(/.*\//, '')}`, `ahead ${four[3].file.replace(/.*\//, '')}`, 'manual']);
      for (const input of four) {
        const own = warm.result.diagnostics.filter((d) => d.file === input.file);
        expect(own.map((d) => d.rule).sort()).toEqual(['test-ahead', 'test-manual', 'test-plain']);
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('runs a rule whose readiness question fails at once, as if ready', () => {
    const { order, list } = rules(() => {
      throw new Error('broken');
    });
    checkSources(three.slice(0, 1), { today, rules: list });
    expect(order).toEqual([`plain ${names[0]}`, `ahead ${names[0]}`]);
  });
});
