// Loops made by jumps back in the sequence, with the transitions that leave them (their exits).
import type { StepGraph, Transition } from '../step-graph.ts';

export interface Loop {
  /** The jump that closes the loop. */
  jump: Transition;
  /** The step the jump returns to. */
  head: string;
  /** Places on the loop (those reachable from the head that can reach the jump). */
  body: Set<string>;
  /** Transitions that leave the loop. */
  exits: Transition[];
}

function reach(starts: string[], next: Map<string, string[]>): Set<string> {
  const seen = new Set(starts);
  const queue = [...starts];
  for (let i = 0; i < queue.length; i++) {
    for (const n of next.get(queue[i]) ?? []) {
      if (seen.has(n)) continue;
      seen.add(n);
      queue.push(n);
    }
  }
  return seen;
}

export function findLoops(graph: StepGraph): Loop[] {
  const forward = new Map<string, string[]>();
  const backward = new Map<string, string[]>();
  for (const t of graph.transitions) {
    for (const f of t.from) {
      for (const to of t.to) {
        if (!forward.has(f)) forward.set(f, []);
        forward.get(f)!.push(to);
        if (!backward.has(to)) backward.set(to, []);
        backward.get(to)!.push(f);
      }
    }
  }
  const loops: Loop[] = [];
  for (const jump of graph.transitions) {
    if (!jump.jump?.resolved || !jump.to.length) continue;
    const head = jump.to[0];
    const ahead = reach([head], forward);
    if (!jump.from.some((f) => ahead.has(f))) continue;
    const behind = reach(jump.from, backward);
    const body = new Set([...ahead].filter((p) => behind.has(p)));
    const exits = graph.transitions.filter((t) => t !== jump && t.from.some((f) => body.has(f)) && t.to.some((p) => !body.has(p)));
    loops.push({ jump, head, body, exits });
  }
  return loops;
}

/** A shortest walk along the graph from one place to another (ignoring tokens), as transitions. */
export function walk(graph: StepGraph, from: string, to: string, within?: Set<string>): Transition[] {
  const via = new Map<string, Transition>();
  const seen = new Set([from]);
  const queue = [from];
  for (let i = 0; i < queue.length && !seen.has(to === from ? '\u0000' : to); i++) {
    const here = queue[i];
    for (const t of graph.transitions) {
      if (!t.from.includes(here)) continue;
      for (const p of t.to) {
        if (seen.has(p) || (within && !within.has(p))) continue;
        seen.add(p);
        via.set(p, t);
        queue.push(p);
      }
    }
  }
  const path: Transition[] = [];
  for (let p = to; p !== from && via.has(p); p = via.get(p)!.from[0]) path.push(via.get(p)!);
  return path.reverse();
}
