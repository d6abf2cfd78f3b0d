// Where the operator is in a procedure: replays a log of "step done" marks over the step plan.
// Pure and DOM-free so the rules of moving through decisions and parallel branches can be tested alone.
import type { PlacekeepingPlan, PlanItem } from '../../render/placekeeping-plan.ts';

/** What follows a step: another step, a decision, a fork into parallel branches, a join, or the end. */
export type Next =
  | { k: 'step'; id: string }
  | { k: 'choose'; key: string; options: Array<{ when?: string; otherwise: boolean; goto?: string; to: Next }> }
  | { k: 'fork'; key: string; branches: Array<{ name: string; start: Next }> }
  | { k: 'join'; key: string }
  | { k: 'end' };

export interface Flow {
  first: Next;
  /** What follows each step id. */
  after: Map<string, Next>;
  /** What follows each parallel block once every branch has ended, and its branch names. */
  blocks: Map<string, { then: Next; branches: string[] }>;
  /** Step ids in reading order (the table's order). */
  order: string[];
  /** Step id → the step its contingency sends the operator to (same branch). */
  ifNot: Map<string, string>;
}

export function compileFlow(plan: Pick<PlacekeepingPlan, 'items'> & Partial<Pick<PlacekeepingPlan, 'ifNot'>>): Flow {
  const after = new Map<string, Next>();
  const blocks = new Map<string, { then: Next; branches: string[] }>();
  const order: string[] = [];
  const collectOrder = (items: PlanItem[]) => {
    for (const item of items) {
      if ('step' in item) order.push(item.step);
      else for (const b of item.branches) if (b.items) collectOrder(b.items);
    }
  };
  collectOrder(plan.items);
  // Right to left: each item learns what follows it before it is itself turned into a "next".
  const sequence = (items: PlanItem[], then: Next): Next => {
    let next = then;
    for (let i = items.length - 1; i >= 0; i--) {
      const item = items[i];
      if ('step' in item) {
        after.set(item.step, next);
        next = { k: 'step', id: item.step };
      } else if ('parallel' in item) {
        blocks.set(item.parallel, { then: next, branches: item.branches.map((b) => b.name) });
        const join: Next = { k: 'join', key: item.parallel };
        next = { k: 'fork', key: item.parallel, branches: item.branches.map((b) => ({ name: b.name, start: sequence(b.items, join) })) };
      } else {
        const rejoin = next;
        next = {
          k: 'choose',
          key: item.choose,
          options: item.branches.map((b) => {
            const tail: Next = b.goto ? { k: 'step', id: b.goto } : rejoin;
            return { when: b.when, otherwise: b.otherwise === true, goto: b.goto, to: b.items ? sequence(b.items, tail) : tail };
          }),
        };
      }
    }
    return next;
  };
  const first = sequence(plan.items, { k: 'end' });
  const ifNot = new Map(Object.entries(plan.ifNot ?? {}).filter(([from, to]) => order.includes(from) && order.includes(to)));
  return { first, after, blocks, order, ifNot };
}

/** One place the operator is at; `path` names the parallel branch ("" outside any, "/key:name" nested). */
export interface Token {
  path: string;
  at: { k: 'step'; id: string } | { k: 'choose'; key: string } | { k: 'join'; key: string } | { k: 'end' };
}

/** A placekeeping mark: the operator finished `step` (or decided at a leading decision) and picked branch `pick`. */
export interface Mark {
  step: string;
  pick?: number;
  /** The expected result did not come: the operator follows the step's contingency to its jump target. */
  ifNot?: boolean;
  path: string;
  /** When the mark was made (ms since epoch), shown to the operator only. */
  at?: number;
}

export interface Place {
  tokens: Token[];
  /** How often each step has been marked done (loops can repeat a step). */
  done: Record<string, number>;
  /** The marks that applied, in order; marks that no longer fit the plan are dropped. */
  marks: Mark[];
  finished: boolean;
}

/** The decision the operator must take when `step` is marked done, if any. */
export function decisionAfter(flow: Flow, step: string): Extract<Next, { k: 'choose' }> | undefined {
  const next = flow.after.get(step);
  return next?.k === 'choose' ? next : undefined;
}

/** The step ids a "next" leads to straight away (through forks), for labelling decision buttons. */
export function stepsReachedBy(next: Next): string[] {
  if (next.k === 'step') return [next.id];
  if (next.k === 'fork') return next.branches.flatMap((b) => stepsReachedBy(b.start));
  return [];
}

export function startPlace(flow: Flow): Place {
  return settle(flow, { tokens: spread(flow, flow.first, ''), done: {}, marks: [], finished: false });
}

