// STEPWRIGHT_TODAY: the date a command judges dates by instead of the clock or the last commit. A value that is not a
// calendar date is refused with a message, never passed over: a check that quietly used the clock instead would
// judge review and effective dates by another day than the one the user asked for.
import { UsageError } from './usage-error.ts';
import { isCalendarDate, isoDatePattern } from '../model/calendar-date.ts';

export { isCalendarDate };

/**
 * The date STEPWRIGHT_TODAY fixes (spaces around it allowed), or undefined when it is unset or empty. Throws a
 * UsageError for anything else.
 */
export function fixedToday(env: Record<string, string | undefined>): string | undefined {
  const raw = env.STEPWRIGHT_TODAY;
  if (raw === undefined || raw.trim() === '') return undefined;
  const value = raw.trim();
  if (isCalendarDate(value)) return value;
  const why = isoDatePattern.test(value)
    ? 'which is not a day of the calendar'
    : /^\d{4}-\d{1,2}-\d{1,2}$/.test(value)
      ? 'which needs two digits for the month and the day'
      : 'which is not a date written YYYY-MM-DD';
  throw new UsageError(`STEPWRIGHT_TODAY is '${raw}', ${why} (such as 2026-12-05). Set it to the date dates should be judged by, or unset it to use the clock (check, review) or the last commit (build).`);
}
