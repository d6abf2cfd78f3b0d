// The cache a command uses: .stepwright/cache/ under the working folder, unless STEPWRIGHT_CACHE=off (or a folder).
import { join, resolve } from 'node:path';
import { openResultCache, stepwrightStamp, type ResultCache } from '../check/result-cache.ts';

export function commandCache(io: { cwd: string; env: Record<string, string | undefined> }, configText: string | undefined): { store: ResultCache; salt: string } | undefined {
  const setting = io.env.STEPWRIGHT_CACHE?.trim();
  if (setting === 'off' || setting === '0') return undefined;
  const dir = setting ? resolve(io.cwd, setting) : join(io.cwd, '.stepwright', 'cache');
  return { store: openResultCache(dir), salt: `${stepwrightStamp()}\u0000${configText ?? ''}` };
}
