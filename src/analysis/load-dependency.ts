// Loads a dependency on first use, synchronously, for modules that would rather not pay for it at start-up.
// It is looked up from this module's own folder; when a bundler has moved this module away from the package
// (the site's pages are bundled into the output folder), from the running command's own location, then from the
// working folder. If none finds it, the error says so: a missing library is never taken for "no result".
import { createRequire } from 'node:module';
import { realpathSync } from 'node:fs';
import { join } from 'node:path';

export function dependencyRequire(name: string): { require: NodeJS.Require; entry: string } {
  const anchors: string[] = [import.meta.url];
  try {
    if (process.argv[1]) anchors.push(realpathSync(process.argv[1]));
  } catch {
    // no script path to start from
  }
  anchors.push(join(process.cwd(), 'package.json'));
  const failures: string[] = [];
  for (const anchor of anchors) {
    try {
      const require = createRequire(anchor);
      return { require, entry: require.resolve(name) };
    } catch (error) {
      failures.push(`from ${anchor}: ${(error as Error).message.split('\n')[0]}`);
    }
  }
  throw new Error(`Stepwright could not load the library '${name}' (${failures.join('; ')}). Reinstall Stepwright's dependencies.`);
}
