import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  checkUnit,
  convert,
  convertDifference,
  formatConverted,
  formatQuantity,
  fromBase,
  isKnownUnit,
  parseDuration,
  parseQuantity,
  sameDimension,
  toBase,
  unitDimension,
} from '../../src/analysis/units.ts';

const required = ['degC', 'degF', 'K', 'Pa', 'kPa', 'MPa', 'bar', 'psi', 'mmHg', 'Torr', 'atm', 'kg', 'g', 'lb', 't', 'L', 'm3', 'USgal', 's', 'min', 'h', 'percent', '%', 'mg/g', 'kg/h', 'L/min', 'm3/h'];

describe('units', () => {
  it.each(required)('knows %s and parses a quantity in it', (unit) => {
    expect(isKnownUnit(unit)).toBe(true);
    expect(parseQuantity(`-2.5 ${unit}`)).toEqual({ ok: true, value: -2.5, unit });
  });

  it('keeps mmHg and Torr apart', () => {
    // Source: NIST SP 811, Appendix B: 1 mmHg (conventional) = 133.322387415 Pa; 1 Torr = 101325/760 Pa.
    expect(toBase(1, 'mmHg')).toBeCloseTo(133.322387415, 9);
    expect(toBase(1, 'Torr')).toBeCloseTo(101325 / 760, 9);
    // Strict spelling: 'torr' is refused with a suggestion rather than read.
    expect(checkUnit('torr')?.hint).toBe('Did you mean Torr?');
    // Source: NIST SP 811, Appendix B: 760 mmHg = 101325.0144 Pa, so not exactly one atmosphere.
    expect(toBase(760, 'mmHg')).toBeCloseTo(101325.0144, 4);
    expect(toBase(760, 'Torr')).toBeCloseTo(101325, 8);
    expect(convert(760, 'mmHg', 'atm')! - 1).toBeGreaterThan(1e-7);
  });

  it('converts pressures exactly', () => {
    // Source: NIST SP 811, Appendix B: 1 psi = 6894.757293 Pa; 1 atm = 101325 Pa = 14.695949 psi; 1 bar = 100000 Pa.
    expect(toBase(1, 'psi')).toBeCloseTo(6894.757293, 6);
    expect(convert(1, 'atm', 'psi')).toBeCloseTo(14.695949, 6);
    expect(toBase(1, 'atm')).toBe(101325);
    expect(toBase(1, 'bar')).toBe(100000);
    expect(convert(2.5, 'MPa', 'kPa')).toBeCloseTo(2500, 9);
  });

  it('converts mass, volume and time', () => {
    // Source: NIST SP 811, Appendix B: lb (avoirdupois) = 0.45359237 kg; gallon (US liquid) = 3.785411784 L.
    expect(convert(1, 'lb', 'kg')).toBeCloseTo(0.45359237, 12);
    expect(convert(1, 'USgal', 'L')).toBeCloseTo(3.785411784, 12);
    expect(convert(1, 't', 'kg')).toBeCloseTo(1000, 9);
    expect(convert(1, 'm3', 'L')).toBeCloseTo(1000, 9);
    expect(convert(2, 'h', 'min')).toBeCloseTo(120, 9);
    expect(convert(600, 'kg/h', 'kg/min')).toBeCloseTo(10, 9);
    expect(convert(3, 'm3/h', 'L/min')).toBeCloseTo(50, 9);
  });

  it('converts temperatures with and without the offset', () => {
    // Source: NIST SP 811, Appendix B: T/K = t/degC + 273.15; t/degC = (t/degF - 32)/1.8; -40 degF = -40 degC.
    expect(convert(-40, 'degF', 'degC')).toBeCloseTo(-40, 9);
    expect(convert(0, 'degC', 'K')).toBeCloseTo(273.15, 9);
    expect(convert(100, 'degC', 'degF')).toBeCloseTo(212, 9);
    expect(toBase(25, 'degC')).toBeCloseTo(298.15, 9);
    // Equal temperatures written in different units must compare equal, not differ in the last bit.
    expect(toBase(100, 'degC')).toBe(toBase(212, 'degF'));
    expect(toBase(-40, 'degC')).toBe(toBase(-40, 'degF'));
    expect(convert(100, 'degC', 'degF')).toBe(212);
    // Source: NIST SP 811, Appendix B: temperature differences convert without the offset; a 10 degC rise is an 18 degF rise.
    expect(convertDifference(10, 'degC', 'degF')).toBeCloseTo(18, 9);
    expect(convertDifference(10, 'K', 'degC')).toBeCloseTo(10, 9);
    expect(convertDifference(18, 'degF', 'K')).toBeCloseTo(10, 9);
    // A rate is a difference per time: no offset, whatever the scale.
    expect(convert(6, 'degC/min', 'K/s')).toBeCloseTo(0.1, 12);
    expect(convert(1, 'degC/min', 'degF/h')).toBeCloseTo(108, 9);
  });

  it('converts there and back within the same dimension', () => {
    const pressures = ['Pa', 'kPa', 'MPa', 'bar', 'psi', 'mmHg', 'Torr', 'atm'];
    const temperatures = ['degC', 'degF', 'K'];
    const pair = fc.oneof(
      fc.tuple(fc.constantFrom(...pressures), fc.constantFrom(...pressures)),
      fc.tuple(fc.constantFrom(...temperatures), fc.constantFrom(...temperatures)),
    );
    fc.assert(
      fc.property(pair, fc.double({ min: -1e5, max: 1e5, noNaN: true }), ([a, b], value) => {
        const there = convert(value, a, b)!;
        expect(Math.abs(convert(there, b, a)! - value)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(value)));
        expect(Math.abs(toBase(there, b)! - toBase(value, a)!)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(toBase(value, a)!)));
      }),
    );
  });

  it('treats percent and mg/g as ratios', () => {
    expect(convert(1, 'mg/g', 'percent')).toBeCloseTo(0.1, 12);
    expect(convert(15, '%', 'mg/g')).toBeCloseTo(150, 9);
    expect(toBase(15, '%')).toBeCloseTo(0.15, 12);
    expect(unitDimension('%')).toBe(unitDimension('mg/g'));
  });

  it('gives one key per physical dimension', () => {
    expect(unitDimension('mmHg')).toBe(unitDimension('psi'));
    expect(unitDimension('degC')).toBe(unitDimension('K'));
    expect(unitDimension('kg/h')).not.toBe(unitDimension('L/min'));
    expect(unitDimension('m3/h')).toBe(unitDimension('L/min'));
    expect(sameDimension('bar', 'Torr')).toBe(true);
    expect(sameDimension('kg', 'L')).toBe(false);
    expect(sameDimension('degc', 'degc')).toBe(false);
    expect(unitDimension('nonsense')).toBeNull();
  });

  it('refuses what is not a unit, with a hint', () => {
    for (const bad of ['', '5', 'kg m', 'degc', 'kdegC', 'furlongs']) {
      expect(isKnownUnit(bad)).toBe(false);
      expect(checkUnit(bad)?.hint).toBeTruthy();
    }
    expect(checkUnit('degc')?.hint).toContain('degC');
    expect(convert(1, 'kg', 'L')).toBeNull();
    expect(convert(1, 'kg', 'nonsense')).toBeNull();
    expect(toBase(1, 'nonsense')).toBeNull();
  });

  it('reads quantities and explains bad ones', () => {
    expect(parseQuantity('238 degC')).toEqual({ ok: true, value: 238, unit: 'degC' });
    expect(parseQuantity('600 kg')).toEqual({ ok: true, value: 600, unit: 'kg' });
    expect(parseQuantity('15%')).toEqual({ ok: true, value: 15, unit: '%' });
    expect(parseQuantity(' 2.5 m3/h ')).toEqual({ ok: true, value: 2.5, unit: 'm3/h' });
    for (const bad of ['600', 'kg', '2,5 kg', '5 lightyears', '']) expect(parseQuantity(bad).ok).toBe(false);
  });

  it('reads expected durations in seconds', () => {
    expect(parseDuration('40 min')).toEqual({ ok: true, min: 2400, max: 2400 });
    expect(parseDuration('30..50 min')).toEqual({ ok: true, min: 1800, max: 3000 });
    expect(parseDuration('2 h')).toEqual({ ok: true, min: 7200, max: 7200 });
    expect(parseDuration('45 min..1.5 h')).toEqual({ ok: true, min: 2700, max: 5400 });
    for (const bad of ['40', '40 kg', '50..30 min', '1..2..3 min', '-5 min', 'soon']) expect(parseDuration(bad).ok).toBe(false);
  });

  it('formats quantities without float noise', () => {
    expect(formatQuantity(0.1 + 0.2, 'kg')).toBe('0.3 kg');
    expect(formatQuantity(convert(1, 'atm', 'psi')!, 'psi')).toBe('14.6959487755 psi');
    expect(formatQuantity(-0, 'degC')).toBe('0 degC');
  });

  it('rounds a converted value for reading, but never level with or across a value it is compared with', () => {
    // Source: NIST SP 811, Appendix B.8: 1 psi = 6.894757 kPa, so 150 psi = 10.342 bar.
    expect(formatConverted(convert(150, 'psi', 'bar')!, 'bar')).toBe('about 10.34 bar');
    expect(formatConverted(convert(150, 'psi', 'bar')!, 'bar', [10.34])).toBe('about 10.342 bar');
    // Source: NIST SP 811, Appendix B.8: 1 atm = 101.325 kPa, exactly (1.01325 bar).
    expect(formatConverted(convert(1, 'atm', 'bar')!, 'bar')).toBe('about 1.013 bar');
    expect(formatConverted(convert(1, 'atm', 'kPa')!, 'kPa')).toBe('about 101.3 kPa');
    // A value just past a limit keeps every digit that shows it is past.
    expect(formatConverted(9.00004, 'barg', [9])).toBe('9.00004 barg');
    expect(formatConverted(8.99996, 'barg', [5, 9])).toBe('8.99996 barg');
    expect(formatConverted(9.000412, 'barg', [9])).toBe('about 9.0004 barg');
    expect(formatConverted(Number.NaN, 'barg')).toBe('NaN barg');
  });

  it('a rounded converted value stays on the same side of every value it is compared with', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { maxLength: 3 }),
        (value, against) => {
          const shown = formatConverted(value, 'kPa', against);
          const m = /^(about )?(\S+) kPa$/.exec(shown);
          expect(m).not.toBeNull();
          const read = Number(m![2]);
          const exact = Number(value.toPrecision(12));
          // "about" exactly when the figure is rounded.
          expect(Boolean(m![1])).toBe(read !== exact);
          for (const n of against) expect(Math.sign(read - n)).toBe(Math.sign(exact - n));
        },
      ),
      { numRuns: 500 },
    );
  });

  it('fromBase undoes toBase for every unit', () => {
    fc.assert(
      fc.property(fc.constantFrom(...required), fc.double({ min: -1e6, max: 1e6, noNaN: true }), (unit, value) => {
        const back = fromBase(toBase(value, unit)!, unit)!;
        expect(Math.abs(back - value)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(value)));
      }),
    );
  });

  it('never throws on arbitrary text', () => {
    fc.assert(
      fc.property(fc.string(), (text) => {
        isKnownUnit(text);
        unitDimension(text);
        parseQuantity(text);
        parseDuration(text);
        convert(1, text, 'kg');
      }),
    );
  });
});
