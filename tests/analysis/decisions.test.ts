import { describe, expect, it } from 'vitest';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { analyseDecisions } from '../../src/analysis/decisions/analyse-decisions.ts';
import { neverTrue } from '../../src/analysis/decisions/never-true.ts';
import { parseCondition } from '../../src/analysis/conditions/parse.ts';

const signals = `signals:
  TI-5: { text: Reactor temperature, unit: degC, range: [0, 300] }
  TI-6: { text: Jacket temperature, unit: degC }
  PI-7: { text: Vessel pressure, unit: Pa, range: [0, 300000] }
  LI-8: { text: Tank level, unit: percent, range: [0, 100] }
  lab-result: { text: Lab release, values: [pass, fail, retest] }
  agitator-on: { text: Agitator running, values: [true, false] }`;

function decide(branches: string, until?: string) {
  const text = `---
id: T-1
title: Test
kind: normal
revision: 0
status: draft
${signals}
steps:
  - step: check
    do: Check the batch
${until ? `    until: ${until}\n` : ''}  - choose:
${branches}
  - step: last
    do: Finish
    confirm: Done
---
`;
  const { facts } = readProcedure('t.md', text);
  const [analysis] = analyseDecisions(facts!);
  expect(analysis.skipped).toBeUndefined();
  return analysis;
}
const when = (...conditions: string[]) => conditions.map((c) => `      - when: ${c}\n        steps: [{ step: s${Math.abs(hash(c))}, do: Act, confirm: Done }]`).join('\n');
const hash = (s: string) => [...s].reduce((h, ch) => (h * 31 + ch.charCodeAt(0)) | 0, 7);

describe('mutually exclusive branches', () => {
  it('finds an overlap of two numeric ranges with a witness inside both', () => {
    const a = decide(when('TI-5 > 80 degC', 'TI-5 < 85 degC'));
    expect(a.overlaps).toHaveLength(1);
    expect(a.overlaps[0].witness).toEqual(['TI-5 = 81 degC']);
  });

  it('treats < 10 and > 10 as exclusive and leaves exactly 10 uncovered', () => {
    const a = decide(when('LI-8 < 10 percent', 'LI-8 > 10 percent'));
    expect(a.overlaps).toEqual([]);
    expect(a.gap).toHaveLength(1);
    expect(a.space!.describe(a.gap[0])).toBe('LI-8 = 10 percent');
  });

  it('sees <= 10 and >= 10 overlap at exactly 10', () => {
    const a = decide(when('LI-8 <= 10 percent', 'LI-8 >= 10 percent'));
    expect(a.overlaps[0].witness).toEqual(['LI-8 = 10 percent']);
    expect(a.gap).toEqual([]);
  });

  it('covers the rest with otherwise', () => {
    const a = decide(`${when('LI-8 < 10 percent')}\n      - otherwise: true\n        steps: [{ step: other, do: Act, confirm: Done }]`);
    expect(a.gap).toEqual([]);
    expect(a.space!.describe(a.branches[1].region[0])).toBe('10 percent <= LI-8 <= 100 percent');
  });

  it('reasons over several signals with and, or and not', () => {
    const a = decide(when('TI-5 >= 100 degC and lab-result == pass', 'not (TI-5 >= 100 degC) or lab-result != pass'));
    expect(a.overlaps).toEqual([]);
    expect(a.gap).toEqual([]);
    const b = decide(when('TI-5 >= 100 degC and agitator-on', 'lab-result == fail or TI-5 > 150 degC'));
    expect(b.overlaps).toHaveLength(1);
    expect(b.overlaps[0].witness).toEqual(['TI-5 = 100 degC', 'agitator-on = true', 'lab-result = fail']);
  });

  it('names the enumeration values nobody covers', () => {
    const a = decide(when('lab-result == pass', 'lab-result == fail'));
    expect(a.gap.map((b) => a.space!.describe(b))).toEqual(['lab-result = retest']);
  });

  it("combines the step's own until with each branch", () => {
    // Below 50 degC the step has not ended, so the branches only need to split TI-5 >= 50 degC.
    const a = decide(when('TI-5 < 120 degC', 'TI-5 >= 120 degC'), 'TI-5 >= 50 degC');
    expect(a.gap).toEqual([]);
    const b = decide(when('TI-5 < 120 degC', 'TI-5 > 120 degC'), 'TI-5 >= 50 degC');
    expect(b.gap.map((x) => b.space!.describe(x))).toEqual(['TI-5 = 120 degC']);
  });

  it('does not count waiting for a time limit as a gap', () => {
    const a = decide(when('TI-5 >= 180 degC', 'elapsed >= 4 h'));
    expect(a.gap).toEqual([]);
    // Once 5 h have passed the second branch is true whatever TI-5 reads: every gap before that is a wait.
    const b = decide(when('TI-5 >= 180 degC and elapsed < 4 h', 'elapsed >= 5 h'));
    expect(b.gap).toEqual([]);
    const c = decide(when('TI-5 >= 180 degC and elapsed < 4 h', 'TI-5 < 100 degC'));
    expect(c.gap.map((x) => c.space!.describe(x))).toEqual(['100 degC <= TI-5 < 180 degC', '100 degC <= TI-5 <= 300 degC and elapsed >= 240 min']);
  });

  it('holds numeric signals to their declared range', () => {
    const a = decide(when('TI-5 <= 150 degC', 'TI-5 > 150 degC'));
    expect(a.gap).toEqual([]);
    const b = decide(when('TI-5 <= 150 degC', 'TI-5 > 150 degC and TI-5 < 250 degC'));
    expect(b.gap.map((x) => b.space!.describe(x))).toEqual(['250 degC <= TI-5 <= 300 degC']);
  });

  it('finds the sliver where PI >= 1 atm and PI < 760 mmHg are both true', () => {
    // Source: NIST SP 811, Appendix B: 1 atm = 101325 Pa, 1 mmHg = 133.322387415 Pa, so 760 mmHg = 101325.0144 Pa.
    const a = decide(when('PI-7 >= 1 atm', 'PI-7 < 760 mmHg'));
    expect(a.overlaps).toHaveLength(1);
    expect(a.overlaps[0].witness).toEqual(['PI-7 = 101325 Pa']);
  });

  it('sees TI <= 212 degF and TI > 100 degC as exclusive, with nothing uncovered', () => {
    // Source: NIST SP 811, Appendix B: t/°C = (t/°F − 32)/1.8, so 212 °F = 100 °C exactly.
    const a = decide(when('TI-5 <= 212 degF', 'TI-5 > 100 degC'));
    expect(a.overlaps).toEqual([]);
    expect(a.gap).toEqual([]);
  });
});

describe('conditions that can never be true', () => {
  const sig = { TI: { unit: 'degC', range: [0, 300] as [number, number] }, lab: { values: ['pass', 'fail'] } };
  const c = (text: string) => {
    const r = parseCondition(text);
    if (!r.ok) throw new Error(r.error.message);
    return r.condition;
  };
  it('flags a self-contradiction and accepts a satisfiable condition', () => {
    expect(neverTrue([c('TI > 80 degC and TI < 70 degC')], sig)).toBe(true);
    expect(neverTrue([c('lab == pass and lab == fail')], sig)).toBe(true);
    expect(neverTrue([c('TI > 80 degC and TI < 90 degC')], sig)).toBe(false);
    expect(neverTrue([c('TI >= 80 degC and not (TI > 80 degC)')], sig)).toBe(false);
  });
  it('leaves thresholds outside the declared range to threshold-outside-range', () => {
    expect(neverTrue([c('TI > 400 degC')], sig)).toBe(false);
  });
});
