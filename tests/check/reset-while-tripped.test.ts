// reset-while-tripped: a latching trip reset while its condition can still hold, on some path through the procedure.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';
import type { PlantRegister } from '../../src/model/register.ts';
import { registerOf } from './rule-fixture-folders.ts';

const procedure = (steps: string, { kind = 'emergency-shutdown', trip = 'TI-900 >= 200 degC', latches = true } = {}) => `---
id: FX-R900-ESD
title: Recover reactor R-900 after a trip
kind: ${kind}
revision: 0
status: draft
signals:
  TI-900: { text: Reactor temperature, unit: degC, range: [0, 300] }
  M-900: { text: Reactor agitator, values: [running, stopped] }
interlocks:
  - { tag: TSHH-900, trips-when: ${trip}, action: Closes steam valve XV-901, latches: ${latches} }
steps:
${steps}
---
`;
const cool = (until: string) => `  - { step: cool, do: Cool the reactor, until: '${until}', time-limit: { max: 2 h, then: Tell the shift supervisor } }`;
const reset = (extra = '') => `  - { step: reset-trip, do: Reset TSHH-900 at the panel, resets: [TSHH-900], confirm: The panel shows the trip reset${extra} }`;
const found = (text: string, register?: PlantRegister) =>
  checkSources([{ file: 'r.md', text }], { today: '2026-12-01', register }).diagnostics.filter((d) => d.rule === 'reset-while-tripped');
// Source: NIST SP 811, Appendix B.9: t/degF = 1.8 t/degC + 32.
const inDegF = (c: number) => Number((c * 1.8 + 32).toFixed(6));

describe('reset-while-tripped', () => {
  it('reports a reset with nothing before it that clears the cause, with the trip, its condition, the values and the path', () => {
    const [d, ...rest] = found(procedure(reset()));
    expect(rest).toEqual([]);
    expect(d.severity).toBe('error');
    expect(d.message).toBe("Step 'reset-trip' resets latching trip TSHH-900, but its condition TI-900 >= 200 degC can still be true there (200 degC <= TI-900 <= 300 degC): the reset may be tried with the cause present. Path: reset-trip.");
    expect(d.hint).toMatch(/until brings the signal clear of the trip, or a needs/);
    expect(d.related?.[0].message).toBe('trip condition of TSHH-900');
    expect(d.trace).toEqual(['reset-trip']);
  });

  it('passes a reset after a step whose until brings the signal clear, or with a needs that says so', () => {
    expect(found(procedure([cool('TI-900 <= 150 degC'), reset()].join('\n')))).toEqual([]);
    expect(found(procedure(reset(", needs: 'TI-900 < 180 degC'")))).toEqual([]);
    // A clearing wait that stops inside the trip band does not clear it.
    expect(found(procedure([cool('TI-900 <= 250 degC'), reset()].join('\n')))).toHaveLength(1);
  });

  it('takes the reset at the start of its step: the step\'s own until does not clear the cause', () => {
    expect(found(procedure(`  - { step: reset-trip, do: Reset TSHH-900, resets: [TSHH-900], until: 'TI-900 <= 150 degC', time-limit: { max: 1 h, then: Call the supervisor } }`))).toHaveLength(1);
  });

  it('follows every branch: a cause cleared on one branch only is reported, with the path through the other', () => {
    const steps = [
      '  - { step: read, do: Read TI-900, expect: 1 min }',
      '  - choose:',
      '      - when: M-900 == running',
      '        steps:',
      `        ${cool('TI-900 <= 150 degC').trim()}`,
      '      - when: M-900 == stopped',
      '        steps:',
      "          - { step: dump, do: Dump the reactor to the drown tank, until: 'M-900 == stopped', time-limit: { max: 5 min, then: Call the supervisor } }",
      reset(),
    ].join('\n');
    const [d, ...rest] = found(procedure(steps));
    expect(rest).toEqual([]);
    expect(d.trace).toEqual(['read', 'dump', 'reset-trip']);
  });

  it('judges resets in every kind of procedure, and only of latching trips', () => {
    expect(found(procedure(reset(), { kind: 'startup' }))).toHaveLength(1);
    expect(found(procedure(reset(), { latches: false }))).toEqual([]);
  });

  it('says so, as info at the reset, when the trip condition cannot be analysed', () => {
    const [d, ...rest] = found(procedure(reset(), { trip: 'TI-900 >= 200 kg' }));
    expect(rest).toEqual([]);
    expect(d.severity).toBe('info');
    expect(d.message).toBe("Step 'reset-trip' resets TSHH-900, but whether the trip's cause can still be present there was not checked: its condition TI-900 >= 200 kg could not be analysed against the plant state (threshold cannot be compared).");
  });

  it('judges a latching safety function of the plant register that the procedure uses', () => {
    const register = registerOf('reset-while-tripped')!;
    const text = (steps: string) => `---
id: FX-K210-TT
title: Test the K-210 high-high temperature trip
kind: startup
revision: 0
status: draft
uses: [TSHH-210]
steps:
${steps}
---
`;
    const test = '  - { step: test-trip, do: Test TSHH-210 with the technician, trips: [TSHH-210], confirm: Test recorded }';
    const resetRegister = '  - { step: reset-trip, do: Reset TSHH-210 at the panel, resets: [TSHH-210], confirm: Reset shown }';
    const [d] = found(text([test, resetRegister].join('\n')), register);
    expect(d?.message).toContain('resets latching trip TSHH-210, but its condition TI-210 >= 255 degC can still be true there');
    // TSHH-210 latches through ESD-210, which PSHH-210 and HS-2190 also start: the reset is judged against all three.
    const checkTemperature = "  - { step: check-clear, do: Check TI-210 below its trip point, until: 'TI-210 < 240 degC' }";
    // Their signals are not the procedure's here, so an info line says they were not judged, naming each.
    const notJudged = found(text([test, checkTemperature, resetRegister].join('\n')), register);
    expect(notJudged.map((d) => [d.severity, /also resets (\S+) /.exec(d.message)?.[1]])).toEqual([['info', 'HS-2190'], ['info', 'PSHH-210']]);
    const check = "  - { step: check-clear, do: Check every cause of ESD-210 clear, until: 'TI-210 < 240 degC and PI-210 < 250 kPaa and esd-active == false' }";
    expect(found(text([test, check, resetRegister].join('\n')), register)).toEqual([]);
  });

  it('finds the same however the trip and the clearing wait are written (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 100, max: 280 }), fc.integer({ min: 100, max: 280 }),
        fc.constantFrom('plain', 'not', 'degF'), fc.constantFrom('plain', 'not', 'degF', 'needs'),
        (trip, clearAt, tripForm, clearForm) => {
          const tripText = { plain: `TI-900 >= ${trip} degC`, not: `not (TI-900 < ${trip} degC)`, degF: `TI-900 >= ${inDegF(trip)} degF` }[tripForm];
          const steps = clearForm === 'needs'
            ? reset(`, needs: 'TI-900 <= ${clearAt} degC'`)
            : [cool({ plain: `TI-900 <= ${clearAt} degC`, not: `not (TI-900 > ${clearAt} degC)`, degF: `TI-900 <= ${inDegF(clearAt)} degF` }[clearForm]), reset()].join('\n');
          const errors = found(procedure(steps, { trip: tripText })).filter((d) => d.severity === 'error');
          expect(errors.length).toBe(clearAt >= trip ? 1 : 0);
        },
      ),
      { numRuns: 150 },
    );
  });
});

