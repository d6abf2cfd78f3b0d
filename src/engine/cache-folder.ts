// Where a command keeps its result cache: .stepwright/cache/ under the working folder, the folder STEPWRIGHT_CACHE
// names, or none when STEPWRIGHT_CACHE=off (or 0). Light on purpose: the command line asks it before it loads
// the checker.
import { join, resolve } from 'node:path';

export function resultCacheFolder(io: { cwd: string; env: Record<string, string | undefined> }): string | undefined {
  const setting = io.env.STEPWRIGHT_CACHE?.trim();
  if (setting === 'off' || setting === '0') return undefined;
  return setting ? resolve(io.cwd, setting) : join(io.cwd, '.stepwright', 'cache');
}
