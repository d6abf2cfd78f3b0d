// Where a command keeps its result cache: .stepwright/cache/ under the working folder, the folder STEPWRIGHT_CACHE
// names, or none when STEPWRIGHT_CACHE=off (or 0). Light on purpose: the command line asks it before it loads
// the checker.
import { readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';

export function resultCacheFolder(io: { cwd: string; env: Record<string, string | undefined> }): string | undefined {
  const setting = io.env.STEPWRIGHT_CACHE?.trim();
  if (setting === 'off' || setting === '0') return undefined;
  return setting ? resolve(io.cwd, setting) : join(io.cwd, '.stepwright', 'cache');
}

/** Whether the command's result cache holds anything at all (whether it answers for these files is not asked here). */
export function resultCacheHoldsEntries(io: { cwd: string; env: Record<string, string | undefined> }): boolean {
  const dir = resultCacheFolder(io);
  if (dir === undefined) return false;
  try {
    return readdirSync(dir).length > 0;
  } catch {
    return false;
  }
}
