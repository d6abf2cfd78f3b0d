// Decisions the analysis cannot split into few cases are decided by cutting boxes apart, and when even that
// passes the limit the check says so with the sizes instead of staying silent.
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';

const check = (text: string) => checkSources([{ file: 'd.md', text }], { today: '2026-12-01' }).diagnostics;

function decision(signals: string[], branches: string[]): string {
  return `---\nid: U2-DEC-001\ntitle: Decision\nkind: normal\nrevision: 0\nstatus: draft\nsignals:\n${signals.map((s) => `  ${s}: { text: Switch ${s}, values: [on, off] }\n`).join('')}steps:
  - { step: a, do: Read the switches, confirm: Read }
  - choose:\n${branches.map((w, i) => `      - when: ${w}\n        steps:\n          - { step: b${i}, do: Open XV-${i}, confirm: Open }\n`).join('')}---\n`;
}

describe('decisions over many combinations', () => {
  it('four yes/no signals with 15 of the 16 combinations: the missing one is reported', () => {
    const names = ['sa', 'sb', 'sc', 'sd'];
    const combos = Array.from({ length: 16 }, (_, n) => names.map((s, i) => `${s} == ${(n >> i) & 1 ? 'on' : 'off'}`).join(' and '));
    const missing = combos.splice(9, 1)[0]; // sa on, sb off, sc off, sd on
    const found = check(decision(names, combos));
    const gap = found.filter((d) => d.rule === 'uncovered-values');
    expect(gap).toHaveLength(1);
    expect(gap[0].message).toContain('sa = on and sb = off and sc = off and sd = on');
    expect(missing).toBe('sa == on and sb == off and sc == off and sd == on');
    expect(found.filter((d) => d.rule === 'decision-not-analysed')).toEqual([]);
  });

  it('a decision beyond the case limit is a warning that gives its size', () => {
    const signals = Array.from({ length: 40 }, (_, i) => `s${i}`);
    const branches = Array.from({ length: 300 }, (_, i) => `s${i % 40} == on and s${(i * 7 + 3) % 40} == off and s${(i * 13 + 5) % 40} == on`);
    const found = check(decision(signals, branches)).filter((d) => d.rule === 'decision-not-analysed');
    expect(found).toHaveLength(1);
    expect(found[0]).toMatchObject({ severity: 'warning' });
    expect(found[0].message).toMatch(/300 branches over 40 signals.*2,048 cases/);
    // The analysis works up to its limit first: seconds on a quiet machine, more on a busy one.
  }, 120_000);
});
