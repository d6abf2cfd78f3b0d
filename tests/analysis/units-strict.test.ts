// Strict, documented units: exact factors against NIST SP 811, refused spellings with a suggestion, gauge and absolute.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  checkUnit, convert, convertDifference, documentedUnits, isKnownUnit, parseQuantity, pressureConversionNote, pressureReference, toBase,
} from '../../src/analysis/units.ts';
import { checkSources } from '../../src/check/run-checks.ts';
import { buildRegister } from '../../src/model/register.ts';
import { readYamlSource } from '../../src/parse/read-yaml-source.ts';

describe('documented units only', () => {
  it.each([
    // Source: issue analysis of the unit library: C is the coulomb and F the farad there; a procedure means degC/degF.
    ['C', 'Did you mean degC?'],
    ['F', 'Did you mean degF?'],
    ['°C', 'Did you mean degC?'],
    // mt reads as a millitonne in the library; the metric tonne is t.
    ['mt', 'Did you mean t?'],
    ['gal', 'Did you mean USgal?'],
    ['kg/hr', 'Did you mean kg/h?'],
    ['GPM', 'Did you mean gpm?'],
  ])('refuses %s and suggests the documented spelling', (unit, hint) => {
    const problem = checkUnit(unit);
    expect(problem?.ok).toBe(false);
    expect(problem?.message).toContain('not a unit Stepwright knows');
    expect(problem?.hint).toBe(hint);
  });

  it('refuses ton, saying why', () => {
    // Source: NIST SP 811, Appendix B.8: short ton 907.18474 kg, long ton 1016.047 kg, metric ton 1000 kg - three meanings.
    expect(checkUnit('ton')?.hint).toMatch(/short, long and metric tons differ/);
  });

  it('refuses prefixes and units the library knows but the list does not', () => {
    for (const unit of ['kt', 'Mg', 'hL', 'cd', 'mol', 'ft', 'inch', 'kdegC', 'kg/h/h']) expect(isKnownUnit(unit), unit).toBe(false);
  });

  it('accepts every documented unit and every documented unit per time', () => {
    for (const unit of documentedUnits) expect(isKnownUnit(unit), unit).toBe(true);
    for (const unit of ['kg/h', 'm3/h', 'L/min', 'USgal/min', 'degC/min', 'mg/g', 't/h']) expect(isKnownUnit(unit), unit).toBe(true);
  });

  it('reads any other text as unknown, never as a surprise unit', () => {
    fc.assert(fc.property(fc.string({ minLength: 1, maxLength: 6 }), (unit) => {
      if (isKnownUnit(unit)) {
        const parts = unit.trim().replaceAll('%', 'percent').split('/');
        expect(parts.every((p) => (documentedUnits as readonly string[]).includes(p) || p === 'percent')).toBe(true);
      }
    }), { numRuns: 2000 });
  });
});

describe('exact factors', () => {
  it('petroleum barrel is 42 US gallons', () => {
    // Source: NIST SP 811, Appendix B.8: barrel [for petroleum, 42 gallons (U.S.)] = 1.589 873 E-01 m3; gallon (U.S.) = 3.785 412 E-03 m3 (exactly 231 in3).
    expect(toBase(1, 'bbl')).toBeCloseTo(0.158987294928, 12);
    expect(convert(1, 'bbl', 'USgal')).toBeCloseTo(42, 12);
    // The tank-farm case: 700 bbl is 111.29 m3, above a 100 m3 high limit (a 31-gallon barrel would have said 82 m3).
    expect(convert(700, 'bbl', 'm3')).toBeCloseTo(111.2911064496, 9);
  });

  it('US gallon and US gallons per minute', () => {
    // Source: NIST SP 811, Appendix B.8: gallon (U.S.) = 3.785 412 E-03 m3 (exact: 231 in3 = 3.785411784 L).
    expect(toBase(1, 'USgal')).toBeCloseTo(0.003785411784, 15);
    // Source: NIST SP 811, Appendix B.8: gallon (U.S.) per minute (gpm) = 6.309 020 E-05 m3/s.
    expect(toBase(1, 'gpm')).toBeCloseTo(6.30901964e-5, 13);
    expect(convert(100, 'gpm', 'm3/h')).toBeCloseTo(22.71247070, 7);
    expect(convert(1, 'USgal/min', 'gpm')).toBeCloseTo(1, 12);
  });

  it('inch of mercury', () => {
    // Source: NIST SP 811, Appendix B.8: inch of mercury, conventional (inHg) = 3.386 389 E+03 Pa.
    expect(toBase(1, 'inHg')).toBeCloseTo(3386.389, 3);
    // Source: NIST SP 811, Appendix B.8: both "conventional": a mercury column of 13.5951 g/cm3 under standard gravity
    // 9.80665 m/s2 (from memory), so 1 inHg is exactly 25.4 mmHg = 3386.388640341 Pa.
    expect(toBase(1, 'inHg')).toBeCloseTo(3386.388640341, 8);
    expect(convert(1, 'inHg', 'mmHg')).toBeCloseTo(25.4, 12);
    expect(convert(29.92, 'inHg', 'kPa')).toBeCloseTo(101.3207482, 6);
  });

  it('metric tonne', () => {
    // Source: NIST SP 811, Appendix B.8: ton, metric (t) = 1.0 E+03 kg.
    expect(toBase(1, 't')).toBe(1000);
    expect(convert(2.5, 't/h', 'kg/h')).toBeCloseTo(2500, 9);
  });
});

