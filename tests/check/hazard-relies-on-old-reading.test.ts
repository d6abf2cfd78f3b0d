// hazard-relies-on-old-reading: a hazard ruled out at the step that acts only by a measured value read at an
// earlier step (a pressure read before an hour of heating, then the manway opened).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';

const procedure = (steps: string[], when = 'hatch == open and PI-210 > 105 kPaa', lineUp = '[hatch == closed, XV-2101 == closed, XV-2103 == closed]') => `---
id: FX-OLD-900
title: Open manway M-1 on kettle K-210
kind: normal
revision: 0
status: draft
signals:
  PI-210: { text: Kettle pressure, unit: kPaa, range: [0, 600] }
  XV-2101: { text: Hot-oil supply valve, values: [open, closed] }
  XV-2103: { text: Vent valve, values: [open, closed] }
  hatch: { text: Manway M-1, values: [open, closed] }
hazards:
  - { level: danger, hazard: Manway opened under pressure, consequence: The cover blows off, avoid: Vent first, when: '${when}' }
line-up: ${lineUp}
steps:
${steps.join('\n')}
---
`;
const vent = "  - { step: vent, do: Open vent valve XV-2103, state: { XV-2103: open }, until: 'PI-210 <= 102 kPaa' }";
const closeVent = "  - { step: close-vent, do: Close vent valve XV-2103, state: { XV-2103: closed }, until: 'XV-2103 == closed' }";
const heat = "  - { step: heat, do: Open hot-oil valve XV-2101, state: { XV-2101: open }, until: 'elapsed >= 60 min' }";
const wait = (n: number) => `  - { step: wait-${n}, do: Wait for the scrubber, until: 'elapsed >= 1 min' }`;
const open = (extra = '') => `  - { step: open-hatch, do: Open manway M-1, state: { hatch: open }, confirm: M-1 is open${extra} }`;
const found = (text: string, rule = 'hazard-relies-on-old-reading') =>
  checkSources([{ file: 'p.md', text }], { today: '2026-12-05' }).diagnostics.filter((d) => d.rule === rule);

describe('hazard-relies-on-old-reading', () => {
  it('reports the manway opened on a pressure read before an hour of heating, naming the signal, the step that read it and the path', () => {
    const [d, ...rest] = found(procedure([vent, closeVent, heat, open()]));
    expect(rest).toEqual([]);
    expect(d.severity).toBe('warning');
    expect(d.message).toMatch(/^Hazard 'Manway opened under pressure' is ruled out at step 'open-hatch' only by PI-210 as read at the end of step 'vent' \(its until\)/);
    expect(d.message).toMatch(/hatch == open and PI-210 > 105 kPaa can hold \(105 kPaa < PI-210 <= 600 kPaa and hatch = open\)/);
    expect(d.message).toMatch(/Path: vent → close-vent → heat → open-hatch\.$/);
    expect(d.hint).toBe("Check PI-210 right before the step: a needs on 'open-hatch' that states the safe value, or an until on 'heat'.");
    // hazard-can-occur stays silent: as analysed, the pressure cannot be high there.
    expect(found(procedure([vent, closeVent, heat, open()]), 'hazard-can-occur')).toEqual([]);
  });

  it('passes the manway opened right after the vent, or with a needs on the pressure', () => {
    expect(found(procedure([vent, open(), heat]))).toEqual([]);
    expect(found(procedure([vent, closeVent, heat, open(", needs: 'PI-210 <= 105 kPaa'")]))).toEqual([]);
    // A needs on something else does not cover the pressure.
    expect(found(procedure([vent, closeVent, heat, open(", needs: 'XV-2101 == open'")]))).toHaveLength(1);
    // An until that may end on time alone does not establish the pressure.
    const either = "  - { step: settle, do: Let the kettle settle, until: 'elapsed >= 5 min or PI-210 <= 102 kPaa' }";
    expect(found(procedure([vent, heat, either, open()]))).toHaveLength(1);
  });

  it('takes the line-up as the reading for the first step only', () => {
    const lineUp = '[hatch == closed, XV-2101 == closed, XV-2103 == closed, PI-210 <= 100 kPaa]';
    expect(found(procedure([open()], undefined, lineUp))).toEqual([]);
    const [d] = found(procedure([heat, open()], undefined, lineUp));
    expect(d.message).toMatch(/only by PI-210 as the line-up found it/);
  });

  it('judges only the step that puts the named valve or hatch in a state', () => {
    const after = "  - { step: inspect, do: Inspect the manway gasket, confirm: The gasket is inspected }";
    const all = found(procedure([vent, closeVent, heat, open(), after]));
    expect(all.map((d) => d.message.match(/at step '([^']+)'/)![1])).toEqual(['open-hatch']);
  });

  it('does not depend on how many unrelated steps come between, nor on how the condition is written', () => {
    // Source: NIST SP 811: 1 bar = 100 kPa; gauge = absolute - 101.325 kPa (standard atmosphere, common practice).
    const forms = ['hatch == open and PI-210 > 105 kPaa', 'hatch == open and not (PI-210 <= 105 kPaa)', 'hatch == open and PI-210 > 1.05 bara', 'not (hatch == closed or PI-210 <= 105 kPaa)'];
    fc.assert(fc.property(fc.nat(4), fc.nat(4), fc.constantFrom(...forms), fc.boolean(), (before, between, when, fresh) => {
      const steps = [
        ...Array.from({ length: before }, (_, i) => wait(i)), vent,
        ...(fresh ? [] : [heat]), ...Array.from({ length: between }, (_, i) => wait(10 + i)), open(),
      ];
      const f = found(procedure(steps, when));
      // Fresh only when the vent comes immediately before the manway is opened.
      expect(f).toHaveLength(!fresh || between > 0 ? 1 : 0);
      if (f.length) expect(f[0].message).toMatch(/PI-210 as read at the end of step 'vent'/);
    }), { numRuns: 40 });
  });
});
