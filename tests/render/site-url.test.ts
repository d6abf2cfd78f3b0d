// The manual under a sub-path: one helper makes every URL; a page that writes a root-absolute link of its own
// would leave the base on a plant's intranet folder.
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkSources } from '../../src/check/run-checks.ts';
import { parseConfig } from '../../src/check/config.ts';
import { buildManualView } from '../../src/render/manual.ts';
import { ruleReferences } from '../../src/render/rule-reference.ts';
import { buildHistoryView } from '../../src/history/history-view.ts';
import { linksOutsideBase, normalizeBase, parseBase, siteUrl } from '../../src/render/site-url.ts';
import { procedureText } from './procedure-text.ts';

describe('the base a manual is served under', () => {
  it('takes the usual spellings of a path into one form', () => {
    for (const [given, want] of [['', '/'], ['/', '/'], ['manual', '/manual/'], ['/manual', '/manual/'], ['/manual/', '/manual/'], [' plant//manual ', '/plant/manual/'], ['/u2.v~1-a_b/', '/u2.v~1-a_b/']]) {
      expect(parseBase(given)).toEqual({ base: want });
    }
  });

  it('refuses an address, a climb out of the site and characters a URL path would have to escape', () => {
    for (const bad of ['https://intranet/manual/', '//intranet/manual/', '/a/../b/', './manual', '/man ual/', '/manual?x=1', '/manual#top', '/hand%20book/', 'c:\\manual']) {
      expect(parseBase(bad), bad).toHaveProperty('problem');
    }
  });

  it('puts every page under the base; a link to a step of the same page stays as it is', () => {
    expect(siteUrl('/manual/', '/tags/')).toBe('/manual/tags/');
    expect(siteUrl('/', '/tags/')).toBe('/tags/');
    expect(siteUrl('/manual/', '/')).toBe('/manual/');
    expect(siteUrl('/manual/', '#step-3')).toBe('#step-3');
    expect(() => siteUrl('/manual/', 'tags/')).toThrow(/must start with '\/'/);
  });

  it('property: a URL made by siteUrl never leaves its base, and the link scan agrees', () => {
    const seg = fc.stringMatching(/^[a-z0-9][a-z0-9-]{0,8}$/);
    fc.assert(fc.property(fc.array(seg, { minLength: 1, maxLength: 3 }), fc.array(seg, { maxLength: 4 }), (baseParts, pathParts) => {
      const base = normalizeBase(baseParts.join('/'));
      const url = siteUrl(base, `/${pathParts.map((p) => `${p}/`).join('')}`);
      expect(url.startsWith(base)).toBe(true);
      expect(linksOutsideBase(`<a href="${url}">x</a><img src="${url}">`, base)).toEqual([]);
      expect(linksOutsideBase(`<a href="/${pathParts.join('/')}">x</a>`, base).length).toBe(`/${pathParts.join('/')}/`.startsWith(base) ? 0 : 1);
    }));
  });

  it('finds root-absolute links that leave the base, in attributes, srcset and script imports', () => {
    const html = `<a href="/manual/tags/">in</a><a href="/tags/">out</a><a href='/manualx/'>out</a><a href="#s">frag</a>
      <a href="https://example.org/">abs</a><a href="//cdn.example/x.js">proto-relative</a><form action=/search/></form>
      <img srcset="/manual/a.png 1x, /b.png 2x"><link rel="stylesheet" href="/manual"><script>import('/pagefind/pagefind.js')</script>`;
    expect(linksOutsideBase(html, '/manual/')).toEqual(['/b.png', '/manualx/', '/pagefind/pagefind.js', '/search/', '/tags/']);
    expect(linksOutsideBase(html, '/')).toEqual([]);
  });
});

