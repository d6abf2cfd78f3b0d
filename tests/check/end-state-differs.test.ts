// end-state-differs: a procedure that can end, on an ordinary path, with equipment in a state it put it in that
// another path does not leave it in and the line-up does not find it in.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';

const today = '2026-12-01';
type Branch = 'close' | 'keep-open-said' | 'nothing';

function procedure(kind: string, lineUp: boolean, branches: Branch[]): string {
  const body = (b: Branch, i: number) => {
    if (b === 'close') return `          - step: close-${i}\n            do: Close hot-oil valve XV-2101\n            state: { XV-2101: closed }\n`;
    if (b === 'keep-open-said') return `          - step: keep-${i}\n            do: Leave hot-oil valve XV-2101 open for the re-flush\n            state: { XV-2101: open }\n`;
    return `          - step: tell-${i}\n            do: Tell the shift supervisor the result\n            confirm: Supervisor is told\n`;
  };
  return `---
id: U2-T-END
title: Flush the jacket of kettle K-210
kind: ${kind}
revision: 0
status: draft
signals:
  XV-2101: { text: Hot-oil supply valve, values: [open, closed] }
  result: { text: Lab result, values: [${branches.map((_, i) => `r${i}`).join(', ')}] }
${lineUp ? 'line-up: [XV-2101 == closed]\n' : ''}steps:
  - step: flush
    do: Open hot-oil valve XV-2101 to flush the jacket
    state: { XV-2101: open }
  - choose:
${branches.map((b, i) => `      - when: result == r${i}\n        steps:\n${body(b, i)}`).join('')}---
`;
}

const findings = (text: string) => checkSources([{ file: 'p/end.md', text }], { today }).diagnostics.filter((d) => d.rule === 'end-state-differs');

describe('end-state-differs', () => {
  it('reports the valve a branch leaves open, at the step that opened it, with both paths and the line-up', () => {
    const text = procedure('shutdown', true, ['close', 'nothing']);
    const found = findings(text);
    expect(found).toHaveLength(1);
    expect(found[0].severity).toBe('warning');
    expect(found[0].line).toBe(text.split('\n').findIndex((l) => l.includes('state: { XV-2101: open }')) + 1);
    expect(found[0].message).toBe("The procedure can end with XV-2101 open, as step 'flush' leaves it, on the path flush → tell-1; on another path it ends with XV-2101 closed (flush → close-0), and its line-up finds it closed.");
    expect(found[0].trace).toEqual(['flush', 'tell-1']);
  });

  it('does not report the signal a decision reads, a branch that says it leaves the valve open, or an emergency procedure', () => {
    expect(findings(procedure('shutdown', true, ['close', 'close']))).toEqual([]);
    expect(findings(procedure('shutdown', true, ['close', 'keep-open-said']))).toEqual([]);
    expect(findings(procedure('emergency-shutdown', true, ['close', 'nothing']))).toEqual([]);
  });

  it('reports exactly when a branch leaves the valve as a shared step left it while another puts it back', () => {
    fc.assert(fc.property(
      fc.constantFrom('shutdown', 'normal', 'emergency', 'emergency-shutdown'),
      fc.boolean(),
      fc.array(fc.constantFrom<Branch>('close', 'keep-open-said', 'nothing'), { minLength: 1, maxLength: 4 }),
      (kind, lineUp, branches) => {
        const expected = !kind.startsWith('emergency') && branches.includes('nothing') && branches.includes('close') ? 1 : 0;
        expect(findings(procedure(kind, lineUp, branches))).toHaveLength(expected);
      },
    ), { numRuns: 60 });
  });
});
