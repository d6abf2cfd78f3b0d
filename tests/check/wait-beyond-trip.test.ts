// wait-beyond-trip judges a step's `until` by the values that end it, however the condition is written.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';

const procedure = (kind: string, until: string, trip = 'TI-900 >= 200 degC', high = '180 degC') => `---
id: FX-R900-001
title: Heat reactor R-900
kind: ${kind}
revision: 0
status: draft
signals:
  TI-900: { text: Reactor temperature, unit: degC, range: [0, 300] }
limits:
  TI-900: { high: ${high}, consequence: The product degrades, correction: Cut the steam }
interlocks:
  - tag: TSHH-900
    trips-when: ${trip}
    action: Closes steam valve XV-901
steps:
  - step: heat
    do: Heat the reactor
    until: ${until}
---
`;
const found = (text: string) => checkSources([{ file: 'r.md', text }], { today: '2026-12-01' }).diagnostics.filter((d) => d.rule === 'wait-beyond-trip');
// Source: NIST SP 811, Appendix B.9: t/degF = 1.8 t/degC + 32.
const inDegF = (c: number) => Number((c * 1.8 + 32).toFixed(6));

describe('wait-beyond-trip', () => {
  it('reports a wait that can only end at the trip (the reviewer\'s case), not one clear of it', () => {
    const [d] = found(procedure('batch', 'TI-900 >= 210 degC'));
    expect(d.severity).toBe('error');
    expect(d.message).toBe("Step 'heat' waits until TI-900 >= 210 degC, and at every value of TI-900 that ends it interlock TSHH-900 trips (TI-900 >= 200 degC): the step can only end with the plant tripped.");
    expect(found(procedure('batch', 'TI-900 >= 170 degC'))).toEqual([]);
    // Between the high limit and the trip: out of limits, a warning.
    const [w] = found(procedure('batch', 'TI-900 >= 190 degC'));
    expect(w.severity).toBe('warning');
    expect(w.message).toContain('above its high operating limit 180 degC');
  });

  it('finds the same however the wait and the trip are written (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 100, max: 280 }), fc.integer({ min: 100, max: 280 }), fc.constantFrom('plain', 'not', 'degF', 'and-time'), fc.constantFrom('plain', 'not', 'degF'), (wait, trip, waitForm, tripForm) => {
        const untilText = { plain: `TI-900 >= ${wait} degC`, not: `not (TI-900 < ${wait} degC)`, degF: `TI-900 >= ${inDegF(wait)} degF`, 'and-time': `TI-900 >= ${wait} degC and elapsed >= 5 min` }[waitForm];
        const tripText = { plain: `TI-900 >= ${trip} degC`, not: `not (TI-900 < ${trip} degC)`, degF: `TI-900 >= ${inDegF(trip)} degF` }[tripForm];
        const errors = found(procedure('batch', untilText, tripText, '290 degC')).filter((d) => d.severity === 'error');
        expect(errors.length).toBe(wait >= trip ? 1 : 0);
      }),
      { numRuns: 150 },
    );
  });

  it('leaves a stopping procedure\'s wait for a signal to fall, and reports it elsewhere', () => {
    const low = (kind: string) => procedure(kind, 'TI-900 <= 20 degC', 'TI-900 <= 40 degC', '280 degC');
    expect(found(low('shutdown'))).toEqual([]);
    expect(found(low('emergency'))).toEqual([]);
    expect(found(low('batch'))).toHaveLength(1);
    // A rising wait beyond a high trip is reported in a shutdown too.
    expect(found(procedure('shutdown', 'TI-900 >= 210 degC'))).toHaveLength(1);
  });

  it('says so when a wait on a tripped signal is too large to work out, instead of passing it over', () => {
    // Ten groups of three alternatives over thirty pressures: more cases than the value analysis takes.
    const pressures = Array.from({ length: 30 }, (_, i) => `  PI-${i}: { text: Pressure ${i}, unit: barg, range: [0, 10] }`).join('\n');
    const groups = Array.from({ length: 10 }, (_, i) => `(PI-${3 * i} > 1 barg or PI-${3 * i + 1} > 2 barg or PI-${3 * i + 2} < 3 barg)`).join(' and ');
    const text = procedure('batch', `TI-900 >= 210 degC and ${groups}`).replace('signals:\n', `signals:\n${pressures}\n`);
    const [d, ...more] = found(text);
    expect(more).toEqual([]);
    expect(d.severity).toBe('info');
    expect(d.message).toMatch(/^The values at which step 'heat' can end \(until TI-900 >= 210 degC and .*\) could not be worked out \(too many cases\), so they were not compared with the trips and high limits on TI-900\.$/);
    // The same wait on signals without trips or limits is not reported at all.
    expect(found(text.replace(/^interlocks:[\s\S]*?(?=^steps:)/m, '').replace(/^limits:\n.*\n/m, ''))).toEqual([]);
  });
});
