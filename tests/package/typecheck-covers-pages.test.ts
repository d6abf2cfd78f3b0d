// `npm run typecheck` must type-check the site's pages: astro check reads only the files its tsconfig includes, and
// with the engine's tsconfig (TypeScript files only) it checked no page at all while reporting "0 errors".
import { readFileSync, readdirSync } from 'node:fs';
import { join, relative } from 'node:path';
import picomatch from 'picomatch';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');

function astroFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    if (entry.name.startsWith('.') || entry.name === 'node_modules') return [];
    const path = join(dir, entry.name);
    return entry.isDirectory() ? astroFiles(path) : entry.name.endsWith('.astro') ? [relative(root, path)] : [];
  });
}

describe('the type check', () => {
  const script = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')).scripts.typecheck as string;
  const flag = /astro check --root (\S+) --tsconfig (\S+)/.exec(script);

  it('gives astro check a tsconfig of its own', () => {
    expect(flag, script).not.toBeNull();
  });

  it('includes every page, component and layout of the site, and no build output', () => {
    const tsconfig = JSON.parse(readFileSync(join(root, flag![1], flag![2]), 'utf8')) as { include: string[]; exclude: string[] };
    const included = picomatch(tsconfig.include);
    const pages = astroFiles(join(root, 'src', 'site'));
    expect(pages.length).toBeGreaterThan(20);
    expect(pages.filter((p) => !included(p))).toEqual([]);
    expect(tsconfig.exclude).toEqual(expect.arrayContaining(['node_modules', 'lib', 'dist']));
  });
});
