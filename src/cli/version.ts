// The version printed by --version and written into reports: read from the package's own package.json.
import { readFileSync } from 'node:fs';

let cached: string | undefined;

export function packageVersion(): string {
  if (cached) return cached;
  // Two folders up from this module in the sources (src/cli) and in the compiled package (dist/cli).
  for (const candidate of ['../../package.json', '../package.json']) {
    try {
      const pkg = JSON.parse(readFileSync(new URL(candidate, import.meta.url), 'utf8')) as { name?: string; version?: string };
      if (pkg.name === 'stepwright' && pkg.version) return (cached = pkg.version);
    } catch {
      // Try the next place.
    }
  }
  return (cached = 'unknown');
}
