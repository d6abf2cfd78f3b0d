// Finds procedure files under the given paths and reads them; unreadable ones become inputs with an error.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import type { SourceInput } from '../check/run-checks.ts';

const skipDirs = new Set(['node_modules', 'dist', '.git', '.astro']);

export function findProcedureFiles(paths: string[], cwd: string): Array<{ file: string; absolute: string; missing?: string }> {
  const out: Array<{ file: string; absolute: string; missing?: string }> = [];
  const seen = new Set<string>();
  const add = (absolute: string, missing?: string) => {
    if (seen.has(absolute)) return;
    seen.add(absolute);
    out.push({ file: displayPath(absolute, cwd), absolute, missing });
  };
  const walk = (dir: string) => {
    let entries: string[];
    try {
      entries = readdirSync(dir).sort();
    } catch (error) {
      add(dir, (error as Error).message);
      return;
    }
    for (const name of entries) {
      if (name.startsWith('.') || skipDirs.has(name)) continue;
      const full = join(dir, name);
      let isDir = false;
      try {
        isDir = statSync(full).isDirectory();
      } catch {
        continue;
      }
      if (isDir) walk(full);
      else if (name.endsWith('.md')) add(full);
    }
  };
  for (const p of paths) {
    const absolute = resolve(cwd, p);
    let stats;
    try {
      stats = statSync(absolute);
    } catch {
      add(absolute, `no such file or folder: ${p}`);
      continue;
    }
    if (stats.isDirectory()) walk(absolute);
    else add(absolute);
  }
  return out;
}

export function readProcedureFiles(paths: string[], cwd: string): SourceInput[] {
  return findProcedureFiles(paths, cwd).map(({ file, absolute, missing }) => {
    if (missing) return { file, error: missing };
    try {
      const bytes = readFileSync(absolute);
      const text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
      return { file, text };
    } catch (error) {
      const message = (error as Error).name === 'TypeError' ? 'it is not valid UTF-8 text' : (error as Error).message;
      return { file, error: message };
    }
  });
}

function displayPath(absolute: string, cwd: string): string {
  const rel = relative(cwd, absolute);
  return rel && !rel.startsWith('..') ? rel.split('\\').join('/') : absolute;
}
