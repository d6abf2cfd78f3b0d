import { mkdtemp, mkdir, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { readFileList, writeOfflineCopy } from '../../src/cli/write-offline-copy.ts';
import { offlineReport } from '../../src/cli/offline-report.ts';
import { indexSite } from '../../src/cli/index-site.ts';
import { buildManifest, writeSiteManifest } from '../../src/cli/site-manifest.ts';

async function site(pages: Record<string, string>): Promise<string> {
  const dir = await mkdtemp(join(tmpdir(), 'stepwright-offline-'));
  for (const [path, text] of Object.entries(pages)) {
    await mkdir(join(dir, path, '..'), { recursive: true });
    await writeFile(join(dir, path), text);
  }
  return dir;
}

const fragment = (url: string) => gzipSync(Buffer.from(`pagefind_dcd${JSON.stringify({ url, content: 'words' })}`));
const places = [{ slug: 'p-1', area: 'east', kind: 'batch' }, { slug: 'p-2', area: 'west', kind: 'emergency' }];

describe('writeOfflineCopy', () => {
  it('writes the worker as a plain file, the publication record and the file list, stable across rebuilds', async () => {
    const dir = await site({ 'index.html': '<h1>Manual</h1>', 'procedures/p-1/index.html': '<h1>P-1</h1>', 'procedures/p-2/index.html': '<h1>P-2</h1>' });
    await writeFile(join(dir, 'pagefind', 'fragment', 'en_1.pf_fragment'), fragment('/procedures/p-2/')).catch(async () => {
      await mkdir(join(dir, 'pagefind', 'fragment'), { recursive: true });
      await writeFile(join(dir, 'pagefind', 'fragment', 'en_1.pf_fragment'), fragment('/procedures/p-2/'));
    });
    const first = await writeOfflineCopy(dir, { now: new Date('2026-12-01T10:00:00Z'), places });
    const worker = await readFile(join(dir, 'sw.js'), 'utf8');
    expect(first.list.files.map((f) => f.url)).toEqual(['./', 'pagefind/fragment/en_1.pf_fragment', 'procedures/p-1/', 'procedures/p-2/']);
    // No list inside the worker: it stays the same file from one publication to the next.
    expect(worker).not.toContain(first.version);
    expect(worker).toContain("addEventListener('fetch'");
    expect(JSON.parse(await readFile(join(dir, 'offline-manifest.json'), 'utf8')))
      .toEqual({ version: first.version, builtAt: '2026-12-01T10:00:00.000Z', files: 4, bytes: first.bytes, list: 'offline-files.json' });
    const list = await readFileList(dir);
    expect(list?.version).toBe(first.version);
    expect(list?.files.find((f) => f.url === 'pagefind/fragment/en_1.pf_fragment')).toMatchObject({ area: 'west', always: true, page: 'procedures/p-2/' });
    // One file per line, so two publications compare line by line.
    expect((await readFile(join(dir, 'offline-files.json'), 'utf8')).split('\n').filter((l) => l.startsWith('{"url"'))).toHaveLength(4);
    // A second run over its own output must not count the worker, the record or the list into the version.
    const second = await writeOfflineCopy(dir, { now: new Date('2026-12-02T10:00:00Z'), places });
    expect(second.version).toBe(first.version);
    expect(await readFile(join(dir, 'sw.js'), 'utf8')).toBe(worker);
    await rm(dir, { recursive: true, force: true });
  });

  it('takes the hashes the pass over the pages made, and gives the list that reading every file gives', async () => {
    const pages = { 'index.html': '<h1>Manual</h1>', 'procedures/p-1/index.html': '<h1>P-1 <span class="nb">XV-1</span></h1>', 'procedures/p-2/index.html': '<h1>P-2</h1>' };
    const read = await site(pages);
    const handed = await site(pages);
    for (const dir of [read, handed]) await indexSite(dir);
    const fromFiles = await writeOfflineCopy(read, { now: new Date('2026-12-01T00:00:00Z'), places });
    const { finishPages } = await import('../../src/cli/index-site.ts');
    const known = await finishPages(handed, { index: false });
    const fromPass = await writeOfflineCopy(handed, { now: new Date('2026-12-01T00:00:00Z'), places, known });
    expect(fromPass.list).toEqual(fromFiles.list);
    expect(fromPass.hashes).toEqual(fromFiles.hashes);
    // A hash handed over is taken as it is: the page is not read again (a wrong one would show in the list).
    const wrong = new Map<string, { path: string; sha256: string; size: number }>(known);
    wrong.set('index.html', { path: 'index.html', sha256: '0'.repeat(64), size: 1 });
    const taken = await writeOfflineCopy(handed, { now: new Date('2026-12-01T00:00:00Z'), places, known: wrong });
    expect(taken.hashes.get('index.html')).toBe('0'.repeat(64));
    for (const dir of [read, handed]) await rm(dir, { recursive: true, force: true });
  }, 60_000);

  it('reports what an update from the previous build costs', async () => {
    const before = await site({ 'index.html': '<h1>Manual</h1>', 'procedures/p-1/index.html': '<h1>P-1</h1>', 'procedures/p-2/index.html': '<h1>P-2</h1>', 'old.css': 'x' });
    await writeOfflineCopy(before, { now: new Date('2026-12-01T00:00:00Z'), places });
    const after = await site({ 'index.html': '<h1>Manual</h1>', 'procedures/p-1/index.html': '<h1>P-1, changed</h1>', 'procedures/p-2/index.html': '<h1>P-2</h1>' });
    const summary = await writeOfflineCopy(after, { now: new Date('2026-12-02T00:00:00Z'), places, previousSite: before });
    expect(summary.update).toEqual({ fetched: 1, fetchedBytes: 21, added: 0, changed: 1, removed: 1, urls: ['procedures/p-1/'] });
    const report = offlineReport(summary);
    expect(report).toMatch(/^Offline copy: 3 files, 48 B \(version [0-9a-f]{16}\)\.$/m);
    expect(report).toContain('Update from the previous build: 1 file to download, 21 B (1 changed, 0 new), 1 file to delete.');
    expect(report).toContain('  east: 1 procedure, 1 file, 21 B.');
    expect(report).toMatch(/emergency procedures \(1 file, 12 B\)/);
    const fresh = await writeOfflineCopy(after, { now: new Date('2026-12-02T00:00:00Z'), places, previousSite: join(after, 'nowhere') });
    expect(offlineReport(fresh)).toContain('No earlier build in the output folder');
    await rm(before, { recursive: true, force: true });
    await rm(after, { recursive: true, force: true });
  });

  it('hands on the hashes it took, so the site manifest reads no file twice and comes out the same', async () => {
    const dir = await site({ 'index.html': '<h1>Manual</h1>', 'procedures/p-1/index.html': '<h1>P-1</h1>', 'a.css': 'body{}' });
    const summary = await writeOfflineCopy(dir, { now: new Date('2026-12-01T00:00:00Z'), places });
    // The three files written after the reading are not handed on (their hashes were not taken).
    expect([...summary.hashes.keys()].sort()).toEqual(['a.css', 'index.html', 'procedures/p-1/index.html']);
    expect(writeSiteManifest(dir, { known: summary.hashes })).toEqual(buildManifest(dir));
    // A known hash is taken as given: the manifest is built once, at the end of the same build.
    const planted = new Map([['a.css', '0'.repeat(64)]]);
    expect(buildManifest(dir, planted).files['a.css']).toBe('0'.repeat(64));
    await rm(dir, { recursive: true, force: true });
  });
  it('ties each fragment of a real search index to its page, for a site built under /manual/ too', { timeout: 60_000 }, async () => {
    // The index is made from the files by their place in the site folder: its URLs start at "/" even when
    // every link in the pages starts at /manual/.
    const page = (title: string) => `<!doctype html><html lang="en"><head><title>${title}</title></head><body><main data-pagefind-body><h1>${title}</h1><p>Open <a href="/manual/procedures/p-1/">P-1</a> first.</p></main></body></html>`;
    const dir = await site({ 'index.html': page('Manual'), 'procedures/p-1/index.html': page('Purge east line'), 'procedures/p-2/index.html': page('Emergency stop west') });
    await indexSite(dir);
    const summary = await writeOfflineCopy(dir, { now: new Date('2026-12-01T10:00:00Z'), places, publishedUnder: '/manual/' });
    const fragments = summary.list.files.filter((f) => f.url.startsWith('pagefind/fragment/'));
    expect(fragments.map((f) => f.page).sort()).toEqual(['./', 'procedures/p-1/', 'procedures/p-2/']);
    expect(fragments.find((f) => f.page === 'procedures/p-2/')).toMatchObject({ area: 'west', always: true });
    expect(fragments.find((f) => f.page === 'procedures/p-1/')).toMatchObject({ area: 'east' });
    await rm(dir, { recursive: true, force: true });
  });
});