/** Replays marks from the start; a mark that does not fit where the operator then was is dropped. */
export function replay(flow: Flow, marks: Mark[]): Place {
  let place = startPlace(flow);
  for (const mark of marks) place = markDone(flow, place, mark) ?? place;
  return place;
}

/** Applies one mark, or returns undefined when the step is not current or the branch pick is missing. */
export function markDone(flow: Flow, place: Place, mark: Mark): Place | undefined {
  const index = place.tokens.findIndex((t) =>
    (t.at.k === 'step' && t.at.id === mark.step) || (t.at.k === 'choose' && t.at.key === mark.step));
  if (index < 0) return undefined;
  const token = place.tokens[index];
  if (mark.ifNot && (token.at.k !== 'step' || !flow.ifNot.has(mark.step))) return undefined;
  let next: Next | undefined = mark.ifNot ? { k: 'step', id: flow.ifNot.get(mark.step)! } : token.at.k === 'choose' ? decisionByKey(flow, token.at.key) : flow.after.get(mark.step);
  if (!next) return undefined;
  if (mark.ifNot) {
    if (mark.pick !== undefined) return undefined;
  } else if (next.k === 'choose') {
    const option = mark.pick === undefined ? undefined : next.options[mark.pick];
    if (!option) return undefined;
    next = option.to;
  } else if (mark.pick !== undefined) return undefined;
  const tokens = [...place.tokens.slice(0, index), ...spread(flow, next, token.path), ...place.tokens.slice(index + 1)];
  const done = { ...place.done };
  if (token.at.k === 'step') done[mark.step] = (done[mark.step] ?? 0) + 1;
  return settle(flow, { tokens, done, marks: [...place.marks, { ...mark, path: token.path }], finished: false });
}

/** Takes back the latest mark made in branch `path` (or the latest mark of all when that branch has none). */
export function undoMark(marks: Mark[], path?: string): Mark[] {
  let index = -1;
  if (path !== undefined) for (let i = marks.length - 1; i >= 0 && index < 0; i--) if (marks[i].path === path) index = i;
  if (index < 0) index = marks.length - 1;
  if (index < 0) return marks;
  return [...marks.slice(0, index), ...marks.slice(index + 1)];
}

function spread(flow: Flow, next: Next, path: string): Token[] {
  switch (next.k) {
    case 'step': return [{ path, at: { k: 'step', id: next.id } }];
    case 'choose': return [{ path, at: { k: 'choose', key: next.key } }];
    case 'join': return [{ path, at: { k: 'join', key: next.key } }];
    case 'end': return [{ path, at: { k: 'end' } }];
    case 'fork': return next.branches.flatMap((b) => spread(flow, b.start, `${path}/${next.key}:${b.name}`));
  }
}

/** Closes parallel blocks whose branches have all ended, repeatedly (a join can complete an outer one). */
function settle(flow: Flow, place: Place): Place {
  let tokens = place.tokens;
  for (let changed = true; changed;) {
    changed = false;
    for (const token of tokens) {
      if (token.at.k !== 'join') continue;
      const key = token.at.key;
      const parent = token.path.slice(0, token.path.lastIndexOf('/'));
      const block = flow.blocks.get(key)!;
      const inBlock = tokens.filter((t) => t.path.startsWith(`${parent}/${key}:`));
      const waiting = inBlock.filter((t) => t.at.k === 'join' && t.at.key === key && t.path.lastIndexOf('/') === parent.length);
      if (waiting.length !== block.branches.length || inBlock.length !== waiting.length) continue;
      const at = tokens.slice(0, tokens.indexOf(inBlock[0])).filter((t) => !inBlock.includes(t)).length;
      const rest = tokens.filter((t) => !inBlock.includes(t));
      tokens = [...rest.slice(0, at), ...spread(flow, block.then, parent), ...rest.slice(at)];
      changed = true;
      break;
    }
  }
  const finished = tokens.length === 1 && tokens[0].at.k === 'end';
  return { ...place, tokens, finished };
}

/** The decision with YAML key `key` (for a decision that does not follow a step). */
export function decisionByKey(flow: Flow, key: string): Extract<Next, { k: 'choose' }> | undefined {
  const search = (next: Next, seen: Set<Next>): Extract<Next, { k: 'choose' }> | undefined => {
    if (seen.has(next)) return undefined;
    seen.add(next);
    if (next.k === 'choose') {
      if (next.key === key) return next;
      for (const o of next.options) { const found = search(o.to, seen); if (found) return found; }
    }
    if (next.k === 'fork') for (const b of next.branches) { const found = search(b.start, seen); if (found) return found; }
    return undefined;
  };
  const seen = new Set<Next>();
  for (const next of [flow.first, ...flow.after.values(), ...[...flow.blocks.values()].map((b) => b.then)]) {
    const found = search(next, seen);
    if (found) return found;
  }
  return undefined;
}
