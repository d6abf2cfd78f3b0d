import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { formatBytes, offlineFileList, updateCost, urlOf } from '../../src/render/offline-manifest.ts';

const bytes = (text: string) => new TextEncoder().encode(text);
const builtAt = '2026-12-01T00:00:00.000Z';

describe('offline file list', () => {
  const site = [
    { path: 'index.html', bytes: bytes('<h1>Manual</h1>') },
    { path: 'procedures/u2-k210-batch-001/index.html', bytes: bytes('<h1>Batch</h1>') },
    { path: 'procedures/u2-k210-batch-001/audit/index.html', bytes: bytes('<h1>Audit</h1>') },
    { path: 'procedures/u2-k210-esd-001/index.html', bytes: bytes('<h1>ESD</h1>') },
    { path: 'procedures/u2-t230-cip-001/index.html', bytes: bytes('<h1>CIP</h1>') },
    { path: 'pagefind/fragment/en_1a2b.pf_fragment', bytes: bytes('x') },
    { path: 'pagefind/pagefind.js', bytes: bytes('search()') },
    { path: 'pagefind/pagefind-ui.js', bytes: bytes('ui()') },
    { path: '_astro/floor.abc.css', bytes: bytes('body{}') },
    { path: '_astro/floor.abc.css.map', bytes: bytes('{}') },
    { path: 'sw.js', bytes: bytes('old worker') },
    { path: 'offline-manifest.json', bytes: bytes('{}') },
    { path: 'offline-files.json', bytes: bytes('{}') },
  ];
  const places = [
    { slug: 'u2-k210-batch-001', area: 'k-210-resin', kind: 'batch' },
    { slug: 'u2-k210-esd-001', area: 'k-210-resin', kind: 'emergency-shutdown' },
    { slug: 'u2-t230-cip-001', area: 't-230-blending', kind: 'normal' },
  ];
  const fragmentPages = new Map([['pagefind/fragment/en_1a2b.pf_fragment', 'procedures/u2-t230-cip-001/']]);
  const list = offlineFileList(site, { builtAt, places, fragmentPages });

  it('keeps pages under their folder URL and leaves out maps, unused search screens and the offline machinery', () => {
    expect(list.files.map((f) => f.url)).toEqual([
      './', '_astro/floor.abc.css', 'pagefind/fragment/en_1a2b.pf_fragment', 'pagefind/pagefind.js',
      'procedures/u2-k210-batch-001/', 'procedures/u2-k210-batch-001/audit/', 'procedures/u2-k210-esd-001/', 'procedures/u2-t230-cip-001/',
    ]);
  });

  it('gives each file the SHA-256 of its content and its size', () => {
    const home = list.files.find((f) => f.url === './')!;
    // Source: FIPS 180-4 (SHA-256), the same digest the browser's SubtleCrypto computes on the tablet.
    expect(home.hash).toBe(createHash('sha256').update('<h1>Manual</h1>').digest('hex').slice(0, 32));
    expect(home.bytes).toBe(15);
  });

  it('ties procedure pages and their search fragments to the area, and marks emergency procedures', () => {
    const of = (url: string) => list.files.find((f) => f.url === url)!;
    expect(of('procedures/u2-k210-batch-001/audit/')).toMatchObject({ area: 'k-210-resin' });
    expect(of('procedures/u2-k210-batch-001/').always).toBeUndefined();
    expect(of('procedures/u2-k210-esd-001/')).toMatchObject({ area: 'k-210-resin', always: true });
    expect(of('pagefind/fragment/en_1a2b.pf_fragment')).toMatchObject({ area: 't-230-blending', page: 'procedures/u2-t230-cip-001/' });
    expect(of('./').area).toBeUndefined();
    expect(of('pagefind/pagefind.js').area).toBeUndefined();
    expect(list.areas).toEqual([
      { area: 'k-210-resin', procedures: 2, files: 3, bytes: 14 + 14 + 12 },
      { area: 't-230-blending', procedures: 1, files: 2, bytes: 12 + 1 },
    ]);
  });

  it('changes version when any kept file changes, and only then', () => {
    const base = list.version;
    const again = (files: typeof site) => offlineFileList(files, { builtAt: '2030-01-01T00:00:00.000Z', places, fragmentPages }).version;
    expect(again([...site].reverse())).toBe(base);
    expect(again(site.map((f) => (f.path === 'sw.js' ? { ...f, bytes: bytes('new worker') } : f)))).toBe(base);
    expect(again(site.map((f) => (f.path === 'index.html' ? { ...f, bytes: bytes('<h1>Manual.</h1>') } : f)))).not.toBe(base);
  });

  it('gives different versions to different sites (content or names)', () => {
    const file = fc.record({ path: fc.stringMatching(/^[a-z]{1,6}\/[a-z]{1,6}\.html$/), text: fc.string() });
    fc.assert(fc.property(fc.uniqueArray(file, { selector: (f) => f.path, minLength: 1, maxLength: 6 }), fc.nat(), fc.string({ minLength: 1 }), (files, pick, extra) => {
      const built = files.map((f) => ({ path: f.path, bytes: bytes(f.text) }));
      const changed = built.map((f, i) => (i === pick % built.length ? { ...f, bytes: bytes(files[i].text + extra) } : f));
      expect(offlineFileList(changed, { builtAt }).version).not.toBe(offlineFileList(built, { builtAt }).version);
    }));
  });

  it('maps built paths to the URLs the browser asks for, relative to the manual root', () => {
    expect(urlOf('index.html')).toBe('./');
    expect(urlOf('tags/k-210/index.html')).toBe('tags/k-210/');
    expect(urlOf('pagefind/pagefind.js')).toBe('pagefind/pagefind.js');
  });
});

describe('update cost', () => {
  const entry = (url: string, hash: string, size = 10) => ({ url, hash, bytes: size });

  it('counts new and changed files as fetched, gone files as deleted', () => {
    const before = { files: [entry('./', 'a'), entry('p/1/', 'b'), entry('p/2/', 'c'), entry('old/', 'd')] };
    const after = { files: [entry('./', 'a'), entry('p/1/', 'b2', 25), entry('p/2/', 'c'), entry('p/3/', 'e', 7)] };
    expect(updateCost(before, after)).toEqual({ fetched: 2, fetchedBytes: 32, added: 1, changed: 1, removed: 1, urls: ['p/1/', 'p/3/'] });
  });

  it('never fetches content the tablet already holds under another URL', () => {
    const before = { files: [entry('a/', 'same'), entry('b/', 'x')] };
    const after = { files: [entry('a/', 'same'), entry('b/', 'same')] };
    expect(updateCost(before, after)).toMatchObject({ fetched: 0, changed: 1 });
  });

  it('is zero between equal lists, and fetches everything from an empty one', () => {
    fc.assert(fc.property(fc.uniqueArray(fc.record({ url: fc.string(), hash: fc.stringMatching(/^[0-9a-f]{4,8}$/), bytes: fc.nat(1000) }), { selector: (e) => e.url }), (files) => {
      expect(updateCost({ files }, { files })).toMatchObject({ fetched: 0, fetchedBytes: 0, removed: 0 });
      const all = updateCost({ files: [] }, { files });
      expect(all.fetched).toBe(new Set(files.map((f) => f.hash)).size);
    }));
  });

  it('writes sizes the way a reader expects', () => {
    expect(formatBytes(812)).toBe('812 B');
    expect(formatBytes(44_134)).toBe('43.1 KB');
    // Source: the measurement of the scaled manual, 68.8 MB (binary megabytes).
    expect(formatBytes(72_142_028)).toBe('68.8 MB');
  });
});
