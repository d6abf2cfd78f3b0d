// Step waivers: a waiver with a reason sets the step's diagnostics of that rule aside and records them.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { checkSources } from '../../src/check/run-checks.ts';
import { stepWaivers } from '../../src/check/waivers.ts';

const base = readFileSync(join(import.meta.dirname, '../fixtures/rules/vague-term/invalid-as-required.md'), 'utf8').replace(/\s*# expect:.*$/gm, '');
const waived = (extra: string) => base.replace('    until: TI-210 >= 180 degC\n', `    until: TI-210 >= 180 degC\n${extra}`);

describe('waivers', () => {
  it('without a waiver the diagnostic is reported', () => {
    const r = checkSources([{ file: 'a.md', text: base }], { today: '2026-12-01' });
    expect(r.diagnostics.filter((d) => d.rule === 'vague-term')).toHaveLength(1);
    expect(r.files[0].waived).toEqual([]);
  });

  it('a waiver with a reason drops the diagnostic from the output and records it with the reason', () => {
    const text = waived('    waive:\n      - { rule: vague-term, reason: The heating rate is set by the vendor package }\n');
    const r = checkSources([{ file: 'a.md', text }], { today: '2026-12-01' });
    expect(r.diagnostics.filter((d) => d.rule === 'vague-term')).toEqual([]);
    expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(r.files[0].waived?.map((w) => [w.diagnostic.rule, w.waiver.step, w.waiver.reason])).toEqual([
      ['vague-term', 'heat-up', 'The heating rate is set by the vendor package'],
    ]);
    expect(stepWaivers(r.files[0].procedure!, r.files[0].source!).map((w) => w.rule)).toEqual(['vague-term']);
  });

  it('a waiver without a reason waives nothing and is itself an error', () => {
    const text = waived('    waive:\n      - rule: vague-term\n');
    const r = checkSources([{ file: 'a.md', text }], { today: '2026-12-01' });
    expect(r.diagnostics.filter((d) => d.rule === 'vague-term')).toHaveLength(1);
    expect(r.diagnostics.filter((d) => d.rule === 'waiver-without-reason').map((d) => d.severity)).toEqual(['error']);
  });

  it('a waiver on one step does not reach another step', () => {
    const text = waived('    waive:\n      - { rule: vague-term, reason: Vendor wording }\n')
      .replace('do: Wait for the lab result.', 'do: Wait several minutes for the lab result.');
    const r = checkSources([{ file: 'a.md', text }], { today: '2026-12-01' });
    expect(r.diagnostics.filter((d) => d.rule === 'vague-term').map((d) => d.line)).toEqual([text.split('\n').findIndex((l) => l.includes('several')) + 1]);
  });

  it('waiver rules cannot be waived', () => {
    const text = waived('    waive:\n      - rule: waiver-without-reason\n      - { rule: waiver-without-reason, reason: try }\n');
    const r = checkSources([{ file: 'a.md', text }], { today: '2026-12-01' });
    expect(r.diagnostics.filter((d) => d.rule === 'waiver-without-reason')).toHaveLength(1);
    // Both waivers name a rule that cannot be waived; the one with a reason still waives nothing.
    expect(r.diagnostics.filter((d) => d.rule === 'waiver-unknown-rule')).toHaveLength(2);
  });
});