describe('gauge and absolute pressure', () => {
  it('converts gauge to absolute with the standard atmosphere', () => {
    // Source: NIST SP 811, Appendix B.8: standard atmosphere (atm) = 1.013 25 E+05 Pa; gauge = absolute - atmosphere.
    expect(toBase(0, 'kPag')).toBe(101325);
    expect(convert(0, 'barg', 'bara')).toBeCloseTo(1.01325, 12);
    expect(convert(100, 'kPag', 'kPaa')).toBeCloseTo(201.325, 9);
    expect(convert(1, 'atm', 'kPag')).toBeCloseTo(0, 9);
    // Source: NIST SP 811, Appendix B.8: 1 atm = 14.695 95 psi, so 0 psig = 14.69595 psia.
    expect(convert(0, 'psig', 'psia')).toBeCloseTo(14.6959488, 6);
    expect(convert(250, 'kPag', 'barg')).toBeCloseTo(2.5, 12);
  });

  it('converts a gauge difference without the atmosphere', () => {
    // Source: common practice: a pressure difference is the same in gauge and absolute terms.
    expect(convertDifference(50, 'kPag', 'kPaa')).toBeCloseTo(50, 12);
  });

  it('names the reference of each pressure unit and says when a comparison crosses them', () => {
    expect(pressureReference('kPag')).toBe('gauge');
    expect(pressureReference('psig')).toBe('gauge');
    expect(pressureReference('kPaa')).toBe('absolute');
    expect(pressureReference('kPa')).toBe('absolute');
    expect(pressureReference('degC')).toBe(null);
    expect(pressureConversionNote('kPag', 'kPa')).toContain('101.325 kPa');
    expect(pressureConversionNote('barg', 'kPag')).toBe('');
  });

  it('a gauge setpoint against an absolute limit is judged after conversion, and the message says so', () => {
    // 150 kPag = 251.325 kPa(abs): above a 250 kPa absolute high limit, although 150 < 250 on paper.
    const text = `---
id: FX-P-001
title: Pressure test
kind: normal
revision: 0
status: draft
signals:
  PI-1: { text: Vessel pressure (absolute), unit: kPa, range: [0, 600] }
limits:
  PI-1: { high: 250 kPa, consequence: Overpressure, correction: Vent }
steps:
  - step: press
    do: Pressurise the vessel.
    set: { PI-1: 150 kPag }
    until: PI-1 >= 150 kPag
---
`;
    const result = checkSources([{ file: 'p.md', text }], { today: '2026-12-01' });
    const d = result.diagnostics.find((x) => x.rule === 'setpoint-outside-limits');
    expect(d?.message).toContain('above its high operating limit 250 kPa');
    expect(d?.message).toContain('101.325 kPa');
    expect(parseQuantity('150 kPag')).toEqual({ ok: true, value: 150, unit: 'kPag' });
  });
});

