// The order in which pages reach the search index while the pages are still being drawn. The index depends on the
// order pages are added, and a build adds them sorted by their path in the site (index-site.ts): a page may be sent
// early only when no page sorting before it can still come.
//
// What is known in advance: the pages the build takes over from the last build, with whether each carries the mark
// of a searchable part, and the page folders it draws again; once Astro lists them, the pages it will draw, each
// with the route that draws it. What is known only once a page is drawn: whether it carries the mark. Before the
// list, a marked page taken over is sent when it sorts before every folder drawn again. A marked page is sent once every page sorting before it that could
// still be marked has been drawn; pages of a route that has drawn no marked page yet (and took none over) are taken
// to be unmarked. Should one of them turn out marked after a later page was sent, the order is broken: `broken` is
// set and nothing more is sent, and the build indexes every page again in order at the end (as it would have
// anyway). Either way the index is the same.
import { byCodeUnit } from './site-manifest.ts';

/** A page the build will draw, by its path in the site and the route that draws it. */
export interface PlannedPage {
  path: string;
  route: string;
}

/** What the order sends, one page at a time and in order. */
export interface SentPage<T> {
  path: string;
  /** What was handed over with the page when it was drawn; undefined for a page taken over from the last build. */
  drawn?: T;
}

export class SearchFeedOrder<T> {
  /** Paths still to be drawn, by route, sorted; `next` is how far each has been drawn in order. */
  readonly #planned = new Map<string, { paths: string[]; next: number }>();
  #planKnown = false;
  readonly #drawnPaths = new Set<string>();
  /** Routes known to draw marked pages. */
  readonly #markedRoutes = new Set<string>();
  /** Marked pages taken over from the last build, sorted, and how many have been sent. */
  readonly #taken: string[];
  #takenSent = 0;
  /** Until the pages to draw are known: the folders the build draws again (any page in one may come marked). */
  readonly #mayDraw: string[];
  /** Marked pages drawn and not yet sent, sorted. */
  readonly #waiting: Array<{ path: string; drawn: T }> = [];
  #last: string | undefined;
  #broken = false;

  /**
   * `taken`: the marked pages taken over from the last build. `mayDraw`: the page folders the build draws again,
   * which hold back the pages taken over that sort after them until the pages to draw are known (`plan`).
   */
  constructor(taken: string[], mayDraw: string[] = []) {
    this.#taken = [...taken].sort(byCodeUnit);
    this.#mayDraw = mayDraw.map((folder) => `${folder}/`);
  }

  /**
   * Every page the build will draw, with its route, known once Astro lists them; `routeOf` names the route whose
   * pattern a taken page's path matches (undefined when none does). Returns the pages that may now be sent.
   */
  plan(planned: PlannedPage[], routeOf: (path: string) => string | undefined): Array<SentPage<T>> {
    for (const page of planned) {
      let route = this.#planned.get(page.route);
      if (!route) this.#planned.set(page.route, (route = { paths: [], next: 0 }));
      route.paths.push(page.path);
    }
    for (const route of this.#planned.values()) route.paths.sort(byCodeUnit);
    for (const path of this.#taken) {
      const route = routeOf(path);
      if (route !== undefined) this.#markedRoutes.add(route);
    }
    this.#planKnown = true;
    return this.#ready();
  }

  /** True once a marked page came after a later one was sent: nothing more is sent. */
  get broken(): boolean {
    return this.#broken;
  }

  /** The path of the last page sent. */
  get last(): string | undefined {
    return this.#last;
  }

  /** A page was drawn (`marked`: it carries the mark). Returns the pages that may now be sent, in order. */
  drawn(path: string, route: string, marked: boolean, value: T): Array<SentPage<T>> {
    this.#drawnPaths.add(path);
    if (marked && !this.#broken) {
      if (this.#last !== undefined && byCodeUnit(path, this.#last) <= 0) this.#broken = true;
      else {
        this.#markedRoutes.add(route);
        insertSorted(this.#waiting, { path, drawn: value });
      }
    }
    return this.#ready();
  }

  /** Every page has been drawn: the rest, in order. */
  finish(): Array<SentPage<T>> {
    if (this.#broken) return [];
    const rest: Array<SentPage<T>> = [];
    for (;;) {
      const next = this.#nextCandidate();
      if (!next) return rest;
      rest.push(this.#send(next));
    }
  }

  /** The pages taken over that sort before every folder to be drawn again: sendable before the plan is known. */
  start(): Array<SentPage<T>> {
    return this.#ready();
  }

  #ready(): Array<SentPage<T>> {
    const out: Array<SentPage<T>> = [];
    if (this.#broken) return out;
    for (;;) {
      const next = this.#nextCandidate();
      if (!next || !this.#nothingBefore(next.path)) return out;
      out.push(this.#send(next));
    }
  }

  #nextCandidate(): { path: string; from: 'taken' | 'waiting' } | undefined {
    const taken = this.#taken[this.#takenSent];
    const waiting = this.#waiting[0]?.path;
    if (taken === undefined && waiting === undefined) return undefined;
    if (waiting === undefined || (taken !== undefined && byCodeUnit(taken, waiting) < 0)) return { path: taken!, from: 'taken' };
    return { path: waiting, from: 'waiting' };
  }

  /** No page that sorts before `path` and could be marked is still to be drawn. */
  #nothingBefore(path: string): boolean {
    if (!this.#planKnown) return this.#mayDraw.every((folder) => byCodeUnit(folder, path) > 0);
    for (const route of this.#markedRoutes) {
      const planned = this.#planned.get(route);
      if (!planned) continue;
      while (planned.next < planned.paths.length && this.#drawnPaths.has(planned.paths[planned.next])) planned.next++;
      if (planned.next < planned.paths.length && byCodeUnit(planned.paths[planned.next], path) < 0) return false;
    }
    return true;
  }

  #send(next: { path: string; from: 'taken' | 'waiting' }): SentPage<T> {
    this.#last = next.path;
    if (next.from === 'taken') {
      this.#takenSent++;
      return { path: next.path };
    }
    const page = this.#waiting.shift()!;
    return { path: page.path, drawn: page.drawn };
  }
}

function insertSorted<V extends { path: string }>(list: V[], item: V): void {
  let lo = 0;
  let hi = list.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (byCodeUnit(list[mid].path, item.path) < 0) lo = mid + 1;
    else hi = mid;
  }
  list.splice(lo, 0, item);
}
