// The order pages reach the search index while they are drawn: always sorted by path, never a page before one that
// sorts ahead of it, and complete whenever it is not broken.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { byCodeUnit } from '../../src/cli/site-manifest.ts';
import { SearchFeedOrder, type SentPage } from '../../src/cli/search-feed-order.ts';

/** Plays a build: the pages taken over, then the drawn ones in `order`; returns what was sent and whether it broke. */
function play(planned: Array<{ path: string; route: string; marked: boolean }>, taken: Array<{ path: string; route?: string }>, order: number[], mayDraw: string[] = []) {
  const feed = new SearchFeedOrder<string>(taken.map((t) => t.path), mayDraw);
  const sent: Array<SentPage<string>> = [...feed.start(), ...feed.plan(planned.map(({ path, route }) => ({ path, route })), (path) => taken.find((t) => t.path === path)?.route)];
  for (const i of order) sent.push(...feed.drawn(planned[i].path, planned[i].route, planned[i].marked, `drawn ${planned[i].path}`));
  sent.push(...feed.finish());
  return { sent, broken: feed.broken };
}

const procedure = (slug: string) => [
  { path: `procedures/${slug}/audit/index.html`, route: 'audit', marked: false },
  { path: `procedures/${slug}/index.html`, route: 'procedure', marked: true },
  { path: `procedures/${slug}/next/index.html`, route: 'next', marked: false },
];

describe('the order pages reach the search index while they are drawn', () => {
  it('sends a full build\'s procedure pages in path order as they are drawn, route after route', () => {
    const planned = ['a-b', 'a', 'b', 'c'].flatMap(procedure);
    // Astro draws one route at a time; the procedure route in its own order ("a" before "a-b", which sorts after).
    const byRoute = (route: string) => planned.map((p, i) => [p, i] as const).filter(([p]) => p.route === route).map(([, i]) => i);
    const order = [...byRoute('audit'), ...byRoute('next'), ...byRoute('procedure')];
    const { sent, broken } = play(planned, [], order);
    expect(broken).toBe(false);
    expect(sent.map((s) => s.path)).toEqual(['procedures/a-b/index.html', 'procedures/a/index.html', 'procedures/b/index.html', 'procedures/c/index.html']);
    expect(sent.every((s) => s.drawn === `drawn ${s.path}`)).toBe(true);
  });

  it('sends the pages taken over from the last build before the drawing starts, up to the first folder drawn again', () => {
    const planned = procedure('m');
    const taken = ['a', 'b', 'x', 'y'].map((slug) => `procedures/${slug}/index.html`);
    const feed = new SearchFeedOrder<string>(taken, ['procedures/m']);
    expect(feed.start().map((s) => s.path)).toEqual(['procedures/a/index.html', 'procedures/b/index.html']);
    expect(feed.plan(planned, (path) => (path.startsWith('procedures/') && path.split('/').length === 3 ? 'procedure' : undefined))).toEqual([]);
    expect(feed.drawn(planned[0].path, 'audit', false, '')).toEqual([]);
    expect(feed.drawn(planned[1].path, 'procedure', true, 'm').map((s) => s.path)).toEqual(['procedures/m/index.html', 'procedures/x/index.html', 'procedures/y/index.html']);
    expect(feed.broken).toBe(false);
  });

  it('sends every page taken over at once when no folder is drawn again', () => {
    const taken = ['c', 'a', 'b'].map((slug) => `procedures/${slug}/index.html`);
    const feed = new SearchFeedOrder<string>(taken, []);
    expect(feed.start().map((s) => s.path)).toEqual(['procedures/a/index.html', 'procedures/b/index.html', 'procedures/c/index.html']);
    expect(feed.plan([{ path: 'index.html', route: '/' }], () => undefined)).toEqual([]);
    expect(feed.drawn('index.html', '/', false, '')).toEqual([]);
    expect(feed.finish()).toEqual([]);
    expect(feed.broken).toBe(false);
  });

  it('breaks, and sends nothing more, when a page of a route taken to be unmarked turns out marked too late', () => {
    const planned = [
      { path: 'a/index.html', route: 'first', marked: false },
      { path: 'b/index.html', route: 'second', marked: true },
      { path: 'c/index.html', route: 'third', marked: true },
    ];
    // c is sent as soon as it is drawn (nothing known to be marked comes before it); then b comes marked.
    const { sent, broken } = play(planned, [], [2, 0, 1]);
    expect(broken).toBe(true);
    expect(sent.map((s) => s.path)).toEqual(['c/index.html']);
  });

  it('for any build: sends in strictly increasing order, and every marked page exactly once unless broken', () => {
    const slug = fc.stringMatching(/^[a-c][a-c-]{0,3}$/);
    fc.assert(fc.property(
      fc.uniqueArray(fc.record({ slug, route: fc.constantFrom('r1', 'r2', 'r3'), marked: fc.boolean(), taken: fc.boolean(), knowRoute: fc.boolean() }), { selector: (p) => `${p.slug}/${p.route}`, maxLength: 25 }),
      fc.integer({ min: 0, max: 2 ** 31 - 1 }),
      (pages, seed) => {
        const withPath = pages.map((p) => ({ ...p, path: `${p.slug}/${p.route}.html` }));
        const planned = withPath.filter((p) => !p.taken);
        const taken = withPath.filter((p) => p.taken && p.marked).map((p) => ({ path: p.path, route: p.knowRoute ? p.route : undefined }));
        // A random drawing order (Fisher-Yates with a small generator).
        const order = planned.map((_, i) => i);
        let s = seed;
        for (let i = order.length - 1; i > 0; i--) {
          s = (s * 1103515245 + 12345) % 2 ** 31;
          const j = s % (i + 1);
          [order[i], order[j]] = [order[j], order[i]];
        }
        // The folders drawn again, as a rebuild knows them before the pages to draw are listed.
        const { sent, broken } = play(planned, taken, order, [...new Set(planned.map((p) => p.slug))]);
        const paths = sent.map((x) => x.path);
        for (let i = 1; i < paths.length; i++) expect(byCodeUnit(paths[i - 1], paths[i])).toBeLessThan(0);
        if (!broken) {
          const marked = [...planned.filter((p) => p.marked).map((p) => p.path), ...taken.map((t) => t.path)].sort(byCodeUnit);
          expect(paths).toEqual(marked);
        }
        // Drawn in path order, with every marked route known from the start, it never breaks.
        const sorted = planned.map((_, i) => i).sort((a, b) => byCodeUnit(planned[a].path, planned[b].path));
        expect(play(planned, [], sorted).broken).toBe(false);
      },
    ), { numRuns: 500 });
  });
});
