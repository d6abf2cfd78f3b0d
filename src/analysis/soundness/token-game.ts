// Plays the token game of a small net breadth first, within a state budget, and reports what can go wrong.
import type { Transition } from '../step-graph.ts';

/** A net with places numbered 0..size-1; each transition remembers the step-graph transition it stands for. */
export interface Game {
  /** Place names, by number (step-graph place ids, or "block:<key>" for a collapsed parallel block). */
  places: string[];
  transitions: Array<{ from: number[]; to: number[]; source: Transition }>;
  entry: number;
  exit: number;
}

export interface Exploration {
  /** Markings visited. */
  states: number;
  /** True when the budget ran out before every reachable marking was seen. */
  exceeded: boolean;
  /** Per place: the first marking (index) that marks it, or -1 when no reachable marking does. */
  firstMarked: Int32Array;
  /** Per transition: whether it can ever fire. */
  fired: Uint8Array;
  exitReached: boolean;
  /** A marking where a place holds a second token. */
  unsafe?: { path: Transition[]; place: string };
  /** The first marking (fewest firings) from which the exit can no longer be marked. */
  stuck?: { path: Transition[]; active: string[] };
  /** A marking that marks the exit while other places still hold tokens. */
  improper?: { path: Transition[]; active: string[] };
  /** The firing sequence that first marks a place. */
  pathTo(place: number): Transition[];
}

// Token counts stay tiny (a second token ends the search there), so one byte per place is one latin-1 character.
const latin1 = new TextDecoder('latin1');
const keyOf = (m: Uint8Array): string => latin1.decode(m);

export function explore(game: Game, budget: number): Exploration {
  if (game.transitions.every((t) => t.from.length === 1 && t.to.length === 1)) return exploreOneToken(game);
  const n = game.places.length;
  const byFirstInput: number[][] = Array.from({ length: n }, () => []);
  game.transitions.forEach((t, i) => {
    if (t.from.length) byFirstInput[t.from[0]].push(i);
  });
  const index = new Map<string, number>();
  const markings: Uint8Array[] = [];
  const parent: number[] = [];
  const via: number[] = [];
  const successors: number[][] = [];
  const unsafeState: boolean[] = [];
  const firstMarked = new Int32Array(n).fill(-1);
  const fired = new Uint8Array(game.transitions.length);
  let exceeded = false;
  let unsafeAt = -1;
  let unsafePlace = -1;
  let improperAt = -1;

  const add = (candidate: Uint8Array, from: number, t: number): number => {
    const key = keyOf(candidate);
    const known = index.get(key);
    if (known !== undefined) return known;
    const m = candidate.slice();
    const id = markings.length;
    index.set(key, id);
    markings.push(m);
    parent.push(from);
    via.push(t);
    successors.push([]);
    let tokens = 0;
    let unsafe = false;
    for (let p = 0; p < n; p++) {
      if (m[p] === 0) continue;
      tokens += m[p];
      if (firstMarked[p] < 0) firstMarked[p] = id;
      if (m[p] > 1) {
        unsafe = true;
        if (unsafeAt < 0) {
          unsafeAt = id;
          unsafePlace = p;
        }
      }
    }
    unsafeState.push(unsafe);
    if (m[game.exit] > 0 && tokens > 1 && improperAt < 0) improperAt = id;
    return id;
  };

  const scratch = new Uint8Array(n);
  const initial = new Uint8Array(n);
  initial[game.entry] = 1;
  add(initial, -1, -1);
  for (let s = 0; s < markings.length; s++) {
    if (markings.length > budget) {
      exceeded = true;
      break;
    }
    const m = markings[s];
    // A place with two tokens is already a finding; going on from there could run without bound.
    if (unsafeState[s]) continue;
    for (let p = 0; p < n; p++) {
      if (m[p] === 0) continue;
      for (const ti of byFirstInput[p]) {
        const t = game.transitions[ti];
        let enabled = true;
        for (const f of t.from) if (m[f] === 0) enabled = false;
        if (!enabled) continue;
        scratch.set(m);
        for (const f of t.from) scratch[f]--;
        for (const q of t.to) scratch[q]++;
        fired[ti] = 1;
        successors[s].push(add(scratch, s, ti));
      }
    }
  }

  const pathOf = (state: number): Transition[] => {
    const out: Transition[] = [];
    for (let s = state; s > 0; s = parent[s]) out.push(game.transitions[via[s]].source);
    return out.reverse();
  };
  const activeIn = (state: number) => {
    const out: string[] = [];
    markings[state].forEach((c, p) => {
      if (c > 0) out.push(game.places[p]);
    });
    return out;
  };

  let exitReached = false;
  for (const m of markings) if (m[game.exit] > 0) exitReached = true;

  const result: Exploration = {
    states: markings.length, exceeded, firstMarked, fired, exitReached,
    pathTo: (place) => (firstMarked[place] < 0 ? [] : pathOf(firstMarked[place])),
  };
  if (unsafeAt >= 0) result.unsafe = { path: pathOf(unsafeAt), place: game.places[unsafePlace] };
  if (improperAt >= 0) result.improper = { path: pathOf(improperAt), active: activeIn(improperAt) };
  if (!exceeded) {
    // Which markings can still mark the exit: backwards from those that do. Unsafe markings were not
    // expanded, so they count as "unknown" rather than stuck.
    const predecessors: number[][] = markings.map(() => []);
    successors.forEach((list, s) => list.forEach((t) => predecessors[t].push(s)));
    const canExit = new Uint8Array(markings.length);
    const queue: number[] = [];
    markings.forEach((m, s) => {
      if (m[game.exit] > 0 || unsafeState[s]) {
        canExit[s] = 1;
        queue.push(s);
      }
    });
    for (let i = 0; i < queue.length; i++) {
      for (const p of predecessors[queue[i]]) {
        if (canExit[p]) continue;
        canExit[p] = 1;
        queue.push(p);
      }
    }
    const first = canExit.indexOf(0);
    if (first >= 0) result.stuck = { path: pathOf(first), active: activeIn(first) };
  }
  return result;
}

