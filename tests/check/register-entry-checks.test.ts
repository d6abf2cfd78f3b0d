// A register value the checker cannot read is reported once, in the register file, saying what was left
// unchecked; procedures that use the entry are not silently passed.
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { buildRegister } from '../../src/model/register.ts';
import { readYamlSource } from '../../src/parse/read-yaml-source.ts';

const registerText = `signals:
  TI-290:
    text: Receiver temperature
    unit: degC
    range: [0, 200]
    limits: { low: 10 degC, high: 120 C, consequence: Product degrades, correction: Stop heating }
    params: [receiver-temperature]
safety-functions:
  TSHH-290: { trips-when: TI-290 >= 150 degC, starts: ESD-29 }
`;

function procedure(id: string, setpoint: string): string {
  return `---
id: ${id}
title: Warm receiver T-290
kind: operating
revision: 1
status: draft
owner: Unit 2 process engineering
uses: [TSHH-290]
steps:
  - step: warm
    do: Warm the receiver.
    set: { TI-290: ${setpoint} }
    until: TI-290 >= 60 degC
  - step: hold
    do: Hold the receiver warm.
    params: { receiver-temperature: 190 degC }
    confirm: Receiver held warm
---
## Purpose
Warm the receiver.
`;
}

function check(files: Array<{ file: string; text: string }>) {
  const register = buildRegister('register', [{ file: 'register/plant.yaml', source: readYamlSource('register/plant.yaml', registerText) }]);
  return checkSources(files, { today: '2026-12-01', register });
}

describe('register entries that cannot be used', () => {
  it('reports the unreadable limit at its line, with how many procedures were not checked against it', () => {
    const result = check([{ file: 'a.md', text: procedure('FX-T290-001', '180 degC') }, { file: 'b.md', text: procedure('FX-T290-002', '70 degC') }]);
    const found = result.diagnostics.filter((d) => d.rule === 'register-entry-invalid');
    const limit = found.find((d) => d.message.includes('high operating limit'));
    expect(limit).toMatchObject({ file: 'register/plant.yaml', line: 6 });
    expect(limit!.message).toContain('the 2 procedures using TI-290 are not checked against it');
    expect(limit!.hint).toBe('Did you mean degC?');
    const starts = found.find((d) => d.message.includes("starts 'ESD-29'"));
    expect(starts).toMatchObject({ file: 'register/plant.yaml', line: 9 });
    // Reported once for the register, not once per procedure.
    expect(found).toHaveLength(2);
    // The unreadable high limit is not used as a limit: a setpoint of 180 degC passes only the low limit.
    expect(result.diagnostics.filter((d) => d.rule === 'setpoint-outside-limits')).toEqual([]);
  });

  it('checks a parameter the register gives to a signal against its limits and trips', () => {
    const fixed = registerText.replace('high: 120 C', 'high: 120 degC').replace('starts: ESD-29', 'stops: [P-290]');
    const register = buildRegister('register', [{ file: 'register/plant.yaml', source: readYamlSource('register/plant.yaml', fixed) }]);
    const result = checkSources([{ file: 'a.md', text: procedure('FX-T290-001', '100 degC') }], { today: '2026-12-01', register });
    expect(result.diagnostics.filter((d) => d.rule === 'register-entry-invalid')).toEqual([]);
    const param = result.diagnostics.filter((d) => d.rule === 'param-outside-limits');
    expect(param.map((d) => d.message)).toEqual([
      "Step 'hold' sets parameter 'receiver-temperature' (TI-290) to 190 degC, above its high operating limit 120 degC.",
    ]);
  });

  it('checks a setpoint against a register trip on its signal that the procedure does not name', () => {
    const fixed = registerText.replace('high: 120 C', 'high: 160 degC').replace('starts: ESD-29', 'stops: [P-290]');
    const register = buildRegister('register', [{ file: 'register/plant.yaml', source: readYamlSource('register/plant.yaml', fixed) }]);
    const text = procedure('FX-T290-001', '150 degC').replace('uses: [TSHH-290]\n', '').replace("params: { receiver-temperature: 190 degC }", "params: { receiver-temperature: 90 degC }");
    const result = checkSources([{ file: 'a.md', text }], { today: '2026-12-01', register });
    const found = result.diagnostics.filter((d) => d.rule === 'setpoint-at-trip');
    expect(found.map((d) => d.message)).toEqual([
      "Step 'warm' sets TI-290 to 150 degC, where TSHH-290 of the plant register acts (TI-290 >= 150 degC); the procedure does not name TSHH-290.",
    ]);
    expect(found[0].related?.[0]).toMatchObject({ file: 'register/plant.yaml', line: 9 });
  });
});

describe('proof-test interval', () => {
  const messages = (interval: string) => {
    const text = `signals:\n  TI-1: { text: Tank temperature, unit: degC, range: [0, 150] }\nsafety-functions:\n  TSHH-1:\n    trips-when: TI-1 >= 90 degC\n    closes: [XV-1]\n    proof-test: ${interval}\n`;
    const register = buildRegister('register', [{ file: 'register/plant.yaml', source: readYamlSource('register/plant.yaml', text) }]);
    return checkSources([], { today: '2026-12-01', register }).diagnostics.filter((d) => d.rule === 'register-entry-invalid').map((d) => `${d.line} ${d.message}`);
  };
  it('reads a number of days, weeks, months or years, and reports anything else at its line', () => {
    // Source: IEC 61511-1 (a safety instrumented function is proof-tested at a stated interval), from memory; common practice.
    for (const ok of ['12 months', '1 year', '26 weeks', '90 days', '0.5 years']) expect(messages(ok), ok).toEqual([]);
    for (const bad of ['yearly', '12months', '0 months', 'twelve months']) {
      const found = messages(bad);
      expect(found, bad).toHaveLength(1);
      expect(found[0]).toMatch(/^7 The proof-test interval of TSHH-1 .* does not read/);
    }
  });
});
