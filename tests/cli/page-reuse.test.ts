// The record of a built site's pages: what may be taken from it, and what never is.
import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync, renameSync, rmSync, statSync, utimesSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { copyReusedPages, pageRecordPath, planReuse, readPageRecord, recordedPages, ReusedPageChanged, reusedPagesAltered, writePageRecord } from '../../src/cli/page-reuse.ts';
import { finishPages } from '../../src/cli/index-site.ts';
import { tempFolder } from '../temp-folder.ts';

const sha = (data: string | Buffer) => createHash('sha256').update(data).digest('hex');

/** A published site with two procedures' pages and one asset, and its record. */
function publishedSite(): { site: string; cache: string; record: string; keys: Map<string, string> } {
  const root = tempFolder('stepwright-page-reuse-');
  const site = join(root, 'site');
  for (const [path, text] of [
    ['procedures/a-1/index.html', '<p>A</p>'], ['procedures/a-1/audit/index.html', '<p>A audit</p>'],
    ['procedures/b-2/index.html', '<p>B</p>'], ['_astro/manual.X1.css', 'p{}'], ['index.html', '<p>home</p>'],
  ]) {
    mkdirSync(join(site, path, '..'), { recursive: true });
    writeFileSync(join(site, path), text);
  }
  const keys = new Map([['procedures/a-1', 'key-a'], ['procedures/b-2', 'key-b']]);
  const cache = join(root, 'cache');
  const record = pageRecordPath(cache, site);
  writePageRecord(record, site, keys, new Map());
  return { site, cache, record, keys };
}

/** A site of the given pages, recorded under `keys`: its folder and its record file. */
function recordedSite(pages: Array<[string, string]>, keys: Map<string, string>): { site: string; record: string } {
  const root = tempFolder('stepwright-page-reuse-');
  const site = join(root, 'site');
  for (const [path, text] of pages) {
    mkdirSync(join(site, path, '..'), { recursive: true });
    writeFileSync(join(site, path), text);
  }
  const record = pageRecordPath(join(root, 'cache'), site);
  writePageRecord(record, site, keys, new Map());
  return { site, record };
}

