// package.json against the code: every package the packed package loads is a dependency (a devDependency is not
// installed for a plant), every dependency is loaded by the packed code, and every devDependency is used by a
// test, a bench, a script, the type check or a command in package.json. Imports are read with the TypeScript
// compiler's own parser, not patterns: static, re-exported, dynamic, type-only, and the `require`-style loads
// (createRequire(...).resolve, and dependencyRequire, which loads a dependency on first use).
import { readdirSync, readFileSync, existsSync } from 'node:fs';
import { builtinModules } from 'node:module';
import { extname, join, relative } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');
const manifest = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as {
  name: string;
  dependencies: Record<string, string>;
  devDependencies: Record<string, string>;
  scripts: Record<string, string>;
};
const dependencies = new Set(Object.keys(manifest.dependencies));
const devDependencies = new Set(Object.keys(manifest.devDependencies));

/** devDependencies that another tool loads by itself; each names the script that needs it (checked below). */
const loadedByTools: Record<string, { script: string; command: string }> = {
  '@astrojs/check': { script: 'typecheck', command: 'astro check' },
};

interface Use {
  name: string;
  at: string;
  /** Erased when compiled (`import type`, `typeof import(...)`): nothing loads it at run time. */
  typeOnly: boolean;
}

const builtins = new Set(builtinModules);
/** The package a module specifier names, or undefined for files, URLs, Node's own modules and the package itself. */
function packageOf(specifier: string): string | undefined {
  if (/^(\.|\/|[a-z]+:\/\/|data:|node:)/.test(specifier) || specifier.includes('${')) return undefined;
  // Astro's virtual modules (astro:content, astro:assets, ...) come with astro.
  if (specifier.startsWith('astro:')) return 'astro';
  const parts = specifier.split('/');
  const name = specifier.startsWith('@') ? parts.slice(0, 2).join('/') : parts[0];
  if (builtins.has(name) || name === manifest.name) return undefined;
  return name;
}

const loaders = new Set(['require', 'dependencyRequire']);
/** `require` and `createRequire(...)`: whose `.resolve('x')` names a package. */
const isRequire = (e: ts.Expression): boolean =>
  (ts.isIdentifier(e) && e.text === 'require') ||
  (ts.isCallExpression(e) && ts.isIdentifier(e.expression) && e.expression.text === 'createRequire') ||
  (ts.isMetaProperty(e) && e.keywordToken === ts.SyntaxKind.ImportKeyword);

/** The packages a piece of TypeScript or JavaScript names, with their lines (counted from `firstLine`). */
function packageUses(code: string, file: string, firstLine = 1, kind = ts.ScriptKind.TS): Use[] {
  const source = ts.createSourceFile(file, code, ts.ScriptTarget.Latest, true, kind);
  const uses: Use[] = [];
  const add = (node: ts.Node, typeOnly: boolean) => {
    // import('x' as string) keeps the compiler from looking for the package's types; it still loads 'x'.
    let literal = node;
    while (ts.isAsExpression(literal) || ts.isParenthesizedExpression(literal) || ts.isSatisfiesExpression(literal)) literal = literal.expression;
    if (!ts.isStringLiteralLike(literal)) return;
    const name = packageOf(literal.text);
    if (!name) return;
    const line = source.getLineAndCharacterOfPosition(literal.getStart(source)).line + firstLine;
    uses.push({ name, at: `${file}:${line}`, typeOnly });
  };
  const visit = (node: ts.Node): void => {
    if (ts.isImportDeclaration(node)) add(node.moduleSpecifier, !!node.importClause?.isTypeOnly);
    else if (ts.isExportDeclaration(node) && node.moduleSpecifier) add(node.moduleSpecifier, node.isTypeOnly);
    else if (ts.isImportEqualsDeclaration(node) && ts.isExternalModuleReference(node.moduleReference)) add(node.moduleReference.expression, node.isTypeOnly);
    else if (ts.isImportTypeNode(node) && ts.isLiteralTypeNode(node.argument)) add(node.argument.literal, true);
    else if (ts.isCallExpression(node) && node.arguments.length) {
      const callee = node.expression;
      if (callee.kind === ts.SyntaxKind.ImportKeyword) add(node.arguments[0], false);
      else if (ts.isIdentifier(callee) && loaders.has(callee.text)) add(node.arguments[0], false);
      else if (ts.isPropertyAccessExpression(callee) && callee.name.text === 'resolve' && isRequire(callee.expression)) add(node.arguments[0], false);
    }
    ts.forEachChild(node, visit);
  };
  visit(source);
  return uses;
}

