// Writes the part of mathjs that the unit conversions use as one file: the library's own `create` with its
// `unitDependencies` and `createUnitDependencies` (the Unit class and what it needs: numbers, big numbers,
// fractions, complex numbers, typed functions), taken from the installed mathjs and nothing else. It loads in
// about two thirds of the time of the library's single-file build, which holds every function of the library.
// The licences of the packages it holds are written next to it. Used by compile.mjs, and by a test that compares
// its units with the whole library's.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { writeBundleLicences } from './bundle-licences.mjs';

const root = fileURLToPath(new URL('..', import.meta.url));

/** Writes `outfile` (CommonJS) and `<outfile without .cjs>.LICENSES.txt`; returns the packages it holds. */
export async function writeMathjsUnits(outfile) {
  const require = createRequire(join(root, 'package.json'));
  const { buildSync } = await import(require.resolve('esbuild'));
  const mathjsVersion = JSON.parse(readFileSync(join(root, 'node_modules', 'mathjs', 'package.json'), 'utf8')).version;
  const result = buildSync({
    stdin: { contents: "export { create, unitDependencies, createUnitDependencies } from 'mathjs';", resolveDir: root, loader: 'js' },
    outfile, absWorkingDir: root, bundle: true, platform: 'node', format: 'cjs', target: 'node22', metafile: true, legalComments: 'inline', logLevel: 'warning',
    banner: { js: `// mathjs ${mathjsVersion}: create, unitDependencies and createUnitDependencies, with what they import. Licences: ${outfile.split('/').pop().replace(/\.cjs$/, '.LICENSES.txt')}.` },
  });
  return writeBundleLicences(root, result.metafile, outfile.split('/').pop(), outfile.replace(/\.cjs$/, '.LICENSES.txt'));
}

// Allows `node scripts/mathjs-units.mjs <outfile>` by hand.
if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1] && process.argv[2]) {
  process.stderr.write(`mathjs-units: ${(await writeMathjsUnits(process.argv[2])).join(', ')}\n`);
}