describe('page reuse', () => {
  it('takes over the pages of a procedure whose key is unchanged, with every file under its folder', () => {
    const { site, record, keys } = publishedSite();
    const plan = planReuse(readPageRecord(record, site), keys, site);
    expect([...plan.reused.keys()].sort()).toEqual(['procedures/a-1', 'procedures/b-2']);
    expect(plan.reused.get('procedures/a-1')!.map((f) => f.path)).toEqual(['procedures/a-1/audit/index.html', 'procedures/a-1/index.html']);
    expect(plan.reused.get('procedures/a-1')![1].sha256).toBe(sha('<p>A</p>'));
    expect(plan.assets).toEqual(['_astro/manual.X1.css']);
  });

  it('draws again a procedure whose key changed, and one that is new', () => {
    const { site, record } = publishedSite();
    const plan = planReuse(readPageRecord(record, site), new Map([['procedures/a-1', 'key-a'], ['procedures/b-2', 'changed'], ['procedures/c-3', 'new']]), site);
    expect([...plan.reused.keys()]).toEqual(['procedures/a-1']);
    expect(plan.redrawn).toBe(1);
  });

  it('never takes a page changed in the output since it was recorded, even with its size and time put back', () => {
    const { site, record, keys } = publishedSite();
    const page = join(site, 'procedures', 'b-2', 'index.html');
    const before = statSync(page);
    writeFileSync(page, '<p>C</p>');
    utimesSync(page, before.atime, before.mtime);
    expect(statSync(page).size).toBe(before.size);
    const plan = planReuse(readPageRecord(record, site), keys, site);
    expect([...plan.reused.keys()]).toEqual(['procedures/a-1']);
  });

  it('never takes a page replaced by another file, even one with the same bytes and times', () => {
    const { site, record, keys } = publishedSite();
    const page = join(site, 'procedures', 'a-1', 'index.html');
    const before = statSync(page);
    const copy = `${page}.copy`;
    writeFileSync(copy, readFileSync(page));
    utimesSync(copy, before.atime, before.mtime);
    renameSync(copy, page);
    expect(readFileSync(page, 'utf8')).toBe('<p>A</p>');
    expect([...planReuse(readPageRecord(record, site), keys, site).reused.keys()]).toEqual(['procedures/b-2']);
  });

  it('takes over nothing when an asset the old pages link to is gone', () => {
    const { site, record, keys } = publishedSite();
    writeFileSync(join(site, '_astro', 'manual.X1.css'), '');
    expect(planReuse(readPageRecord(record, site), keys, site).reused.size).toBe(2);
    rmSync(join(site, '_astro', 'manual.X1.css'));
    expect(planReuse(readPageRecord(record, site), keys, site).reused.size).toBe(0);
  });

  it('ignores a record that was altered, cut short, or written for another output folder', () => {
    const { site, record } = publishedSite();
    const text = readFileSync(record, 'utf8');
    expect(readPageRecord(record, site)).toBeDefined();
    expect(readPageRecord(record, join(site, '..', 'other'))).toBeUndefined();
    writeFileSync(record, text.replace('key-a', 'key-z'));
    expect(readPageRecord(record, site)).toBeUndefined();
    writeFileSync(record, text.slice(0, text.length / 2));
    expect(readPageRecord(record, site)).toBeUndefined();
    writeFileSync(record, 'not json');
    expect(readPageRecord(record, site)).toBeUndefined();
    expect(planReuse(undefined, new Map([['procedures/a-1', 'key-a']]), site)).toMatchObject({ hadRecord: false, redrawn: 0 });
  });

  it('refuses a record that names files outside a folder\'s own pages', () => {
    const { site, record, keys } = publishedSite();
    const outer = JSON.parse(readFileSync(record, 'utf8')) as { sum: string; body: string };
    const body = JSON.parse(outer.body) as { folders: Record<string, { files: Array<{ path: string }> }> };
    body.folders['procedures/a-1'].files[0].path = 'procedures/a-1/../b-2/index.html';
    body.folders['procedures/b-2'].files[0].path = 'index.html';
    const text = JSON.stringify(body);
    writeFileSync(record, JSON.stringify({ sum: sha(text), body: text }));
    expect(planReuse(readPageRecord(record, site), keys, site).reused.size).toBe(0);
  });

  it('copies the taken pages and the old assets the new build lacks, and never over a page the build drew', () => {
    const { site, record, keys } = publishedSite();
    const plan = planReuse(readPageRecord(record, site), keys, site);
    const next = join(tempFolder('stepwright-page-reuse-next-'), 'site');
    mkdirSync(next, { recursive: true });
    const taken = copyReusedPages(plan, site, next);
    expect(readFileSync(join(next, 'procedures', 'a-1', 'audit', 'index.html'), 'utf8')).toBe('<p>A audit</p>');
    expect(readFileSync(join(next, '_astro', 'manual.X1.css'), 'utf8')).toBe('p{}');
    expect([...taken.keys()].sort()).toEqual(['procedures/a-1/audit/index.html', 'procedures/a-1/index.html', 'procedures/b-2/index.html']);
    expect(reusedPagesAltered(plan, next, new Map(), taken)).toEqual([]);
    writeFileSync(join(next, 'procedures', 'b-2', 'index.html'), 'changed');
    expect(reusedPagesAltered(plan, next, new Map(), taken)).toEqual(['procedures/b-2/index.html']);
    expect(() => copyReusedPages(plan, site, next)).toThrow(/was drawn although/);
  });

  it('watches a taken page it does not read: written in place, even with its bytes, size and time put back, it is altered', async () => {
    const { site, record, keys } = publishedSite();
    const plan = planReuse(readPageRecord(record, site), keys, site);
    const next = join(tempFolder('stepwright-page-reuse-next-'), 'site');
    mkdirSync(next, { recursive: true });
    const taken = copyReusedPages(plan, site, next);
    // The final pass takes the unmarked pages as recorded, without reading them.
    const pages = await finishPages(next, { index: false, finished: recordedPages(plan) });
    expect(pages.get('procedures/a-1/index.html')).toMatchObject({ sha256: sha('<p>A</p>'), asRecorded: true, marked: false });
    expect(reusedPagesAltered(plan, next, pages, taken)).toEqual([]);
    const page = join(next, 'procedures', 'a-1', 'index.html');
    const before = statSync(page);
    writeFileSync(page, '<p>A</p>');
    utimesSync(page, before.atime, before.mtime);
    expect(reusedPagesAltered(plan, next, pages, taken)).toEqual(['procedures/a-1/index.html']);
  });

  it('reads a taken page the search index is sent, and finds it altered by its hash', async () => {
    const root = tempFolder('stepwright-page-reuse-marked-');
    const site = join(root, 'site');
    mkdirSync(join(site, 'procedures', 'm-1'), { recursive: true });
    writeFileSync(join(site, 'procedures', 'm-1', 'index.html'), '<main data-pagefind-body><p>M</p></main>');
    const record = pageRecordPath(join(root, 'cache'), site);
    const keys = new Map([['procedures/m-1', 'key-m']]);
    writePageRecord(record, site, keys, new Map());
    const plan = planReuse(readPageRecord(record, site), keys, site);
    expect(plan.reused.get('procedures/m-1')![0].marked).toBe(true);
    const next = join(root, 'next');
    mkdirSync(next);
    const taken = copyReusedPages(plan, site, next);
    const pages = await finishPages(next, { index: false, finished: recordedPages(plan) });
    expect(pages.get('procedures/m-1/index.html')).toMatchObject({ marked: true, sha256: sha('<main data-pagefind-body><p>M</p></main>') });
    expect(pages.get('procedures/m-1/index.html')!.asRecorded).toBeUndefined();
    expect(reusedPagesAltered(plan, next, pages, taken)).toEqual([]);
    // A hash that differs from the record is an altered page, whatever its file's times say.
    pages.set('procedures/m-1/index.html', { ...pages.get('procedures/m-1/index.html')!, sha256: '0'.repeat(64) });
    expect(reusedPagesAltered(plan, next, pages, taken)).toEqual(['procedures/m-1/index.html']);
  });

  it('refuses to take a page changed after the plan, just before it is linked', () => {
    const { site, record, keys } = publishedSite();
    const plan = planReuse(readPageRecord(record, site), keys, site);
    writeFileSync(join(site, 'procedures', 'b-2', 'index.html'), '<p>X</p>');
    const next = join(tempFolder('stepwright-page-reuse-next-'), 'site');
    mkdirSync(next, { recursive: true });
    expect(() => copyReusedPages(plan, site, next)).toThrow(ReusedPageChanged);
  });

  it('keeps tag and rule pages by their own folder, and only the pages under it', () => {
    const keys = new Map([['tags/k-210', 'key-tag'], ['rules/no-exit', 'key-rule'], ['tags/../rules', 'key-odd']]);
    const { site, record } = recordedSite([['tags/k-210/index.html', '<p>K-210</p>'], ['tags/index.html', '<p>tags</p>'], ['rules/no-exit/index.html', '<p>rule</p>']], keys);
    const plan = planReuse(readPageRecord(record, site), keys, site);
    // A folder named with ".." is never recorded; the list of tags beside the tag's folder is not part of it.
    expect([...plan.reused.keys()].sort()).toEqual(['rules/no-exit', 'tags/k-210']);
    expect(plan.reused.get('tags/k-210')!.map((f) => f.path)).toEqual(['tags/k-210/index.html']);
    const changed = planReuse(readPageRecord(record, site), new Map([['tags/k-210', 'key-tag-2'], ['rules/no-exit', 'key-rule']]), site);
    expect([...changed.reused.keys()]).toEqual(['rules/no-exit']);
    expect(changed.redrawn).toBe(1);
  });

  it('records a later part of a tag\'s list as a folder of its own, not with the tag\'s page above it', () => {
    const keys = new Map([['tags/k-210', 'key-1'], ['tags/k-210/2', 'key-2'], ['tags/k-210/3', 'key-3']]);
    const { site, record } = recordedSite([['tags/k-210/index.html', '<p>part 1</p>'], ['tags/k-210/2/index.html', '<p>part 2</p>'], ['tags/k-210/3/index.html', '<p>part 3</p>']], keys);
    const all = planReuse(readPageRecord(record, site), keys, site);
    expect(all.reused.get('tags/k-210')!.map((f) => f.path)).toEqual(['tags/k-210/index.html']);
    expect(all.reused.get('tags/k-210/2')!.map((f) => f.path)).toEqual(['tags/k-210/2/index.html']);
    // Part 2 changed: it alone is drawn again; the tag's page and part 3 are taken, and copying them never meets
    // the part the new build drew.
    const plan = planReuse(readPageRecord(record, site), new Map([...keys, ['tags/k-210/2', 'key-2b']]), site);
    expect([...plan.reused.keys()].sort()).toEqual(['tags/k-210', 'tags/k-210/3']);
    const next = join(tempFolder('stepwright-page-reuse-next-'), 'site');
    mkdirSync(join(next, 'tags', 'k-210', '2'), { recursive: true });
    writeFileSync(join(next, 'tags', 'k-210', '2', 'index.html'), '<p>part 2, drawn again</p>');
    copyReusedPages(plan, site, next);
    expect(readFileSync(join(next, 'tags', 'k-210', 'index.html'), 'utf8')).toBe('<p>part 1</p>');
    expect(readFileSync(join(next, 'tags', 'k-210', '2', 'index.html'), 'utf8')).toBe('<p>part 2, drawn again</p>');
    expect(readFileSync(join(next, 'tags', 'k-210', '3', 'index.html'), 'utf8')).toBe('<p>part 3</p>');
    // A tag whose list is one part again: its folder holds every page under it once more (no key names the parts).
    writePageRecord(record, site, new Map([['tags/k-210', 'key-1']]), new Map());
    const whole = planReuse(readPageRecord(record, site), new Map([['tags/k-210', 'key-1']]), site);
    expect(whole.reused.get('tags/k-210')!.map((f) => f.path)).toEqual(['tags/k-210/2/index.html', 'tags/k-210/3/index.html', 'tags/k-210/index.html']);
  });
});