/** An .astro file's code: the front-matter between its `---` fences and the bodies of its <script> elements. */
function astroUses(text: string, file: string): Use[] {
  const uses: Use[] = [];
  const lineOf = (index: number) => text.slice(0, index).split('\n').length;
  const fence = /^---\r?\n([\s\S]*?)\r?\n---\r?$/m.exec(text);
  if (fence && text.slice(0, fence.index).trim() === '') uses.push(...packageUses(fence[1], file, lineOf(fence.index) + 1));
  for (const script of text.matchAll(/<script\b[^>]*>([\s\S]*?)<\/script>/g)) {
    uses.push(...packageUses(script[1], file, lineOf(script.index + script[0].indexOf('>') + 1)));
  }
  return uses;
}

const kinds: Record<string, ts.ScriptKind> = { '.ts': ts.ScriptKind.TS, '.mts': ts.ScriptKind.TS, '.js': ts.ScriptKind.JS, '.mjs': ts.ScriptKind.JS, '.cjs': ts.ScriptKind.JS };
/** Files read, for the check that the scan sees the code at all. */
const scanned: string[] = [];
function usesIn(...folders: string[]): Use[] {
  const uses: Use[] = [];
  for (const folder of folders) {
    const base = join(root, folder);
    if (!existsSync(base)) continue;
    const files = extname(base) ? [base] : readdirSync(base, { recursive: true, encoding: 'utf8' }).map((f) => join(base, f));
    for (const path of files) {
      const file = relative(root, path);
      if (file.split(/[\\/]/).includes('node_modules')) continue;
      const ext = extname(path);
      if (ext === '.astro' || kinds[ext] !== undefined) scanned.push(file);
      if (ext === '.astro') uses.push(...astroUses(readFileSync(path, 'utf8'), file));
      else if (kinds[ext] !== undefined) uses.push(...packageUses(readFileSync(path, 'utf8'), file, 1, kinds[ext]));
    }
  }
  return uses;
}

// What the packed package runs: its command and everything under src/ (compiled to lib/, the site copied).
const packed = usesIn('bin', 'src');
// Everything else in the repository that is ours: tests (fixtures too), benches, scripts, configuration.
const development = usesIn('tests', 'bench', 'scripts', 'vitest.config.ts');

