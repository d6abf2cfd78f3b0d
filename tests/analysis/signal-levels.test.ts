// The order of the levels on one signal: operating limit < alarm < trip < relief set pressure on the high side,
// mirrored on the low side, all inside the instrument's range; units converted exactly, gauge and absolute apart.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { levelOf, levelsOutOfOrder, levelsOutsideRange, tripLevels, type Level, type LevelKind, type Side } from '../../src/analysis/signal-levels.ts';

const at = { file: 'register/plant.yaml', path: ['signals', 'X'], inRegister: true };
const level = (kind: LevelKind, side: Side, text: string, unit?: string): Level => {
  const made = levelOf(kind, side, 'X', text, at, unit);
  if (!made) throw new Error(`not a level: ${text}`);
  return made;
};

// Source: NIST SP 811, section 4.2.1.1 and Appendix B.8: T/K = t/degC + 273.15; T/K = (t/degF + 459.67) / 1.8.
const kelvin: Record<string, (v: number) => number> = { degC: (v) => v + 273.15, degF: (v) => (v + 459.67) / 1.8, K: (v) => v };
// Source: NIST SP 811, Appendix B.8: standard atmosphere = 101.325 kPa; gauge pressure = absolute - atmosphere.
const kPaAbsolute: Record<string, (v: number) => number> = { kPaa: (v) => v, kPag: (v) => v + 101.325, barg: (v) => v * 100 + 101.325, bara: (v) => v * 100 };

const temperature = fc.record({ value: fc.integer({ min: -200, max: 1500 }), unit: fc.constantFrom('degC', 'degF', 'K') });
const pressure = fc.record({ value: fc.integer({ min: -50, max: 3000 }), unit: fc.constantFrom('kPaa', 'kPag', 'barg', 'bara') });

describe('levels out of order', () => {
  it('reports a high limit exactly when it is at or above the high trip, in any temperature units', () => {
    fc.assert(fc.property(temperature, temperature, (limit, trip) => {
      const found = levelsOutOfOrder([level('limit', 'high', `${limit.value} ${limit.unit}`, 'degC'), level('trip', 'high', `${trip.value} ${trip.unit}`, 'degC')], ['trip']);
      const a = kelvin[limit.unit](limit.value);
      const b = kelvin[trip.unit](trip.value);
      // Values a rounding step apart are left out of the comparison: the reference and the code may round differently.
      fc.pre(Math.abs(a - b) > 1e-9);
      expect(found.length).toBe(a >= b ? 1 : 0);
    }));
  });

  it('reports a low limit exactly when it is at or below the low trip', () => {
    // Source: common practice: a low operating limit stays above the low trip (the mirror of the high side).
    fc.assert(fc.property(temperature, temperature, (limit, trip) => {
      const a = kelvin[limit.unit](limit.value);
      const b = kelvin[trip.unit](trip.value);
      fc.pre(Math.abs(a - b) > 1e-9);
      const found = levelsOutOfOrder([level('limit', 'low', `${limit.value} ${limit.unit}`), level('trip', 'low', `${trip.value} ${trip.unit}`)], ['trip']);
      expect(found.length).toBe(a <= b ? 1 : 0);
    }));
  });

  it('compares gauge and absolute pressure through the standard atmosphere', () => {
    fc.assert(fc.property(pressure, pressure, (limit, relief) => {
      const a = kPaAbsolute[limit.unit](limit.value);
      const b = kPaAbsolute[relief.unit](relief.value);
      fc.pre(Math.abs(a - b) > 1e-6);
      const found = levelsOutOfOrder([level('limit', 'high', `${limit.value} ${limit.unit}`), level('relief', 'high', `${relief.value} ${relief.unit}`)], ['relief']);
      expect(found.length).toBe(a >= b ? 1 : 0);
    }));
  });

  it('a gauge trip 1 kPa above an absolute limit in gauge terms is in order; read as absolute it would not be', () => {
    // 300 kPag = 401.325 kPaa: a 400 kPaa limit lies below it, a 402 kPaa limit above it.
    expect(levelsOutOfOrder([level('limit', 'high', '400 kPaa'), level('trip', 'high', '300 kPag')], ['trip'])).toHaveLength(0);
    expect(levelsOutOfOrder([level('limit', 'high', '402 kPaa'), level('trip', 'high', '300 kPag')], ['trip'])).toHaveLength(1);
  });

  it('a strictly rising chain limit < alarm < trip < relief is in order, and lifting an earlier level to a trip or relief breaks it', () => {
    // Source: common practice, and IEC 61511-1 / ISA-84 layers of protection: operating limit, alarm, trip, relief.
    const kinds: LevelKind[] = ['limit', 'alarm', 'trip', 'relief'];
    fc.assert(fc.property(fc.uniqueArray(fc.integer({ min: 0, max: 2000 }), { minLength: 4, maxLength: 4 }), fc.integer({ min: 0, max: 2 }), fc.integer({ min: 1, max: 3 }), (values, low, rise) => {
      const sorted = [...values].sort((a, b) => a - b);
      const chain = kinds.map((k, i) => level(k, 'high', `${sorted[i]} kPag`));
      expect(levelsOutOfOrder(chain, ['trip', 'relief'])).toHaveLength(0);
      // Only trips and relief set pressures are judged: an alarm at the operating limit is usual.
      const high = Math.min(3, Math.max(2, low + rise));
      fc.pre(high > low);
      const broken = chain.map((l, i) => (i === low ? level(kinds[i], 'high', `${sorted[high]} kPag`) : l));
      expect(levelsOutOfOrder(broken, ['trip', 'relief']).length).toBeGreaterThan(0);
    }));
  });

  it('does not depend on the order the levels are listed in', () => {
    fc.assert(fc.property(fc.array(fc.record({ kind: fc.constantFrom<LevelKind>('limit', 'alarm', 'trip', 'relief'), side: fc.constantFrom<Side>('low', 'high'), v: fc.integer({ min: 0, max: 50 }) }), { maxLength: 8 }), (specs) => {
      const levels = specs.map((s) => level(s.kind, s.kind === 'relief' ? 'high' : s.side, `${s.v} barg`));
      const key = (ls: Level[]) => levelsOutOfOrder(ls, ['trip', 'relief']).map((p) => `${p.level.kind}${p.level.side}${p.level.text}>${p.against?.kind}${p.against?.text}`).sort();
      expect(key([...levels].reverse())).toEqual(key(levels));
    }));
  });
});