describe('views carry the base in every URL', () => {
  const a = procedureText({
    id: 'U9-A-001', title: 'Start pump P-1', kind: 'startup', status: 'effective', revision: 2, effective: '2025-01-01', 'review-by': '2027-06-01',
    equipment: ['P-1'],
    signals: { 'TI-1': { text: 'Temperature', unit: 'degC', range: [0, 200] } },
    interlocks: [{ tag: 'TSH-1', 'trips-when': 'TI-1 >= 120 degC', action: 'Stops P-1' }],
    steps: [{ step: 'start', do: 'Start pump P-1', until: 'TI-1 >= 20 degC' }],
  });
  const result = checkSources([{ file: 'procedures/pumps/a.md', text: a }], { today: '2026-01-01' });

  /** Every string under a key that names a URL, anywhere in the value. */
  function urlsIn(value: unknown, key = ''): string[] {
    if (typeof value === 'string') return /url$/i.test(key) ? [value] : [];
    if (Array.isArray(value)) return value.flatMap((v) => urlsIn(v, key));
    if (value && typeof value === 'object') return Object.entries(value).flatMap(([k, v]) => urlsIn(v, k));
    return [];
  }

  it('manual view: procedure, tag and interlock-tag URLs are under /manual/', () => {
    const view = buildManualView({ files: result.files, root: 'procedures', today: '2026-01-01', base: '/manual/' });
    const urls = urlsIn(view);
    expect(urls.length).toBeGreaterThan(4);
    for (const u of urls) expect(u.startsWith('/manual/'), u).toBe(true);
    expect(view.procedures[0].url).toBe('/manual/procedures/u9-a-001/');
    // The default stays at the root.
    expect(buildManualView({ files: result.files, root: 'procedures', today: '2026-01-01' }).procedures[0].url).toBe('/procedures/u9-a-001/');
  });

  it('history and rule reference URLs follow the procedure page and the base', () => {
    const history = buildHistoryView({ path: 'procedures/pumps/a.md', revisions: [], shallow: false }, { id: 'U9-A-001', slug: 'u9-a-001', currentRevision: 2, url: '/manual/procedures/u9-a-001/' });
    expect(history.currentUrl).toBe('/manual/procedures/u9-a-001/');
    for (const r of ruleReferences('/manual/')) expect(r.url).toBe(`/manual/rules/${r.id}/`);
  });
});

describe("'base' in the configuration", () => {
  it('is read, and a bad one is a bad-config error at its line, so check reports it before a build', () => {
    expect(parseConfig('c.yaml', 'base: /manual/\n', []).diagnostics).toEqual([]);
    const bad = parseConfig('c.yaml', 'rules: {}\nbase: https://intranet/manual/\n', []);
    expect(bad.diagnostics).toHaveLength(1);
    expect(bad.diagnostics[0]).toMatchObject({ rule: 'bad-config', severity: 'error', line: 2 });
    expect(bad.diagnostics[0].message).toMatch(/address, not a path/);
  });
});

describe('the site sources write no root-absolute link of their own', () => {
  // A literal "/..." in an href, src, action or import would leave the base; pages use url() from lib/url.ts.
  const siteFolder = join(import.meta.dirname, '../../src/site');
  // The site's own sources: not what tools generate beside them (.astro/, node_modules/ from a type check).
  const files = readdirSync(siteFolder, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile() && /\.(astro|ts|js)$/.test(e.name))
    .map((e) => relative(siteFolder, join(e.parentPath, e.name)))
    .filter((f) => !f.split(sep).some((part) => part.startsWith('.') || part === 'node_modules'));

  it('has site files to look at', () => expect(files.length).toBeGreaterThan(20));

  it.each(files)('%s', (file) => {
    const text = readFileSync(join(siteFolder, file), 'utf8');
    const literal = [
      ...text.matchAll(/\b(?:href|src|action)\s*=\s*(?:"\/[^"]*"|'\/[^']*'|\{\s*[`'"]\/[^}]*\})/g),
      ...text.matchAll(/\bimport\(\s*['"`]\/[^)]*\)/g),
      ...text.matchAll(/\b(?:href|fetch|register)\s*[:(]\s*['"`]\/[^'"`]*['"`]/g),
    ].map((m) => m[0]);
    expect(literal).toEqual([]);
  });
});
