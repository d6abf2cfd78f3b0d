// STEPWRIGHT_TODAY is taken only as a calendar date; anything else stops the command with a message instead of
// being passed over for the clock.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fixedToday, isCalendarDate } from '../../src/engine/fixed-date.ts';
import { UsageError } from '../../src/engine/usage-error.ts';
import { runCli } from '../cli/run-cli.ts';
import { main } from '../../src/cli/main.ts';

describe('STEPWRIGHT_TODAY', () => {
  it('is a calendar date or nothing', () => {
    expect(fixedToday({})).toBeUndefined();
    expect(fixedToday({ STEPWRIGHT_TODAY: '' })).toBeUndefined();
    expect(fixedToday({ STEPWRIGHT_TODAY: '  ' })).toBeUndefined();
    expect(fixedToday({ STEPWRIGHT_TODAY: '2026-12-05' })).toBe('2026-12-05');
    expect(fixedToday({ STEPWRIGHT_TODAY: ' 2026-12-05\n' })).toBe('2026-12-05');
    // Source: ISO 8601-1:2019, 5.2.2 (calendar date, extended format YYYY-MM-DD); Gregorian leap years (common practice).
    expect(fixedToday({ STEPWRIGHT_TODAY: '2028-02-29' })).toBe('2028-02-29');
    expect(isCalendarDate('2000-02-29')).toBe(true);
    expect(isCalendarDate('1900-02-29')).toBe(false);
    for (const [value, why] of [
      ['2030-1-1', /needs two digits for the month and the day/],
      ['01.01.2030', /not a date written YYYY-MM-DD/],
      ['2026-13-01', /not a day of the calendar/],
      ['2030-02-30', /not a day of the calendar/],
      ['2027-02-29', /not a day of the calendar/],
      ['tomorrow', /not a date written YYYY-MM-DD/],
    ] as const) {
      expect(() => fixedToday({ STEPWRIGHT_TODAY: value }), value).toThrow(UsageError);
      expect(() => fixedToday({ STEPWRIGHT_TODAY: value }), value).toThrow(why);
    }
  });

  it('agrees with the calendar on every day (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1000, max: 9999 }), fc.integer({ min: 0, max: 13 }), fc.integer({ min: 0, max: 32 }), (y, m, d) => {
        const text = `${y}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`;
        const real = new Date(Date.UTC(y, m - 1, d)).toISOString().slice(0, 10) === text;
        expect(isCalendarDate(text)).toBe(real);
      }),
      { numRuns: 1000 },
    );
  });

  it('stops check with exit 2 and the message, instead of judging by the clock', async () => {
    let stderr = '';
    const code = await main(['check', 'procedures', '--quiet'], {
      stdout: { write: () => true }, stderr: { write: (t: string) => (stderr += t) }, cwd: process.cwd(), env: { STEPWRIGHT_TODAY: '2030-1-1' },
    });
    expect(code).toBe(2);
    expect(stderr).toContain("STEPWRIGHT_TODAY is '2030-1-1', which needs two digits for the month and the day");
    // A valid date still checks as before.
    expect((await runCli(['check', 'procedures', '--quiet'])).code).not.toBe(2);
  });
});