/** Command names each devDependency puts in node_modules/.bin. */
function binsOf(name: string): string[] {
  const file = join(root, 'node_modules', name, 'package.json');
  if (!existsSync(file)) return [];
  const bin = (JSON.parse(readFileSync(file, 'utf8')) as { bin?: string | Record<string, string> }).bin;
  if (!bin) return [];
  return typeof bin === 'string' ? [name.split('/').pop()!] : Object.keys(bin);
}
const scriptWords = new Set(Object.values(manifest.scripts).flatMap((s) => s.split(/[\s;&|()]+/)));
const typesFor = (name: string) => name.replace(/^@types\//, '').replace(/^(.+)__(.+)$/, '@$1/$2');
const tsconfigTypes = (JSON.parse(readFileSync(join(root, 'tsconfig.json'), 'utf8')) as { compilerOptions: { types?: string[] } }).compilerOptions.types ?? [];

const list = (uses: Use[]) => uses.map((u) => `${u.name} (${u.at})`);

describe('package.json lists what the code uses, and only that', () => {
  it('finds the imports it is meant to find (the reader itself)', () => {
    const code = [
      "import a from 'alpha';",
      "import type { B } from '@scope/beta/sub';",
      "export { c } from 'gamma';",
      "const d = await import('delta'); const d2 = await import('delta2' as string);",
      "type E = typeof import('epsilon');",
      "const f = createRequire(import.meta.url).resolve('zeta/package.json');",
      "const g = dependencyRequire('eta');",
      "import { h } from 'node:fs'; import i from 'path'; import j from './local.ts'; import 'stepwright';",
      "const k = path.resolve('not-a-package');",
    ].join('\n');
    expect(packageUses(code, 'x.ts').map((u) => [u.name, u.at, u.typeOnly])).toEqual([
      ['alpha', 'x.ts:1', false], ['@scope/beta', 'x.ts:2', true], ['gamma', 'x.ts:3', false], ['delta', 'x.ts:4', false], ['delta2', 'x.ts:4', false],
      ['epsilon', 'x.ts:5', true], ['zeta', 'x.ts:6', false], ['eta', 'x.ts:7', false],
    ]);
    const astro = "---\nimport A from 'alpha';\nimport B from '../b.astro';\n---\n<p>import x from 'not-code'</p>\n<script>\n  import 'omega';\n</script>\n";
    expect(astroUses(astro, 'p.astro').map((u) => [u.name, u.at])).toEqual([['alpha', 'p.astro:2'], ['omega', 'p.astro:7']]);
  });

  it('reads the code it checks (a scan that finds nothing would pass every check below)', () => {
    expect(packed.filter((u) => u.name === 'yaml' && !u.typeOnly).length).toBeGreaterThan(0);
    expect(scanned.filter((f) => f.startsWith('src/') && f.endsWith('.astro')).length).toBeGreaterThan(10);
    expect(scanned).toContain('bin/stepwright.mjs');
    expect(scanned).toContain('src/site/client/service-worker.js');
    expect(development.some((u) => u.name === 'vitest')).toBe(true);
  });

  it('everything the packed package loads is a dependency, not a devDependency', () => {
    const missing = packed.filter((u) => !u.typeOnly && !dependencies.has(u.name));
    expect(list(missing), 'loaded by the packed code but not in "dependencies" (a plant installs only those)').toEqual([]);
  });

  it('every package the code names is listed (types too: none come only by way of another package)', () => {
    const unlisted = [...packed, ...development].filter((u) => !dependencies.has(u.name) && !devDependencies.has(u.name) && !devDependencies.has(`@types/${u.name}`));
    expect(list(unlisted)).toEqual([]);
  });

  it('every dependency is loaded by the packed code (one used only by tests or tools is a devDependency)', () => {
    const loaded = new Set(packed.filter((u) => !u.typeOnly).map((u) => u.name));
    expect([...dependencies].filter((name) => !loaded.has(name)), 'in "dependencies" but nothing under src/ or bin/ loads it').toEqual([]);
  });

  it('every devDependency is used by a test, bench, script, the type check or a package.json command', () => {
    const named = new Set([...packed, ...development].map((u) => u.name));
    const unused = [...devDependencies].filter((name) => {
      if (dependencies.has(name)) return false;
      if (named.has(name)) return false;
      if (name.startsWith('@types/') && (named.has(typesFor(name)) || tsconfigTypes.includes(typesFor(name)))) return false;
      if (binsOf(name).some((bin) => scriptWords.has(bin))) return false;
      const tool = loadedByTools[name];
      return !(tool && manifest.scripts[tool.script]?.includes(tool.command));
    });
    expect(unused, 'in "devDependencies" but nothing uses it').toEqual([]);
    // A package in both lists would be installed for plants and still read as a tool.
    expect([...dependencies].filter((name) => devDependencies.has(name))).toEqual([]);
  });
});