/**
 * With one token and transitions from one place to one place, a marking is just the place holding the token:
 * the token game is plain graph search, linear in the size of the net.
 */
function exploreOneToken(game: Game): Exploration {
  const n = game.places.length;
  const out: number[][] = Array.from({ length: n }, () => []);
  const into: number[][] = Array.from({ length: n }, () => []);
  game.transitions.forEach((t, i) => {
    out[t.from[0]].push(i);
    into[t.to[0]].push(i);
  });
  const firstMarked = new Int32Array(n).fill(-1);
  const via = new Int32Array(n).fill(-1);
  const fired = new Uint8Array(game.transitions.length);
  const order = [game.entry];
  firstMarked[game.entry] = 0;
  for (let i = 0; i < order.length; i++) {
    for (const ti of out[order[i]]) {
      fired[ti] = 1;
      const q = game.transitions[ti].to[0];
      if (firstMarked[q] >= 0) continue;
      firstMarked[q] = order.length;
      via[q] = ti;
      order.push(q);
    }
  }
  const canExit = new Uint8Array(n);
  canExit[game.exit] = 1;
  const queue = [game.exit];
  for (let i = 0; i < queue.length; i++) {
    for (const ti of into[queue[i]]) {
      const p = game.transitions[ti].from[0];
      if (canExit[p]) continue;
      canExit[p] = 1;
      queue.push(p);
    }
  }
  const pathTo = (place: number): Transition[] => {
    if (firstMarked[place] < 0) return [];
    const path: Transition[] = [];
    for (let p = place; via[p] >= 0; p = game.transitions[via[p]].from[0]) path.push(game.transitions[via[p]].source);
    return path.reverse();
  };
  const result: Exploration = { states: order.length, exceeded: false, firstMarked, fired, exitReached: firstMarked[game.exit] >= 0, pathTo };
  const stuck = order.find((p) => !canExit[p]);
  if (stuck !== undefined) result.stuck = { path: pathTo(stuck), active: [game.places[stuck]] };
  return result;
}
