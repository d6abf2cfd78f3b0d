// A calendar date written YYYY-MM-DD, as the front-matter writes its dates (and STEPWRIGHT_TODAY gives one).
export const isoDatePattern = /^\d{4}-\d{2}-\d{2}$/;

/** Whether a text is a calendar date written YYYY-MM-DD (2026-02-30 is not). */
export function isCalendarDate(text: string): boolean {
  if (!isoDatePattern.test(text)) return false;
  const time = Date.parse(`${text}T00:00:00Z`);
  return !Number.isNaN(time) && new Date(time).toISOString().startsWith(text);
}
