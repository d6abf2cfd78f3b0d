// A plant-register safety function's outputs act as held outputs of a latched trip, mapped onto the procedure's
// enumerated signals; outputs that cannot be mapped are said (info), never skipped in silence.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { heldOutputs } from '../../src/model/apply-register.ts';
import type { Signal } from '../../src/model/procedure.ts';
import { registerOf } from './rule-fixture-folders.ts';

const register = registerOf('latched-trip-holds-output')!;
const esd = register.safetyFunctions.get('ESD-210')!;
const tshh = register.safetyFunctions.get('TSHH-210')!;

const procedure = (signals: string, steps: string, uses = 'TSHH-210') => `---
id: FX-HELD-001
title: Test the K-210 trips
kind: normal
revision: 0
status: draft
uses: [${uses}]
signals:
${signals}
line-up: [TI-210 <= 60 degC]
steps:
  - { step: test-trip, do: Trip ${uses} with a test signal, trips: [${uses}], confirm: The panel shows the trip }
${steps}
  - { step: reset, do: Reset the trip at the panel, resets: [${uses}], confirm: The panel shows no latched trip }
---
`;
const found = (text: string) =>
  checkSources([{ file: 'h.md', text }], { today: '2026-12-01', register }).diagnostics.filter((d) => d.rule === 'latched-trip-holds-output');

describe('register safety functions hold their outputs while latched', () => {
  it('takes the outputs of the function a trip starts (ESD-210 closes XV-2101 and opens XV-2109)', () => {
    const signals = '  XV-2101: { text: Hot-oil valve, values: [open, closed] }\n  XV-2109: { text: Drown valve, values: [open, closed] }';
    const errors = found(procedure(signals, '  - { step: open-hot, do: Open XV-2101, state: { XV-2101: open } }')).filter((d) => d.severity === 'error');
    expect(errors.map((d) => d.message)).toEqual([
      "Step 'open-hot' sets XV-2101 open, but latched trip TSHH-210 may be in force there and holds XV-2101 closed. Path: test-trip → open-hot.",
    ]);
    // Opening the drown valve is what the shutdown does: no conflict.
    expect(found(procedure(signals, '  - { step: open-drown, do: Open XV-2109, state: { XV-2109: open } }')).filter((d) => d.severity === 'error')).toEqual([]);
  });

  it('maps the state onto the signal\'s own value word (shut for closed, off for stopped)', () => {
    const out = heldOutputs(tshh, register, {
      'XV-2101': signal(['open', 'shut']),
      'XV-2109': signal(['open', 'closed']),
    }, ['uses', 0]);
    expect(out.holds.map((h) => `${h.signal}=${h.value}`)).toEqual(['XV-2101=shut', 'XV-2109=open']);
    expect(out.unheld.every((u) => u.via === 'ESD-210' && u.why === 'not-declared')).toBe(true);
  });

  it('says which outputs were not checked, and why, once per started function', () => {
    const signals = '  XV-2101: { text: Hot-oil valve, values: [passing, blocked] }\n  XV-2109: { text: Drown valve }';
    const infos = found(procedure(signals, '')).filter((d) => d.severity === 'info');
    expect(infos).toHaveLength(1);
    expect(infos[0].message).toMatch(/^While TSHH-210 is latched \(through ESD-210\), the plant register says it holds outputs that were not checked/);
    expect(infos[0].message).toContain('XV-2101 (closed: a signal with no value for that state)');
    expect(infos[0].message).toContain('XV-2109 (open: a signal without declared values)');
    expect(infos[0].message).toContain('FV-211');
  });

  it('says nothing of outputs when the trip can never be latched (not tripped, not an emergency procedure)', () => {
    const text = procedure('  XV-2101: { text: Hot-oil valve, values: [open, closed] }', '').replace(/ {2}- \{ step: test-trip.*\n/, '');
    expect(found(text)).toEqual([]);
  });

  it('property: every output of the function and of the one it starts is held or said, never both, never lost', () => {
    const outputs = [...new Set([...esd.closes, ...esd.opens, ...esd.stops])];
    const words = [['open', 'closed'], ['open', 'shut'], ['passing', 'blocked'], []];
    fc.assert(fc.property(fc.array(fc.tuple(fc.constantFrom(...outputs), fc.nat(words.length - 1)), { maxLength: 10 }), (declared) => {
      const signals: Record<string, Signal> = {};
      for (const [tag, w] of declared) signals[tag] = signal(words[w]);
      const out = heldOutputs(tshh, register, signals, ['uses', 0]);
      const held = out.holds.map((h) => h.signal);
      const said = out.unheld.map((u) => u.signal);
      expect(new Set([...held, ...said])).toEqual(new Set(outputs));
      expect(held.filter((t) => said.includes(t))).toEqual([]);
      for (const h of out.holds) expect(signals[h.signal].values).toContain(h.value);
      for (const u of out.unheld) if (!signals[u.signal]) expect(u.why).toBe('not-declared');
    }));
  });
});

function signal(values: string[]): Signal {
  return { name: 'x', text: 'x', path: [], ...(values.length ? { values } : {}) } as Signal;
}