describe('levels outside the range', () => {
  it('reports a level exactly when it lies outside the range, whichever unit each is written in', () => {
    fc.assert(fc.property(temperature, fc.integer({ min: -100, max: 400 }), fc.integer({ min: -100, max: 400 }), fc.boolean(), (value, a, b, backwards) => {
      const low = Math.min(a, b);
      const high = Math.max(a, b);
      const k = kelvin[value.unit](value.value);
      fc.pre(Math.abs(k - kelvin.degC(low)) > 1e-9 && Math.abs(k - kelvin.degC(high)) > 1e-9);
      const found = levelsOutsideRange([level('limit', 'high', `${value.value} ${value.unit}`)], backwards ? [high, low] : [low, high], 'degC');
      expect(found.length).toBe(k < kelvin.degC(low) || k > kelvin.degC(high) ? 1 : 0);
    }));
  });

  it('keeps the range ends inside', () => {
    expect(levelsOutsideRange([level('limit', 'low', '0 degC'), level('trip', 'high', '300 degC')], [0, 300], 'degC')).toHaveLength(0);
    // 572 degF = 300 degC exactly. Source: NIST SP 811, Appendix B.8 (t/degC = (t/degF - 32) / 1.8).
    expect(levelsOutsideRange([level('trip', 'high', '572 degF')], [0, 300], 'degC')).toHaveLength(0);
    expect(levelsOutsideRange([level('trip', 'high', '573 degF')], [0, 300], 'degC')).toHaveLength(1);
  });
});

describe('trip thresholds', () => {
  const signals = {
    'TI-210': { unit: 'degC', range: [0, 300] as [number, number] },
    'PI-210': { unit: 'kPag', range: [0, 600] as [number, number] },
    burner: { values: ['on', 'off'] },
  };
  const read = (condition: string) => {
    const r = tripLevels(condition, signals, at, 'T-1');
    return r.ok ? r.levels.map((l) => ({ signal: l.signal, side: l.side, text: l.text, ...(l.band ? { band: true } : {}) })) : r.reason;
  };

  it('reads the values at which a trip acts on one signal, however the condition is written', () => {
    expect(read('TI-210 >= 255 degC')).toEqual([{ signal: 'TI-210', side: 'high', text: '255 degC' }]);
    expect(read('PI-210 > 250 kPag or PI-210 < 5 kPag')).toEqual([
      { signal: 'PI-210', side: 'low', text: '5 kPag' }, { signal: 'PI-210', side: 'high', text: '250 kPag' },
    ]);
    expect(read('not (TI-210 < 255 degC)')).toEqual([{ signal: 'TI-210', side: 'high', text: '255 degC' }]);
    expect(read('not (TI-210 >= 15 degC)')).toEqual([{ signal: 'TI-210', side: 'low', text: '15 degC' }]);
    // A band: 356 degF is 180 degC exactly. Source: NIST SP 811, Appendix B.8 (t/degC = (t/degF - 32) / 1.8).
    expect(read('TI-210 >= 356 degF and TI-210 <= 300 degC')).toEqual([{ signal: 'TI-210', side: 'high', text: '356 degF', band: true }]);
    expect(read('TI-210 >= 255 degC or burner == off')).toEqual([{ signal: 'TI-210', side: 'high', text: '255 degC' }]);
  });

  it('gives no level on a signal the trip acts on only together with another condition', () => {
    expect(read('PI-210 >= 250 kPag and burner == on')).toEqual([]);
  });

  it('says why a condition could not be read as values', () => {
    expect(read('TI-210 >=')).toBe('the condition does not parse');
    expect(read('TI-999 >= 5 degC')).toMatch(/not declared/);
    expect(read('TI-210 >= 5 kPag')).toMatch(/cannot be compared/);
  });

  it('gives no level for a quantity of another kind than the signal', () => {
    expect(levelOf('limit', 'high', 'TI-210', '250 kPag', at, 'degC')).toBeNull();
    expect(levelOf('limit', 'high', 'TI-210', '250 C', at, 'degC')).toBeNull();
  });
});
