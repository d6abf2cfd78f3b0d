// Loads mathjs for the unit conversions, on first use. The library's package entry loads some 1,400 module
// files (about a second at every start of `stepwright check`); its single-file build (lib/browser/math.js, the
// same version and code, shipped in the same package) loads in a tenth of that. That file exports one ready
// instance with the default configuration: only this module loads it, so the instance is ours to extend
// (units.ts adds units). When the file is missing, a private instance is made from the package entry instead:
// same results, slower start.
import { dirname, join } from 'node:path';
import type { MathJsInstance } from 'mathjs';
import { dependencyRequire } from './load-dependency.ts';

type MathjsPackage = Pick<typeof import('mathjs'), 'all' | 'create'>;

export function loadMathjs(): MathJsInstance {
  // The package's `require` entry is lib/cjs/index.js; the single-file build sits in lib/browser/.
  const { require, entry } = dependencyRequire('mathjs');
  try {
    const bundle = require(join(dirname(entry), '..', 'browser', 'math.js')) as Partial<MathJsInstance>;
    if (typeof bundle.unit === 'function' && typeof bundle.createUnit === 'function') return bundle as MathJsInstance;
  } catch {
    // fall through to the package entry
  }
  const { all, create } = require(entry) as MathjsPackage;
  return create(all, {});
}