describe('condition judgements that cross gauge and absolute pressure say so', () => {
  // Source: NIST SP 811, Appendix B.8: standard atmosphere (atm) = 1.013 25 E+05 Pa; gauge = absolute - atmosphere.
  const note = 'converting gauge to absolute pressure with the standard atmosphere, 101.325 kPa';
  const procedure = (steps: string) => `---
id: FX-P-002
title: Pressure hold
kind: normal
revision: 0
status: draft
signals:
  PI-1: { text: Vessel pressure (absolute), unit: kPaa, range: [0, 600] }
steps:
${steps}
---
`;
  const messages = (steps: string, rule: string) => checkSources([{ file: 'p.md', text: procedure(steps) }], { today: '2026-12-01' })
    .diagnostics.filter((d) => d.rule === rule).map((d) => d.message);
  const branches = (first: string, second: string, before = 'PI-1 > 50 kPag') => `  - step: fill
    do: Fill the vessel.
    until: ${before}
  - choose:
      - when: ${first}
        steps:
          - { step: vent, do: Vent the vessel., until: done }
      - when: ${second}
        steps:
          - { step: hold, do: Hold the vessel., until: done }`;

  it('overlapping-branches: 110 kPag is 211.325 kPaa, so it overlaps >= 200 kPaa', () => {
    const found = messages(branches('PI-1 >= 200 kPaa', 'PI-1 < 110 kPag'), 'overlapping-branches');
    expect(found).toHaveLength(1);
    expect(found[0]).toContain(note);
    // The same overlap written in one reference needs no note.
    const same = messages(branches('PI-1 >= 200 kPaa', 'PI-1 < 211.325 kPaa', 'PI-1 > 150 kPaa'), 'overlapping-branches');
    expect(same).toHaveLength(1);
    expect(same[0]).not.toContain('101.325');
  });

  it('uncovered-values: 90 kPag is 191.325 kPaa, leaving 191.325..200 kPaa uncovered', () => {
    const found = messages(branches('PI-1 >= 200 kPaa', 'PI-1 < 90 kPag'), 'uncovered-values');
    expect(found).toHaveLength(1);
    expect(found[0]).toContain('191.325 kPaa <= PI-1 < 200 kPaa');
    expect(found[0]).toContain(note);
    // Exactly complementary across the references (98.675 kPag = 200 kPaa): nothing uncovered, nothing overlapping.
    expect(messages(branches('PI-1 >= 200 kPaa', 'PI-1 < 98.675 kPag'), 'uncovered-values')).toEqual([]);
    expect(messages(branches('PI-1 >= 200 kPaa', 'PI-1 < 98.675 kPag'), 'overlapping-branches')).toEqual([]);
  });

  it('contradictory-condition: above 150 kPag (251.325 kPaa) and below 200 kPaa cannot both hold', () => {
    const found = messages('  - { step: hold, do: Hold the vessel., until: PI-1 > 150 kPag and PI-1 < 200 kPaa }', 'contradictory-condition');
    expect(found).toHaveLength(1);
    expect(found[0]).toContain(note);
    expect(messages('  - { step: hold, do: Hold the vessel., until: PI-1 > 50 kPag and PI-1 < 200 kPaa }', 'contradictory-condition')).toEqual([]);
  });

  it('setpoint-blocks-transition: a 100 kPag setpoint (201.325 kPaa) never reaches 210 kPaa', () => {
    const steps = (until: string) => `  - step: press\n    do: Pressurise the vessel.\n    set: { PI-1: 100 kPag }\n    until: ${until}`;
    const found = messages(steps('PI-1 >= 210 kPaa'), 'setpoint-blocks-transition');
    expect(found).toHaveLength(1);
    expect(found[0]).toContain(note);
    expect(messages(steps('PI-1 >= 201 kPaa'), 'setpoint-blocks-transition')).toEqual([]);
    expect(messages(steps('PI-1 >= 110 kPag'), 'setpoint-blocks-transition')[0]).not.toContain('101.325');
  });
});

