// The cache a command uses: .stepwright/cache/ under the working folder, unless STEPWRIGHT_CACHE=off (or a folder).
import { stepwrightStamp } from '../check/code-stamp.ts';
import { openResultCache, type ResultCache } from '../check/result-cache.ts';
import { resultCacheFolder } from './cache-folder.ts';

export function commandCache(io: { cwd: string; env: Record<string, string | undefined> }, configText: string | undefined): { store: ResultCache; salt: string; code: string } | undefined {
  const dir = resultCacheFolder(io);
  if (dir === undefined) return undefined;
  const code = stepwrightStamp(dir);
  return { store: openResultCache(dir), salt: `${code}\u0000${configText ?? ''}`, code };
}
