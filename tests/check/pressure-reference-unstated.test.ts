// A pressure defined once in the register for every procedure says whether it is gauge or absolute.
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';
import { buildRegister } from '../../src/model/register.ts';
import { readYamlSource } from '../../src/parse/read-yaml-source.ts';

const procedure = `---
id: FX-PR-001
title: Warm the steam drum
kind: normal
revision: 0
status: draft
uses: [PI-9, PSV-9]
steps:
  - { step: warm, do: Warm the drum., until: done }
---
`;

function found(unit: string, setPressure: string) {
  const text = `signals:\n  PI-9: { text: Drum pressure, unit: ${unit}, range: [0, 20] }\nrelief-devices:\n  PSV-9: { text: Drum relief valve, set-pressure: ${setPressure}, signal: PI-9 }\n`;
  const register = buildRegister('register', [{ file: 'register/plant.yaml', source: readYamlSource('register/plant.yaml', text) }]);
  return checkSources([{ file: 'p.md', text: procedure }], { today: '2026-12-01', register })
    .diagnostics.filter((d) => d.rule === 'pressure-reference-unstated').map((d) => `${d.line} ${d.severity} ${d.message} | ${d.hint}`);
}

describe('pressure-reference-unstated', () => {
  it('cites its source', () => {
    // Source: NIST SP 811, Appendix B.8: standard atmosphere = 1.013 25 E+05 Pa, the difference between gauge and absolute.
    expect(rules['pressure-reference-unstated'].meta.source).toMatch(/101\.325 kPa.*NIST SP 811/);
  });

  it('accepts gauge and marked absolute units', () => {
    for (const [unit, set] of [['barg', '16 barg'], ['bara', '17 bara'], ['kPag', '1600 kPag'], ['psia', '250 psia'], ['MPag', '1.6 MPag']]) {
      expect(found(unit, set), unit).toEqual([]);
    }
  });

  it('warns at the unit of a signal and at a set pressure that leave the reference open, with the spellings to use', () => {
    const d = found('bar', '16 bar');
    expect(d).toHaveLength(2);
    expect(d[0]).toMatch(/^2 warning Pressure signal PI-9 has unit 'bar', which does not say whether the transmitter reads gauge or absolute pressure.*\| Write barg \(gauge\) or bara \(absolute\)/);
    expect(d[1]).toMatch(/^4 warning The set pressure of PSV-9 \(16 bar\) does not say.*\| Write it in barg \(gauge\) or bara \(absolute\)/);
    expect(found('psi', '230 psig')[0]).toContain('Write psig (gauge) or psia (absolute)');
    expect(found('mmHg', '1 barg')[0]).toContain('Write kPag (gauge) or kPaa (absolute)');
    // Not a pressure: nothing to say.
    expect(found('degC', '16 barg')).toEqual([]);
  });
});
