// Sets of real numbers as sorted, disjoint intervals with exact open and closed ends.

export interface Interval {
  lo: number;
  hi: number;
  loOpen: boolean;
  hiOpen: boolean;
}

export type IntervalSet = Interval[];

export const everything: IntervalSet = [{ lo: -Infinity, hi: Infinity, loOpen: true, hiOpen: true }];

function isEmptyInterval(i: Interval): boolean {
  return i.lo > i.hi || (i.lo === i.hi && (i.loOpen || i.hiOpen));
}

export function interval(lo: number, hi: number, loOpen = false, hiOpen = false): IntervalSet {
  const i = { lo, hi, loOpen: lo === -Infinity || loOpen, hiOpen: hi === Infinity || hiOpen };
  return isEmptyInterval(i) ? [] : [i];
}

export function intersect(a: IntervalSet, b: IntervalSet): IntervalSet {
  const out: IntervalSet = [];
  for (const x of a) {
    for (const y of b) {
      const lo = Math.max(x.lo, y.lo);
      const hi = Math.min(x.hi, y.hi);
      const loOpen = (x.lo === lo && x.loOpen) || (y.lo === lo && y.loOpen);
      const hiOpen = (x.hi === hi && x.hiOpen) || (y.hi === hi && y.hiOpen);
      const i = { lo, hi, loOpen, hiOpen };
      if (!isEmptyInterval(i)) out.push(i);
    }
  }
  return normalize(out);
}

/** The numbers of `within` that are not in `a`. */
export function subtract(within: IntervalSet, a: IntervalSet): IntervalSet {
  // The gaps between a's intervals on the whole line, then only those inside `within`.
  const gaps: IntervalSet = [];
  let lo = -Infinity;
  let loOpen = true;
  for (const i of normalize(a)) {
    const g = { lo, hi: i.lo, loOpen, hiOpen: !i.loOpen };
    if (!isEmptyInterval(g)) gaps.push(g);
    lo = i.hi;
    loOpen = !i.hiOpen;
  }
  if (lo !== Infinity) gaps.push({ lo, hi: Infinity, loOpen, hiOpen: true });
  return intersect(within, gaps);
}

export function union(a: IntervalSet, b: IntervalSet): IntervalSet {
  return normalize([...a, ...b]);
}

export function isEmpty(a: IntervalSet): boolean {
  return a.length === 0;
}

export function equals(a: IntervalSet, b: IntervalSet): boolean {
  return a.length === b.length && a.every((x, i) => x.lo === b[i].lo && x.hi === b[i].hi && x.loOpen === b[i].loOpen && x.hiOpen === b[i].hiOpen);
}

export function contains(a: IntervalSet, v: number): boolean {
  return a.some((i) => (i.loOpen ? v > i.lo : v >= i.lo) && (i.hiOpen ? v < i.hi : v <= i.hi));
}

/** Sorts and merges overlapping or touching intervals. */
export function normalize(list: IntervalSet): IntervalSet {
  const sorted = list.filter((i) => !isEmptyInterval(i)).sort((x, y) => x.lo - y.lo || Number(x.loOpen) - Number(y.loOpen));
  const out: IntervalSet = [];
  for (const i of sorted) {
    const last = out[out.length - 1];
    const touches = last && (i.lo < last.hi || (i.lo === last.hi && !(i.loOpen && last.hiOpen)));
    if (!touches) {
      out.push({ ...i });
      continue;
    }
    if (i.hi > last.hi || (i.hi === last.hi && !i.hiOpen)) {
      last.hi = i.hi;
      last.hiOpen = i.hiOpen;
    }
  }
  return out;
}
