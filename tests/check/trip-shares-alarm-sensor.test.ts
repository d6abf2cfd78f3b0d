// The measurement an alarm and a trip share: the same signal, or the same measured variable and loop (ISA-5.1).
import { describe, expect, it } from 'vitest';
import { sameMeasurement } from '../../src/check/rules/trip-shares-alarm-sensor.ts';

describe('sameMeasurement', () => {
  it('joins tags of one loop and keeps other loops apart', () => {
    // Source: ISA-5.1 identification: first letter = measured variable, loop number (with suffix) = one loop
    expect(sameMeasurement('LI-230B', 'LI-230B')).toBe(true);
    expect(sameMeasurement('LI-230B', 'LT-230B')).toBe(true);
    expect(sameMeasurement('LI-230B', 'LSHH-230B')).toBe(true);
    expect(sameMeasurement('LI-230B', 'LI-230A')).toBe(false);
    expect(sameMeasurement('LI-230B', 'LS-230')).toBe(false);
    expect(sameMeasurement('LI-230', 'TI-230')).toBe(false);
    expect(sameMeasurement('bypass-active', 'LI-230')).toBe(false);
  });
});