describe('the added units through the checker', () => {
  const procedure = (set: string) => `---
id: FX-TF-001
title: Fill tank T-250
kind: normal
revision: 0
status: draft
signals:
  LV-250: { text: Tank T-250 contents, unit: m3, range: [0, 150] }
  FI-251: { text: Fill flow, unit: gpm, range: [0, 800] }
  PI-252: { text: Vapour space pressure (absolute), unit: inHg, range: [0, 35] }
limits:
  LV-250: { high: 100 m3, consequence: Tank overfills into the bund, correction: Stop the fill pump }
  FI-251: { high: 100 m3/h, consequence: Static charge in the fill line, correction: Throttle the fill valve }
  PI-252: { low: 28 inHg, consequence: The tank roof buckles under vacuum, correction: Stop the pump-out and check the vacuum breaker }
steps:
  - step: fill
    do: Fill the tank.
    set: { ${set} }
    until: LV-250 >= 10 m3
---
`;
  const outside = (set: string) => checkSources([{ file: 't.md', text: procedure(set) }], { today: '2026-12-01' }).diagnostics;

  it('reads gpm and inHg as units, not as unknown-unit', () => {
    expect(outside('LV-250: 50 m3').filter((d) => d.rule === 'unknown-unit')).toEqual([]);
  });

  it('a 700 bbl setpoint is 111.29 m3 (shown as about 111.3 m3), above a 100 m3 high limit', () => {
    // Source: NIST SP 811, Appendix B.8: barrel [for petroleum, 42 gallons (U.S.)] = 1.589 873 E-01 m3.
    const found = outside('LV-250: 700 bbl').filter((d) => d.rule === 'setpoint-outside-limits');
    expect(found).toHaveLength(1);
    expect(found[0].message).toContain('700 bbl (about 111.3 m3)');
    // 600 petroleum barrels is 95.39 m3: inside the limit.
    expect(outside('LV-250: 600 bbl').filter((d) => d.rule === 'setpoint-outside-limits')).toEqual([]);
  });

  it('shows a setpoint just past a limit with the digits that show it is past', () => {
    // Source: NIST SP 811, Appendix B.8 (barrel as above): 629 bbl = 100.00301 m3, just above the 100 m3 limit;
    // rounded to four digits it would read 100.0 m3, level with the limit.
    const found = outside('LV-250: 629 bbl').filter((d) => d.rule === 'setpoint-outside-limits');
    expect(found).toHaveLength(1);
    expect(found[0].message).toContain('629 bbl (about 100.003 m3), above its high operating limit 100 m3');
  });

  it('US gallons per minute and inches of mercury are compared with the limits exactly', () => {
    // Source: NIST SP 811, Appendix B.8: gallon (U.S.) per minute = 6.309 020 E-05 m3/s, so 100 m3/h = 440.29 gpm.
    expect(outside('FI-251: 440 gpm').filter((d) => d.rule === 'setpoint-outside-limits')).toEqual([]);
    expect(outside('FI-251: 441 gpm').filter((d) => d.rule === 'setpoint-outside-limits')).toHaveLength(1);
    // 28 inHg = 94.82 kPa; 711.2 mmHg is the same pressure, 711 mmHg just below it.
    expect(outside('PI-252: 27.9 inHg').filter((d) => d.rule === 'setpoint-outside-limits')).toHaveLength(1);
    expect(outside('PI-252: 711.2 mmHg').filter((d) => d.rule === 'setpoint-outside-limits')).toEqual([]);
    expect(outside('PI-252: 711 mmHg').filter((d) => d.rule === 'setpoint-outside-limits')).toHaveLength(1);
  });
});

describe('plant-state findings across gauge and absolute', () => {
  // Source: NIST SP 811, Appendix B.8: standard atmosphere = 101.325 kPa; 100 kPag is 201.325 kPa absolute.
  const text = (hazardWhen: string, needs: string) => `---
id: FX-P-005
title: Pressure hold
kind: normal
revision: 0
status: draft
signals:
  PI-1: { text: Vessel pressure (absolute), unit: kPaa, range: [0, 600] }
hazards:
  - { level: warning, hazard: Vessel under pressure, consequence: Leak at the manway, avoid: Vent first, when: "${hazardWhen}" }
steps:
  - { step: press, do: Pressurise the vessel., set: { PI-1: 210 kPaa }, until: PI-1 >= 205 kPaa }
  - { step: hold, do: Hold the vessel., needs: "${needs}", until: done }
---
`;
  const messages = (hazardWhen: string, needs: string, rule: string) => checkSources([{ file: 'p.md', text: text(hazardWhen, needs) }], { today: '2026-12-01' })
    .diagnostics.filter((d) => d.rule === rule).map((d) => d.message);

  it('hazard-can-occur and step-need-unmet say that the standard atmosphere was used', () => {
    const hazard = messages('PI-1 > 100 kPag', 'PI-1 < 50 kPag', 'hazard-can-occur');
    expect(hazard.length).toBeGreaterThan(0);
    expect(hazard[0]).toContain('201.325 kPaa < PI-1');
    expect(hazard.every((m) => m.includes('standard atmosphere, 101.325 kPa'))).toBe(true);
    const need = messages('PI-1 > 100 kPag', 'PI-1 < 50 kPag', 'step-need-unmet');
    expect(need).toHaveLength(1);
    expect(need[0]).toContain('standard atmosphere, 101.325 kPa');
    // Written in the signal's own reference: no note.
    expect(messages('PI-1 > 201.325 kPaa', 'PI-1 < 151.325 kPaa', 'hazard-can-occur').every((m) => !m.includes('101.325 kPa)'))).toBe(true);
    expect(messages('PI-1 > 201.325 kPaa', 'PI-1 < 151.325 kPaa', 'step-need-unmet')[0]).not.toContain('standard atmosphere');
  });
});

