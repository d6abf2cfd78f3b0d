// The search index is byte-identical whatever order the file system lists the pages in (ext4 lists by hash,
// tmpfs by creation): the same pages written in opposite orders, on two file systems where there are two,
// give the same index files.
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { indexSite } from '../../src/cli/index-site.ts';
import { siteFiles } from '../../src/cli/site-manifest.ts';

const pages = Array.from({ length: 40 }, (_, i) => [
  `procedures/p-${String(i).padStart(2, '0')}/index.html`,
  `<!doctype html><html lang="en"><head><title>Procedure ${i}</title></head><body><main data-pagefind-body><h1>Open valve XV-${2100 + i}</h1><p>Heat kettle K-${i % 7} to ${200 + i} degC and hold ${i} min.</p></main></body></html>`,
] as const);
const made: string[] = [];

function writeSite(parent: string, order: ReadonlyArray<readonly [string, string]>): string {
  const dir = mkdtempSync(join(parent, 'stepwright-index-order-'));
  made.push(dir);
  for (const [path, html] of order) {
    mkdirSync(join(dir, path, '..'), { recursive: true });
    writeFileSync(join(dir, path), html);
  }
  return dir;
}

function hashes(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const path of siteFiles(join(dir, 'pagefind'))) out[path] = createHash('sha256').update(readFileSync(join(dir, 'pagefind', path))).digest('hex');
  return out;
}

afterAll(() => {
  for (const d of made) rmSync(d, { recursive: true, force: true });
});

describe('search index', () => {
  it('is the same for the same pages written in opposite orders on different file systems', async () => {
    const a = writeSite(tmpdir(), pages);
    const b = writeSite(existsSync('/dev/shm') ? '/dev/shm' : tmpdir(), [...pages].reverse());
    await indexSite(a);
    await indexSite(b);
    const ha = hashes(a);
    expect(Object.keys(ha).length).toBeGreaterThan(3);
    expect(hashes(b)).toEqual(ha);
  }, 60_000);
});
