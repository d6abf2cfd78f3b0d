// A bad command line or a bad setting the user must fix; the CLI turns it into a message and exit code 2.
export class UsageError extends Error {
  override name = 'UsageError';
}
