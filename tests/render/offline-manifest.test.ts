import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { offlineManifest, serviceWorkerSource, urlOf } from '../../src/render/offline-manifest.ts';

const bytes = (text: string) => new TextEncoder().encode(text);

describe('offline manifest', () => {
  const site = [
    { path: 'index.html', bytes: bytes('<h1>Manual</h1>') },
    { path: 'procedures/u2-k210-batch-001/index.html', bytes: bytes('<h1>Batch</h1>') },
    { path: 'pagefind/fragment/en_1a2b.pf_fragment', bytes: bytes('x') },
    { path: '_astro/floor.abc.css', bytes: bytes('body{}') },
    { path: '_astro/floor.abc.css.map', bytes: bytes('{}') },
    { path: 'sw.js', bytes: bytes('old worker') },
    { path: 'offline-manifest.json', bytes: bytes('{}') },
  ];

  it('keeps pages under their folder URL and leaves out maps and the offline machinery', () => {
    expect(offlineManifest(site).files).toEqual([
      '/_astro/floor.abc.css', '/', '/pagefind/fragment/en_1a2b.pf_fragment', '/procedures/u2-k210-batch-001/',
    ]);
  });

  it('changes version when any kept file changes, and only then', () => {
    const base = offlineManifest(site).version;
    expect(offlineManifest([...site].reverse()).version).toBe(base);
    expect(offlineManifest(site.map((f) => (f.path === 'sw.js' ? { ...f, bytes: bytes('new worker') } : f))).version).toBe(base);
    expect(offlineManifest(site.map((f) => (f.path === 'index.html' ? { ...f, bytes: bytes('<h1>Manual.</h1>') } : f))).version).not.toBe(base);
  });

  it('gives different versions to different sites (content or names)', () => {
    const file = fc.record({ path: fc.stringMatching(/^[a-z]{1,6}\/[a-z]{1,6}\.html$/), text: fc.string() });
    fc.assert(fc.property(fc.uniqueArray(file, { selector: (f) => f.path, minLength: 1, maxLength: 6 }), fc.nat(), fc.string({ minLength: 1 }), (files, pick, extra) => {
      const built = files.map((f) => ({ path: f.path, bytes: bytes(f.text) }));
      const changed = built.map((f, i) => (i === pick % built.length ? { ...f, bytes: bytes(files[i].text + extra) } : f));
      expect(offlineManifest(changed).version).not.toBe(offlineManifest(built).version);
    }));
  });

  it('maps built paths to the URLs the browser asks for', () => {
    expect(urlOf('index.html')).toBe('/');
    expect(urlOf('tags/k-210/index.html')).toBe('/tags/k-210/');
    expect(urlOf('pagefind/pagefind.js')).toBe('/pagefind/pagefind.js');
  });

  it('writes a worker with no clock in it, so an unchanged site gives a byte-identical worker', () => {
    const a = serviceWorkerSource(offlineManifest(site), 'code();');
    expect(a).toBe(serviceWorkerSource(offlineManifest(site), 'code();'));
    expect(a).toContain(offlineManifest(site).version);
    expect(a.endsWith('code();')).toBe(true);
  });
});
