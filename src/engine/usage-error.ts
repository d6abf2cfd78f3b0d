// A bad command line or a bad setting the user must fix; the CLI turns it into a message and exit code 2.
// The installed package bundles a command's modules into one file each, so a command can throw a UsageError of its
// own copy of this class: the mark below, shared by every copy, is what tells one apart (isUsageError).
const mark = Symbol.for('stepwright.usage-error');

export class UsageError extends Error {
  override name = 'UsageError';
  readonly [mark] = true;
}

/** Whether an error is a UsageError of any copy of this module. */
export function isUsageError(error: unknown): error is UsageError {
  return typeof error === 'object' && error !== null && (error as Record<symbol, unknown>)[mark] === true;
}