describe('reset-while-tripped source', () => {
  it('cites the safety-systems clause and marks the reset-after-cause rule as common practice', () => {
    // Source: OSHA 29 CFR 1910.119(f)(1)(iv): safety systems and their functions; resetting only once the cause has
    // cleared: common practice
    expect(rules['reset-while-tripped'].meta.source).toMatch(/1910\.119\(f\)\(1\)\(iv\).*common practice/);
  });
});

describe('reset-while-tripped: trips that share one latch', () => {
  const register = registerOf('reset-while-tripped')!;
  const shared = (clears: string[], reset: string) => `---
id: FX-K210-ESD
title: Reset the K-210 emergency shutdown
kind: emergency-shutdown
revision: 0
status: draft
uses: [TSHH-210, PSHH-210, HS-2190, ESD-210]
steps:
${clears.length ? `  - { step: clear, do: Bring the kettle back, until: '${clears.join(' and ')}', time-limit: { max: 4 h, then: Tell the shift supervisor } }\n` : ''}  - { step: reset, do: Reset the shutdown, resets: [${reset}], confirm: The panel shows no latched trip }
---
`;
  const causes = { 'TSHH-210': 'TI-210 < 240 degC', 'PSHH-210': 'PI-210 < 250 kPaa', 'HS-2190': 'esd-active == false' } as const;
  const judged = (text: string) =>
    checkSources([{ file: 'e.md', text }], { today: '2026-12-01', register }).diagnostics.filter((d) => d.rule === 'reset-while-tripped' || d.rule === 'state-reference-unknown');

  it('judges the reset of one trip against every trip that starts the same latching function', () => {
    const found = judged(shared(['TI-210 < 240 degC'], 'TSHH-210'));
    expect(found.map((d) => d.message.split(',')[0])).toEqual([
      "Step 'reset' resets latching trip PSHH-210 (it resets TSHH-210",
      "Step 'reset' resets latching trip HS-2190 (it resets TSHH-210",
    ]);
  });

  it('lets a step reset the latching function by its own name, judged the same way', () => {
    const found = judged(shared(['TI-210 < 240 degC'], 'ESD-210'));
    expect(found.map((d) => d.rule)).toEqual(['reset-while-tripped', 'reset-while-tripped']);
    expect(judged(shared(Object.values(causes), 'ESD-210'))).toEqual([]);
  });

  it('property: whatever it names, a reset of the shared latch reports exactly the causes not cleared before it', () => {
    const tags = Object.keys(causes) as Array<keyof typeof causes>;
    fc.assert(fc.property(fc.subarray(tags), fc.constantFrom('TSHH-210', 'PSHH-210', 'HS-2190', 'ESD-210'), (cleared, reset) => {
      const found = judged(shared(cleared.map((t) => causes[t]), reset));
      const reported = found.map((d) => /latching trip ([^\s,]+)/.exec(d.message)![1]).sort();
      expect(found.every((d) => d.rule === 'reset-while-tripped' && d.severity === 'error')).toBe(true);
      expect(reported).toEqual(tags.filter((t) => !cleared.includes(t)).sort());
    }), { numRuns: 24 });
  });
});
