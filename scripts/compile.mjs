// Compiles the package for publishing: src/**/*.ts → lib/**/*.js (relative imports rewritten to .js), and
// the site's own files (.astro pages and components, styles, the service worker) copied next to them with
// their imports of engine modules pointed at the compiled .js. `npm pack` runs this first (prepack).
import { cpSync, mkdirSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, extname, join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
const src = join(root, 'src');
const lib = join(root, 'lib');

rmSync(lib, { recursive: true, force: true });
const { build, transform } = await import(createRequire(import.meta.url).resolve('esbuild'));

// The sources use only syntax that can be erased (tsconfig: erasableSyntaxOnly, verbatimModuleSyntax), which is what
// a development checkout runs with Node stripping the types: the compiled modules are those sources with the types
// taken out and relative imports of .ts files pointed at .js. The types themselves are checked by `npm test`
// (tsc --noEmit), before anything is committed; a module esbuild cannot read stops the compile.
const failed = [];
async function compileTree(dir) {
  for (const name of readdirSync(dir)) {
    const from = join(dir, name);
    if (statSync(from).isDirectory()) {
      await compileTree(from);
      continue;
    }
    if (!name.endsWith('.ts') || name.endsWith('.d.ts')) continue;
    const to = join(lib, relative(src, from)).replace(/\.ts$/, '.js');
    try {
      const out = await transform(readFileSync(from, 'utf8'), { loader: 'ts', format: 'esm', target: 'node22', sourcefile: relative(root, from), logLevel: 'silent' });
      mkdirSync(dirname(to), { recursive: true });
      writeFileSync(to, pointAtCompiled(out.code));
    } catch (error) {
      failed.push(`${relative(root, from)}: ${error.errors?.[0]?.text ?? error.message}`);
    }
  }
}
/** `from '../x.ts'`, `import '../x.ts'`, `import('../x.ts')` → `.js`; bare and non-TypeScript imports stay. */
export function pointAtCompiled(text) {
  return text.replace(/(\b(?:from|import)\s*\(?\s*)(['"])(\.{1,2}\/[^'"\n]+?)\.ts\2/g, '$1$2$3.js$2');
}

await compileTree(src);
if (failed.length) {
  process.stderr.write(`compile: these modules could not be compiled; no package was made:\n${failed.join('\n')}\n`);
  process.exit(1);
}

let copied = 0;
function copySiteFiles(dir) {
  for (const name of readdirSync(dir)) {
    const from = join(dir, name);
    // Caches a type check or an editor may leave in the folder (.astro/, node_modules/.vite) are not the site.
    if (name.startsWith('.') || name === 'node_modules') continue;
    if (statSync(from).isDirectory()) {
      copySiteFiles(from);
      continue;
    }
    if (extname(name) === '.ts') continue;
    const to = join(lib, relative(src, from));
    mkdirSync(dirname(to), { recursive: true });
    if (extname(name) === '.astro') writeFileSync(to, pointAtCompiled(readFileSync(from, 'utf8')));
    else cpSync(from, to);
    copied++;
  }
}
copySiteFiles(join(src, 'site'));

// Anything still naming a .ts file would fail in the installed package, where no .ts file exists.
const leftovers = [];
(function scan(dir) {
  for (const name of readdirSync(dir)) {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) scan(path);
    else if (/\.(js|astro)$/.test(name) && /(['"])\.{1,2}\/[^'"\n]+\.ts\1/.test(readFileSync(path, 'utf8'))) leftovers.push(relative(root, path));
  }
})(lib);
if (leftovers.length) {
  process.stderr.write(`compile: still importing .ts files: ${leftovers.join(', ')}\n`);
  process.exit(1);
}
// The check command is the one a plant runs at every save and push: its module, everything it imports from lib/
// and the libraries it imports become one file (the English model and mathjs, loaded on first use, stay outside),
// which Node loads in a fraction of the time of its 217 own and about 290 library modules. The licences of the
// libraries it holds are written next to it. The modules that build paths from import.meta (the package root, the
// libraries) sit one folder below lib/, as the bundle does, so those paths resolve the same. The separate modules
// stay for the other commands and the site.
// The part of mathjs the unit conversions use, as one file that loads in about two thirds of the whole library's
// time (see scripts/mathjs-units.mjs and src/analysis/load-mathjs.ts).
const { writeMathjsUnits } = await import('./mathjs-units.mjs');
await writeMathjsUnits(join(lib, 'analysis', 'mathjs-units.cjs'));
const checkCommand = join(lib, 'cli', 'check-command.js');
// zod names all its message languages in one module, and its namespace object keeps every one of them in the bundle
// (half of zod's 817 kB in it). Stepwright writes its own messages and zod's default, English, is the only one
// it ever uses, so the bundle gets a list of that one alone: the same messages, about 400 kB less to read and compile.
const zodEnglishOnly = {
  name: 'zod-english-only',
  setup(build) {
    build.onLoad({ filter: /[\\/]zod[\\/]v4[\\/]locales[\\/]index\.js$/ }, (args) => ({
      contents: "export { default as en } from './en.js';\n", loader: 'js', resolveDir: dirname(args.path),
    }));
  },
};
const bundled = await build({
  entryPoints: [checkCommand], outfile: checkCommand, allowOverwrite: true, bundle: true, platform: 'node', format: 'esm', target: 'node22',
  external: ['compromise', 'mathjs'], metafile: true, legalComments: 'inline', logLevel: 'warning', absWorkingDir: root,
  plugins: [zodEnglishOnly],
  // The CommonJS libraries in it ask for Node's own modules with require, which an ES module has not got.
  banner: { js: "// Licences of the libraries in this file: check-command.LICENSES.txt.\nimport { createRequire as createRequireForLibraries } from 'node:module';\nconst require = createRequireForLibraries(import.meta.url);" },
});
const { writeBundleLicences } = await import('./bundle-licences.mjs');
writeBundleLicences(root, bundled.metafile, 'check-command.js', join(lib, 'cli', 'check-command.LICENSES.txt'));
// The code a large check's reading thread loads (src/read/source-reader.ts) is one file too: the thread starts reading
// when it has loaded it, and the separate modules (the YAML, markdown and schema libraries) take it most of a second.
const threadModule = join(lib, 'read', 'read-on-thread.js');
const threadBundle = await build({
  entryPoints: [threadModule], outfile: threadModule, allowOverwrite: true, bundle: true, platform: 'node', format: 'esm', target: 'node22',
  metafile: true, legalComments: 'inline', logLevel: 'warning', absWorkingDir: root, plugins: [zodEnglishOnly],
  banner: { js: "// Licences of the libraries in this file: read-on-thread.LICENSES.txt.\nimport { createRequire as createRequireForLibraries } from 'node:module';\nconst require = createRequireForLibraries(import.meta.url);" },
});
writeBundleLicences(root, threadBundle.metafile, 'read-on-thread.js', join(lib, 'read', 'read-on-thread.LICENSES.txt'));

// On standard error: `npm pack --json` keeps standard output for its own report.
process.stderr.write(`compile: lib/ written (${copied} site files copied).\n`);
