import { describe, expect, it } from 'vitest';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { explainSequence } from '../../src/analysis/soundness/explain.ts';

const text = `---
id: T-EXPLAIN-1
title: Explain test
kind: batch
revision: 0
status: draft
signals:
  TI-210: { text: Kettle temperature, unit: degC, range: [0, 300] }
  lab-result: { text: Lab release, values: [pass, fail] }
steps:
  - { step: heat-up, do: Heat K-210., until: TI-210 >= 180 degC }
  - parallel:
      a: [{ step: check-vent, do: Check the vent., confirm: Clear }]
      b: [{ step: check-seal, do: Check the seal., confirm: Dry }]
  - { step: sample, do: Sample. }
  - choose:
      - { when: lab-result == fail, goto: heat-up }
      - { when: lab-result == pass }
  - step: cool
    do: Cool K-210.
    until: TI-210 <= 60 degC
  - choose:
      - { when: TI-210 < 40 degC }
      - { when: TI-210 > 40 degC }
---
`;

describe('check --explain', () => {
  const lines = explainSequence(readProcedure('t.md', text).facts!);
  it('prints the step graph with its guards', () => {
    expect(lines[0]).toMatch(/^Step graph: \d+ places \(5 steps\), \d+ transitions$/);
    expect(lines).toContainEqual(expect.stringMatching(/heat-up → check-vent \+ check-seal .*TI-210 >= 180 degC/));
  });
  it('names the method and the states explored per region', () => {
    expect(lines).toContainEqual(expect.stringMatching(/^Soundness: structural method, \d+ states explored$/));
    expect(lines).toContainEqual('  branch steps.1/a: sound by construction (no jumps, every block completes)');
  });
  it('names each loop and its exit', () => {
    expect(lines).toContainEqual('  loop heat-up → check-vent + check-seal → sample → goto heat-up: exit when lab-result == pass (from sample)');
  });
  it("prints each decision's partition, with the step's until and what is left uncovered", () => {
    expect(lines).toContainEqual("  choose after cool (steps.5) (with the step's until: TI-210 <= 60 degC):");
    expect(lines).toContainEqual('    branch 1 TI-210 < 40 degC: 0 degC <= TI-210 < 40 degC');
    expect(lines).toContainEqual('    uncovered: TI-210 = 40 degC');
  });
});
