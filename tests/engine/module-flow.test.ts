// The code flows one way: no module imports itself back through others, and the site's pages and data
// loading never import the command line (they read the manual through src/site-data).
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..', 'src');
// Files only: `astro check` leaves a cache folder named src/site/.astro, which must not be read as a module.
const files = readdirSync(root, { recursive: true, withFileTypes: true })
  .filter((d) => d.isFile() && /\.(ts|astro)$/.test(d.name) && !d.parentPath.split(/[\\/]/).includes('node_modules'))
  .map((d) => join(d.parentPath, d.name));
const known = new Set(files);

/** Relative imports that load code when the module runs (type-only imports are erased, so they cannot loop). */
function importsOf(file: string): string[] {
  const text = readFileSync(file, 'utf8');
  return [...text.matchAll(/^\s*(import|export)\s+(type\s)?[^'";]*?from\s+['"](\.[^'"]+)['"]/gm)]
    .filter((m) => !m[2])
    .map((m) => resolve(dirname(file), m[3]))
    .filter((d) => known.has(d));
}
const graph = new Map(files.map((f) => [f, importsOf(f)]));
const name = (f: string) => relative(root, f).split('\\').join('/');

describe('module flow', () => {
  it('reads the imports it checks (the scan finds the engine imported by the check command)', () => {
    expect(graph.get(join(root, 'cli', 'check-command.ts'))?.map(name)).toContain('engine/check-run.ts');
  });

  it('has no import cycle', () => {
    const state = new Map<string, 'open' | 'done'>();
    const cycles: string[] = [];
    const visit = (file: string, stack: string[]) => {
      state.set(file, 'open');
      stack.push(file);
      for (const next of graph.get(file)!) {
        if (state.get(next) === 'open') cycles.push([...stack.slice(stack.indexOf(next)), next].map(name).join(' -> '));
        else if (!state.has(next)) visit(next, stack);
      }
      stack.pop();
      state.set(file, 'done');
    };
    for (const f of files) if (!state.has(f)) visit(f, []);
    expect(cycles).toEqual([]);
  });

  it('the site and its data loading import nothing from the command line', () => {
    const crossing = files
      .filter((f) => /^(site|site-data)\//.test(name(f)))
      .flatMap((f) => graph.get(f)!.filter((d) => name(d).startsWith('cli/')).map((d) => `${name(f)} -> ${name(d)}`));
    expect(crossing).toEqual([]);
  });
});
