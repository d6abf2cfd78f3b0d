// The step redline shows changed steps with context, folds long unchanged runs, and reads values without JSON.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readProcedure } from '../../src/check/run-checks.ts';
import { plainValue, redline, stepsWithContext, type StepRow } from '../../src/history/redline.ts';
import { procedureText, stepsV1 } from './temp-repo.ts';

function longSteps(n: number, changeAt: number): string[] {
  return Array.from({ length: n }, (_, i) => [
    `  - step: s${i + 1}`,
    `    do: ${i === changeAt ? 'Open' : 'Check'} valve number ${i + 1}`,
    '    confirm: Done',
  ]).flat();
}

describe('redline with context', () => {
  it('shows the one changed step of 16 with one step either side and folds the rest', () => {
    const read = (steps: string[]) => readProcedure('p.md', procedureText({ revision: 1, status: 'draft', steps })).procedure!;
    const r = redline(read(longSteps(16, -1)), read(longSteps(16, 7)));
    const lines = stepsWithContext(r.steps);
    const shown = lines.flatMap((l) => (l.kind === 'row' ? [l.row.id] : []));
    expect(shown).toEqual(['s7', 's8', 's9']);
    expect(lines.map((l) => (l.kind === 'folded' ? l.count : l.row.id))).toEqual([6, 's7', 's8', 's9', 7]);
    expect(lines.filter((l) => l.kind === 'row' && l.context).map((l) => (l as { row: StepRow }).row.id)).toEqual(['s7', 's9']);
  });

  it('loses no step: shown and folded rows together are every row in order (property)', () => {
    fc.assert(fc.property(fc.array(fc.boolean(), { maxLength: 40 }), fc.integer({ min: 0, max: 3 }), (flags, around) => {
      const rows = flags.map((changed, i) => ({ id: `s${i}`, kinds: changed ? ['changed'] : [], fields: [] }) as StepRow);
      const lines = stepsWithContext(rows, around);
      expect(lines.flatMap((l) => (l.kind === 'row' ? [l.row] : l.rows))).toEqual(rows);
      for (const l of lines) if (l.kind === 'row' && !l.context) expect(l.row.kinds.length).toBeGreaterThan(0);
      // Never two folded runs next to each other.
      lines.forEach((l, i) => { if (i > 0 && l.kind === 'folded') expect(lines[i - 1].kind).toBe('row'); });
    }));
  });

  it('reads extra step fields without JSON quotes or braces', () => {
    expect(plainValue('Close XV-2107')).toBe('Close XV-2107');
    expect(plainValue({ if: 'TI-210 >= 250 degC', then: 'Stop the feed', 'call-to': ['shift lead', 'control room'] }))
      .toBe('if: TI-210 >= 250 degC; then: Stop the feed; call to: (shift lead; control room)');
    for (const v of [plainValue({ a: 1 }), plainValue(['x', 'y']), plainValue({ n: { m: true } })]) expect(v).not.toMatch(/["{}]/);
    const r = redline(
      readProcedure('p.md', procedureText({ revision: 1, status: 'draft', steps: stepsV1 })).procedure!,
      readProcedure('p.md', procedureText({ revision: 2, status: 'draft', steps: stepsV1.map((l) => (l === '  - step: sample' ? l + '\n    performed-by: Field operator' : l)) })).procedure!,
    );
    const fields = r.steps.find((s) => s.id === 'sample')!.fields;
    for (const f of fields) expect(`${f.field} ${f.before ?? ''} ${f.after ?? ''}`).not.toMatch(/"/);
  });
});
