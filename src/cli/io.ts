// What a command may touch of the outside world; tests pass their own.
import { fixedToday } from '../engine/fixed-date.ts';
export interface OutputStream {
  write(text: string): unknown;
  isTTY?: boolean;
}

export interface CliIo {
  stdout: OutputStream;
  stderr: OutputStream;
  cwd: string;
  env: Record<string, string | undefined>;
  /** Standard input, read whole (for the path '-'); tests pass their own. */
  stdin?: () => Promise<string>;
  /** The clock; tests fix it. */
  now?: () => Date;
}

export function todayOf(io: CliIo): string {
  const fixed = fixedToday(io.env);
  if (fixed) return fixed;
  return (io.now?.() ?? new Date()).toISOString().slice(0, 10);
}

export function useColour(io: CliIo, stream: OutputStream): boolean {
  if (io.env.NO_COLOR !== undefined && io.env.NO_COLOR !== '') return false;
  if (io.env.FORCE_COLOR && io.env.FORCE_COLOR !== '0') return true;
  return stream.isTTY === true;
}

/** Thrown for bad command lines; main turns it into a message and exit code 2. */
export { isUsageError, UsageError } from '../engine/usage-error.ts';