describe('a local declaration against the register across gauge and absolute', () => {
  // Source: NIST SP 811, Appendix B.8: standard atmosphere = 101.325 kPa; 250 kPag is 351.325 kPa absolute.
  const registerText = `signals:
  PI-7: { text: Vessel pressure (absolute), unit: kPaa, range: [0, 600], limits: { high: 250 kPaa, consequence: Overpressure, correction: Vent } }
safety-functions:
  PSHH-7: { trips-when: PI-7 >= 300 kPaa, closes: [XV-7] }
`;
  const register = buildRegister('register', [{ file: 'register/plant.yaml', source: readYamlSource('register/plant.yaml', registerText) }]);
  const procedure = (limit: string, trip: string) => `---
id: FX-RC-001
title: Hold the vessel
kind: normal
revision: 0
status: draft
uses: [PSHH-7]
limits:
  PI-7: { high: ${limit}, consequence: Overpressure, correction: Vent }
interlocks:
  - { tag: PSHH-7, trips-when: "${trip}", action: Closes XV-7 }
steps:
  - { step: hold, do: Hold the vessel., until: done }
---
`;
  const found = (limit: string, trip: string) => checkSources([{ file: 'p.md', text: procedure(limit, trip) }], { today: '2026-12-01', register })
    .diagnostics.filter((d) => d.rule === 'register-conflict').map((d) => d.message);

  it('register-conflict names the standard atmosphere when the two differ across references', () => {
    expect(found('148.675 kPag', 'PI-7 >= 198.675 kPag').filter((m) => !m.startsWith('Interlock PSHH-7 is described'))).toEqual([]);
    const differ = found('250 kPag', 'PI-7 >= 300 kPag');
    expect(differ.find((m) => m.startsWith('The high limit'))).toContain('101.325 kPa');
    expect(differ.find((m) => m.includes("trips when 'PI-7 >= 300 kPag'"))).toContain('101.325 kPa');
    expect(found('260 kPaa', 'PI-7 >= 310 kPaa').every((m) => !m.includes('101.325'))).toBe(true);
  });
});

describe('numbers in another notation', () => {
  it('says a hexadecimal, octal or binary number is one, with its decimal value, instead of reading a strange unit', () => {
    // Source: ECMAScript 2024 (ECMA-262), 12.9.3 Numeric Literals: 0x, 0o and 0b prefixes for bases 16, 8 and 2.
    fc.assert(fc.property(fc.integer({ min: 0, max: 100_000 }), fc.constantFrom(['x', 16], ['o', 8], ['b', 2]), fc.constantFrom('degC', 'kPag', 'kg'), (value, [prefix, radix], unit) => {
      const written = `0${prefix}${value.toString(radix as number)} ${unit}`;
      const parsed = parseQuantity(written);
      expect(parsed.ok).toBe(false);
      if (parsed.ok) return;
      expect(parsed.message).toMatch(/is written in (hexadecimal|octal|binary); quantities are written in decimal\.$/);
      expect(parsed.hint).toBe(`Write ${value} ${unit}.`);
    }), { numRuns: 60 });
    const grouped = parseQuantity('1_000 kg');
    expect(grouped.ok ? null : [grouped.message, grouped.hint]).toEqual(["'1_000' groups its digits with '_'; write the digits without separators.", 'Write 1000 kg.']);
    // Decimal numbers with exponents are still read as they were.
    expect(parseQuantity('2.55e2 degC')).toEqual({ ok: true, value: 255, unit: 'degC' });
  });

  it('calls an empty or unit-less setpoint a setpoint, once', () => {
    const text = (value: string) => `---\nid: FX-S-001\ntitle: Heat\nkind: normal\nrevision: 0\nstatus: draft\nsignals:\n  TI-210: { text: Kettle temperature, unit: degC, range: [0, 300] }\nsteps:\n  - step: heat\n    do: Heat the kettle\n    set: { TI-210: ${value} }\n    until: TI-210 >= 100 degC\n---\n`;
    const errors = (value: string) => checkSources([{ file: 's.md', text: text(value) }], { today: '2026-12-01' }).diagnostics.filter((d) => d.severity === 'error').map((d) => `${d.rule} ${d.message}`);
    expect(errors('null')).toEqual(["invalid-value The setpoint of 'TI-210' is empty: write a quantity with its unit, such as 180 degC, or one of the values of an enumerated signal."]);
    expect(errors('180')).toEqual(["value-not-allowed '180' is not a quantity: '180' has no unit."]);
  });
});
