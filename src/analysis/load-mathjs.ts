// Loads mathjs for the unit conversions, on first use. The installed package carries, next to its compiled code,
// the part of mathjs the units use (lib/analysis/mathjs-units.cjs, written by scripts/mathjs-units.mjs at packing
// from the same mathjs: its own `create` with `unitDependencies` and `createUnitDependencies`); it loads in about
// two thirds of the time of the whole library. A development checkout has no such file and loads the library's
// single-file build (lib/browser/math.js, the same version and code, shipped in the same package), which exports
// one ready instance with the default configuration: only this module loads it, so the instance is ours to
// extend (units.ts adds units). When that file is missing too, a private instance is made from the package
// entry (some 1,400 module files): same results, slower start.
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { MathJsInstance } from 'mathjs';
import { dependencyRequire } from './load-dependency.ts';

type MathjsPackage = Pick<typeof import('mathjs'), 'all' | 'create'>;
type MathjsUnits = Pick<typeof import('mathjs'), 'create' | 'unitDependencies' | 'createUnitDependencies'>;

/**
 * The compiled units part, when this is the installed package: lib/analysis/ from this module (lib/analysis/) and
 * from the bundled check command (lib/cli/) alike, both one folder below lib/.
 */
export function mathjsUnitsFile(): string | undefined {
  let here: string;
  try {
    here = dirname(fileURLToPath(import.meta.url));
  } catch {
    return undefined;
  }
  const file = join(here, '..', 'analysis', 'mathjs-units.cjs');
  return existsSync(file) ? file : undefined;
}

export function loadMathjs(): MathJsInstance {
  const units = mathjsUnitsFile();
  if (units) {
    try {
      const { create, unitDependencies, createUnitDependencies } = createRequire(units)(units) as MathjsUnits;
      return create({ unitDependencies, createUnitDependencies }, {}) as MathJsInstance;
    } catch {
      // fall through to the whole library
    }
  }
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
