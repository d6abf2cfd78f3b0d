// The `dated` mark on a rule says that it reads today's date; a check judges those rules at the build date as well
// (src/engine/check-run.ts). The mark must be honest both ways: a rule without it finds the same at any date and
// never reads `today`, and a rule with it does read `today`. Call expansion runs its rules again on expanded
// procedures in the caller's context, so none of the rules that take part in it may read the date.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkSources, type CheckResult } from '../../src/check/run-checks.ts';
import { allRules } from '../../src/check/rules/index.ts';
import { takesPartInExpansion } from '../../src/check/call-expansion.ts';
import type { FileContext, ManualContext, Rule } from '../../src/check/define-rule.ts';
import { fixtureFolders, inputsOf, loadFolder, previousOf, registerOf } from './rule-fixture-folders.ts';

const dated = allRules.filter((r) => r.meta.dated);
const undated = allRules.filter((r) => !r.meta.dated);
const folders = fixtureFolders();

/** The context as it is, except that reading its `today` is noted. */
function watched<T extends object>(context: T, note: () => void): T {
  return new Proxy(context, {
    get(target, key) {
      if (key === 'today') note();
      return Reflect.get(target, key, target);
    },
  });
}

/**
 * The rule, unchanged in what it finds, telling `read` its id whenever it reads today's date: from its own context,
 * or, for a rule over the whole manual, from any file's context.
 */
function recording(rule: Rule, read: (id: string) => void): Rule {
  const note = () => read(rule.meta.id);
  if (rule.scope === 'file') return { ...rule, check: (context: FileContext) => rule.check(watched(context, note)) };
  if (rule.scope === 'engine') return rule;
  return {
    ...rule,
    check: (context: ManualContext) => {
      // The engine knows each file by its own context: reports and work per file name the file it gave.
      const own = new Map<FileContext, FileContext>();
      const files = context.files.map((f) => {
        const w = watched(f, note);
        own.set(w, f);
        return w;
      });
      const back = (f: FileContext) => own.get(f) ?? f;
      rule.check({
        ...context,
        files,
        get today() {
          note();
          return context.today;
        },
        report: (f, report) => context.report(back(f), report),
        perFile: (f, inputs, work, reads) => context.perFile(back(f), inputs, work, reads?.map(back)),
      });
    },
  };
}

function run(folder: string, today: string, rules: Rule[], readFrom?: CheckResult): CheckResult {
  return checkSources(inputsOf(loadFolder(folder)), { today, rules, previous: previousOf(folder), register: registerOf(folder), ...(readFrom ? { readFrom } : {}) });
}

// What the rules without the mark find in each folder at 2026-12-01 (the date the fixtures are written for).
const baselines = new Map<string, CheckResult['diagnostics']>();
function baseline(folder: string) {
  if (!baselines.has(folder)) baselines.set(folder, run(folder, '2026-12-01', undated).diagnostics);
  return baselines.get(folder)!;
}

describe('rules without the dated mark', () => {
  for (const folder of folders) {
    it(`${folder}: find the same on 1971-01-01, 2026-12-01 and 2099-12-31, and never read today's date`, () => {
      const reads = new Set<string>();
      const rules = undated.map((r) => recording(r, (id) => reads.add(id)));
      const expected = baseline(folder);
      for (const today of ['1971-01-01', '2099-12-31']) expect(run(folder, today, rules).diagnostics, today).toEqual(expected);
      expect([...reads]).toEqual([]);
    });
  }

  it('find the same on any date (random folders and dates)', () => {
    const day = fc.date({ min: new Date('1900-01-01T00:00:00Z'), max: new Date('2199-12-31T00:00:00Z'), noInvalidDate: true }).map((d) => d.toISOString().slice(0, 10));
    fc.assert(
      fc.property(fc.constantFrom(...folders), day, (folder, today) => {
        expect(run(folder, today, undated).diagnostics).toEqual(baseline(folder));
      }),
      { numRuns: 40 },
    );
  });
});

describe('rules with the dated mark', () => {
  it('each read today\'s date on their fixtures', () => {
    const reads = new Set<string>();
    const rules = dated.map((r) => recording(r, (id) => reads.add(id)));
    for (const folder of folders) run(folder, '2026-12-01', rules);
    expect([...reads].sort()).toEqual(dated.map((r) => r.meta.id).sort());
  });

  it('are the eight that judge dates (review, certification, expiry, effective dates)', () => {
    // Listed here so that marking or unmarking a rule is a deliberate change.
    expect(dated.map((r) => r.meta.id).sort()).toEqual([
      'bypass-procedure-unknown', 'certification-in-future', 'effective-in-future', 'param-differs-from-duty', 'requires-not-in-force',
      'review-interval-too-long', 'review-overdue', 'temporary-expired',
    ]);
  });

  it('take no part in call expansion', () => {
    // Call expansion runs the file rules of its categories (and those marked for it) on each caller with its calls expanded.
    const inExpansion = allRules.filter((r) => r.scope === 'file' && takesPartInExpansion(r.meta));
    expect(inExpansion.length).toBeGreaterThan(0);
    expect(inExpansion.filter((r) => r.meta.dated).map((r) => r.meta.id)).toEqual([]);
  });

  it('find something else at another date, on their fixtures (the mark is not idle)', () => {
    // requires-not-in-force's fixtures hold a procedure in force only from 2027-01-15.
    const ids = (today: string) => run('requires-not-in-force', today, dated).diagnostics.map((d) => `${d.file}:${d.line} ${d.rule}`);
    expect(ids('2099-12-31')).not.toEqual(ids('2026-12-01'));
  });
});

describe('a second run on the files as the first run read them (how check judges at the build date)', () => {
  it('finds what a run that reads the files afresh finds', () => {
    let found = 0;
    for (const folder of folders) {
      const first = run(folder, '2026-12-01', dated);
      for (const today of ['1971-01-01', '2099-12-31']) {
        const again = run(folder, today, dated, first);
        expect(again.diagnostics, `${folder} ${today}`).toEqual(run(folder, today, dated).diagnostics);
        found += again.diagnostics.length;
      }
    }
    expect(found).toBeGreaterThan(0);
  });

  it('reads a file again when its text is not the one the first run read', () => {
    const folder = 'requires-not-in-force';
    const files = inputsOf(loadFolder(folder));
    const first = checkSources(files, { today: '2026-12-01', rules: dated });
    // The procedure required from 2027-01-15 on now comes into force on 2026-01-15.
    const edited = files.map((f) => ('text' in f ? { ...f, text: f.text.replace('effective: 2027-01-15', 'effective: 2026-01-15') } : f));
    expect(edited).not.toEqual(files);
    const afresh = checkSources(edited, { today: '2026-12-01', rules: dated });
    expect(checkSources(edited, { today: '2026-12-01', rules: dated, readFrom: first }).diagnostics).toEqual(afresh.diagnostics);
    expect(afresh.diagnostics).not.toEqual(first.diagnostics);
  });
});
