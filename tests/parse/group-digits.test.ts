// Counts in messages: digits grouped in threes with commas, exactly as the locale data formats them.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { groupDigits } from '../../src/parse/group-digits.ts';

describe('groupDigits', () => {
  it('groups whole numbers in threes', () => {
    expect(groupDigits(0)).toBe('0');
    expect(groupDigits(999)).toBe('999');
    expect(groupDigits(1000)).toBe('1,000');
    expect(groupDigits(50_000)).toBe('50,000');
    expect(groupDigits(-1_234_567)).toBe('-1,234,567');
  });

  it('gives the same text as the locale data for any whole number (property)', () => {
    // Source: Unicode CLDR, English (United Kingdom) decimal format "#,##0.###", as Node's ICU applies it.
    fc.assert(fc.property(fc.oneof(fc.integer(), fc.maxSafeInteger(), fc.constantFrom(Number.MAX_SAFE_INTEGER, -Number.MAX_SAFE_INTEGER, 1e15)), (n) => {
      expect(groupDigits(n)).toBe(n.toLocaleString('en-GB'));
    }), { numRuns: 2000 });
  });

  it('leaves numbers that are not whole to the locale data', () => {
    expect(groupDigits(1234.5)).toBe((1234.5).toLocaleString('en-GB'));
    expect(groupDigits(1e21)).toBe((1e21).toLocaleString('en-GB'));
  });
});
