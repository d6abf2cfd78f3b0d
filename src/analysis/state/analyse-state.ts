// The plant state along every path: which values every signal, valve and latched trip can have while each step
// is active. It explores the step graph's markings (so parallel branches interleave as they can on the plant)
// with sets of values (boxes of interval sets per signal, in SI base units), and stops when nothing new is
// reachable: a fixed point over the step graph.
//
// What changes a value: a step's lasting actions (`state`), a step's trips and resets, and the signals a step
// drives (those in its `set` and `until`), which move from where they were towards the step's target while it is
// active. A transition guarantees its condition when it fires. Every other signal keeps its value, starting from
// the line-up and, without one, its declared range.
import type { Condition } from '../conditions/ast.ts';
import { comparisonsIn, parseCondition } from '../conditions/parse.ts';
import { NotAnalysable, SignalSpace, sliverHalfWidth, type Box, type Region, type SignalInfo, type ValueSet } from '../decisions/signal-space.ts';
import { contains, intersect, normalize, union, type IntervalSet } from '../decisions/interval-set.ts';
import { parseQuantity, toBase } from '../units.ts';
import type { Step } from '../../model/procedure.ts';
import type { Transition } from '../step-graph.ts';
import { activeOnlyActions, clear, latched, storedActions, tripVariable, type StateInput } from './state-input.ts';

export interface StateView {
  box: Box;
  /** The exploration node it came from, for the path that leads there. */
  node: number;
}

export interface StateAnalysis {
  space: SignalSpace;
  /** Step place id → the values that can hold while the step is active. */
  views: Map<string, StateView[]>;
  /**
   * The values when the procedure has ended, by the contingency that was taken first on the way ('' for none):
   * the step id whose time limit or if-not jumped.
   */
  endViews: Map<string, StateView[]>;
  /** The values before the first step (from the line-up, and any trip in force at the start). */
  start: Box[];
  /** Contingency jumps (time-limit and if-not goto) the analysis followed, by the step they leave. */
  contingencies: Array<{ step: string; target: string; kind: 'time-limit' | 'if-not' }>;
  /** False when part of the procedure could not be analysed; `gaps` says what. */
  complete: boolean;
  gaps: string[];
  /** The step ids entered on the way to a node, in order. */
  pathTo(node: number): string[];
  /** The condition as a region of the space, or undefined when it cannot be analysed. */
  regionOf(text: string): Region | undefined;
  /** Why `regionOf(text)` gave nothing, once it has been asked (undefined for a text that does not parse). */
  whyNotAnalysed(text: string): string | undefined;
}

const builtIns = new Set(['elapsed', 'done']);
const defaultBudget = 20_000;

interface Node {
  marking: number[];
  box: Box;
  parent: number;
  entered: string[];
  /** The step whose contingency jump was taken first on the way here, or ''. */
  via: string;
}

export function analyseState(input: StateInput, extraConditions: string[] = [], budget = defaultBudget): StateAnalysis {
  const gaps: string[] = [];
  /** Why a condition could not be analysed, by its text. */
  const reasons = new Map<string, string>();
  const parsed = new Map<string, Condition | null>();
  const parse = (text: string): Condition | null => {
    if (!parsed.has(text)) {
      const r = parseCondition(text);
      parsed.set(text, r.ok ? r.condition : null);
    }
    return parsed.get(text)!;
  };
  const { graph } = input;
  const guardTexts = graph.transitions.flatMap((t) => t.guard.filter((g) => g.kind === 'until' || g.kind === 'when').map((g) => g.text));
  const texts = [...new Set([...guardTexts, ...input.lineUp, ...extraConditions])];
  const latching = input.trips.filter((t) => t.latches);
  const signals: Record<string, SignalInfo> = { ...input.signals };
  for (const t of latching) signals[tripVariable(t.tag)] = { values: [clear, latched] };

  // Declare every variable; a condition that cannot be analysed is left out and said so.
  const usable: Condition[] = [];
  for (const text of texts) {
    const c = parse(text);
    if (!c) continue;
    try {
      new SignalSpace(signals, [c], { useRanges: true });
      usable.push(c);
    } catch (e) {
      gaps.push(`'${text}' cannot be analysed (${(e as Error).message})`);
      reasons.set(text, (e as Error).message);
      parsed.set(text, null);
    }
  }
  const space = new SignalSpace(signals, usable, { useRanges: true });
  for (const name of Object.keys(signals)) {
    try {
      space.include(name);
    } catch (e) {
      gaps.push(`signal ${name} cannot be analysed (${(e as Error).message})`);
    }
  }
  const names = [...space.variables.keys()].filter((n) => !builtIns.has(n));
  const regionCache = new Map<string, Region | null>();
  const regionOf = (text: string): Region | undefined => {
    if (!regionCache.has(text)) {
      const c = parse(text);
      let region: Region | null = null;
      if (c) {
        try {
          region = space.regionOf(c).map(stripBuiltIns);
        } catch (e) {
          gaps.push(`'${text}' cannot be analysed (${(e as Error).message})`);
          reasons.set(text, (e as Error).message);
        }
      }
      regionCache.set(text, region);
    }
    return regionCache.get(text) ?? undefined;
  };
  // Every signal at any value: made once, and copied (its value sets are shared, never changed).
  const fullBox: Box = new Map(names.map((n) => [n, space.full(space.variables.get(n)!)]));
  const full = (): Box => new Map(fullBox);
  const complete = (box: Box): Box => {
    // A box that already holds every signal (its keys are always signals of the space) is complete as it is.
    if (box.size === names.length && !builtInIn(box)) return box;
    const out = full();
    for (const [n, v] of box) if (!builtIns.has(n)) out.set(n, v);
    return out;
  };
  const and = (boxes: Box[], region: Region | undefined): Box[] => (region ? space.and(boxes, region).map(complete) : boxes);
  // The conditions the rules will ask about are worked out now, so that `gaps` names those that cannot be analysed
  // whichever rule asks first.
  for (const text of extraConditions) regionOf(text);

  const heldBy = new Map<string, Array<{ trip: string; value: string }>>();
  for (const t of latching) for (const h of t.holds) heldBy.set(h.signal, [...(heldBy.get(h.signal) ?? []), { trip: t.tag, value: h.value }]);
  /** The value a latched trip forces on the signal in this box, if any. */
  const heldValue = (box: Box, signal: string): string | undefined => {
    for (const h of heldBy.get(signal) ?? []) {
      const v = box.get(tripVariable(h.trip));
      if (v?.kind === 'enum' && v.set.length === 1 && v.set[0] === latched) return h.value;
    }
    return undefined;
  };
  const assignWord = (box: Box, signal: string, value: string, keepPrevious: boolean) => {
    const v = space.variables.get(signal);
    if (!v || v.kind !== 'enum') return;
    const held = heldValue(box, signal);
    if (held !== undefined) {
      box.set(signal, { kind: 'enum', set: [held] });
      return;
    }
    const before = box.get(signal);
    const previous = keepPrevious && before?.kind === 'enum' ? before.set : [];
    box.set(signal, { kind: 'enum', set: v.values.filter((w) => w === value || previous.includes(w)) });
  };
  const setTrip = (box: Box, tag: string, state: typeof latched | typeof clear) => {
    const trip = latching.find((t) => t.tag === tag);
    if (!trip) return;
    box.set(tripVariable(tag), { kind: 'enum', set: [state] });
    if (state === latched) for (const h of trip.holds) assignWord(box, h.signal, h.value, false);
  };

  // What a step drives: the numeric signals in its until and set, and where it drives them.
  const motionCache = new Map<Step, Array<{ signal: string; target: IntervalSet }>>();
  const motionOf = (step: Step) => {
    let found = motionCache.get(step);
    if (found) return found;
    found = [];
    const targets = new Map<string, IntervalSet>();
    const untilCondition = step.until ? parse(step.until.value) : null;
    const untilRegion = step.until ? regionOf(step.until.value) : undefined;
    if (untilCondition && untilRegion) {
      for (const cmp of comparisonsIn(untilCondition)) {
        const v = space.variables.get(cmp.name.name);
        if (!v || v.kind !== 'number' || builtIns.has(v.name)) continue;
        let set: IntervalSet = [];
        for (const b of untilRegion) {
          const s = b.get(v.name);
          set = union(set, s?.kind === 'number' ? s.set : v.domain);
        }
        targets.set(v.name, set);
      }
    }
    for (const sp of step.set) {
      const v = space.variables.get(sp.signal);
      const q = parseQuantity(sp.quantity);
      if (!v || v.kind !== 'number' || !q.ok) continue;
      const base = toBase(q.value, q.unit);
      if (base === null || Number.isNaN(base)) continue;
      const point = intersect(v.domain, [{ lo: base, hi: base, loOpen: false, hiOpen: false }]);
      targets.set(v.name, union(targets.get(v.name) ?? [], point));
    }
    for (const [signal, target] of targets) found.push({ signal, target });
    motionCache.set(step, found);
    return found;
  };

  const enter = (box: Box, step: Step): Box => {
    const out = new Map(box);
    for (const r of step.resets ?? []) for (const tag of input.resetsAlso?.get(r.value) ?? [r.value]) setTrip(out, tag, clear);
    for (const t of step.trips ?? []) setTrip(out, t.value, latched);
    for (const a of storedActions(step)) assignWord(out, a.signal, a.value, a.lasts === 'delayed');
    for (const m of motionOf(step)) {
      const before = out.get(m.signal);
      if (before?.kind !== 'number') continue;
      const v = space.variables.get(m.signal)!;
      out.set(m.signal, { kind: 'number', set: intersect(v.kind === 'number' ? v.domain : before.set, hull(union(before.set, nearestPart(before.set, m.target)))) });
    }
    // A hold test (`max-drop`) watches a signal that may fall while the step is active, by any amount: the test is
    // there to find out how much. Its pass and fail branches are both reachable.
    for (const drop of step.maxDrop ?? []) {
      const before = out.get(drop.signal);
      const v = space.variables.get(drop.signal);
      if (before?.kind !== 'number' || v?.kind !== 'number' || !before.set.length) continue;
      const top = before.set[before.set.length - 1];
      out.set(drop.signal, { kind: 'number', set: intersect(v.domain, [{ lo: -Infinity, hi: top.hi, loOpen: true, hiOpen: top.hiOpen }]) });
    }
    return out;
  };
  const overlay = (box: Box, steps: Step[]): Box => {
    const out = new Map(box);
    // Two steps active together that hold one signal at different values: either can be what the plant shows.
    const held = new Set<string>();
    for (const step of steps) {
      for (const a of activeOnlyActions(step)) {
        assignWord(out, a.signal, a.value, a.lasts !== 'step' || held.has(a.signal));
        held.add(a.signal);
      }
    }
    return out;
  };

  // The guard of a transition as regions; `otherwise` is the complement of its sibling branches.
  const siblingsOf = new Map<string, Transition[]>();
  for (const t of graph.transitions) {
    if (!t.choose) continue;
    const key = `${t.choose.path.join('.')}|${t.from.join(',')}`;
    siblingsOf.set(key, [...(siblingsOf.get(key) ?? []), t]);
  }
  const guardFilter = (t: Transition, boxes: Box[]): Box[] => {
    let out = boxes;
    for (const g of t.guard) {
      if (g.kind === 'until' || g.kind === 'when') out = and(out, regionOf(g.text));
      else if (g.kind === 'otherwise' && t.choose) {
        const others = (siblingsOf.get(`${t.choose.path.join('.')}|${t.from.join(',')}`) ?? []).filter((s) => s !== t)
          .flatMap((s) => s.guard.filter((p) => p.kind === 'when').map((p) => regionOf(p.text)));
        if (others.some((r) => r === undefined)) continue;
        const taken = (others as Region[]).reduce<Region>((a, b) => space.or(a, b), []);
        out = and(out, space.not(taken));
      }
      if (!out.length) return out;
    }
    return out;
  };

  const placeIndex = new Map(graph.places.map((p, i) => [p.id, i]));
  const stepOf = graph.places.map((p) => (p.kind === 'step' ? p.step : undefined));
  const transitions = graph.transitions.map((t) => ({ t, from: t.from.map((p) => placeIndex.get(p)!), to: t.to.map((p) => placeIndex.get(p)!) }));
  // A step's time limit or if-not may jump (goto): the step is left without its transition's condition holding.
  const contingencies: StateAnalysis['contingencies'] = [];
  const contingencyOf = new Map<Transition, string>();
  graph.places.forEach((p, i) => {
    const step = p.kind === 'step' ? p.step : undefined;
    if (!step) return;
    const seen = new Set<string>();
    for (const [kind, g] of [['time-limit', step.timeLimit?.goto], ['if-not', step.ifNot?.goto]] as const) {
      if (!g || seen.has(g.value)) continue;
      seen.add(g.value);
      const target = graph.placeOfStep.get(g.value);
      if (target === undefined) continue; // an unknown step is reported by its own rule
      const tp = graph.places[placeIndex.get(target)!];
      if (tp.scope.join('/') !== p.scope.join('/')) {
        gaps.push(`the ${kind} jump of step '${step.id}' to '${g.value}' leaves or enters a parallel branch, so the plant state after it was not followed`);
        continue;
      }
      const t: Transition = {
        id: `${kind}:${step.id}`, from: [p.id], to: [target], guard: [], kind: 'jump', missing: false, fromStep: step.id,
        jump: { target: g.value, path: g.path, resolved: true },
      };
      contingencyOf.set(t, step.id);
      contingencies.push({ step: step.id, target: g.value, kind });
      transitions.push({ t, from: [i], to: [placeIndex.get(target)!] });
    }
  });
  // Each transition with what firing it does apart from the plant state: the steps it enters, named as the path
  // to a state shows them, and the contingency jump it is, if one.
  const firing = transitions.map(({ t, from, to }) => {
    const entered = to.map((p) => stepOf[p]).filter((s): s is Step => s !== undefined);
    const jumpFrom = contingencyOf.get(t);
    const ids = entered.map((s) => (jumpFrom ? `${s.id} (jump from ${jumpFrom}: ${t.id.split(':')[0]})` : s.id));
    return { t, from, to, entered, jumpFrom, ids };
  });
  const byFirstInput = new Map<number, typeof firing>();
  for (const tr of firing) if (tr.from.length) byFirstInput.set(tr.from[0], [...(byFirstInput.get(tr.from[0]) ?? []), tr]);

  // Start: the line-up, and latching trips that may already be in force.
  let initial: Box[] = [full()];
  for (const text of input.lineUp) initial = and(initial, regionOf(text));
  for (const tag of input.latchedAtStart) {
    initial = initial.flatMap((b) => {
      const a = new Map(b);
      const c = new Map(b);
      setTrip(a, tag, latched);
      setTrip(c, tag, clear);
      return latching.some((t) => t.tag === tag) ? [c, a] : [b];
    });
  }
  for (const t of latching) {
    if (input.latchedAtStart.includes(t.tag)) continue;
    for (const b of initial) b.set(tripVariable(t.tag), { kind: 'enum', set: [clear] });
  }

  const nodes: Node[] = [];
  const index = new Map<string, number>();
  const boxKey = boxKeys(names);
  const views = new Map<string, StateView[]>();
  const viewKeys = new Map<string, Set<string>>();
  const endViews = new Map<string, StateView[]>();
  const endKeys = new Set<string>();
  const endPlace = placeIndex.get(graph.end)!;
  let exceeded = false;
  const add = (marking: number[], box: Box, parent: number, entered: string[], via: string) => {
    const key = `${marking.join(',')}|${boxKey(box)}|${via}`;
    if (index.has(key)) return;
    if (nodes.length >= budget) {
      exceeded = true;
      return;
    }
    index.set(key, nodes.length);
    nodes.push({ marking, box, parent, entered, via });
  };
  const start = placeIndex.get(graph.start)!;
  for (const b of initial) add([start], b, -1, [], '');

  for (let n = 0; n < nodes.length; n++) {
    const { marking, box, via } = nodes[n];
    if (marking.includes(endPlace)) {
      const key = `${via}|${boxKey(box)}`;
      if (!endKeys.has(key)) {
        endKeys.add(key);
        const list = endViews.get(via);
        if (list) list.push({ box, node: n });
        else endViews.set(via, [{ box, node: n }]);
      }
    }
    const active = marking.map((p) => stepOf[p]).filter((s): s is Step => s !== undefined);
    if (active.length) {
      const seen = overlay(box, active);
      const key = boxKey(seen);
      for (const p of marking) {
        if (!stepOf[p]) continue;
        const id = graph.places[p].id;
        const keys = viewKeys.get(id) ?? new Set();
        viewKeys.set(id, keys);
        if (keys.has(key)) continue;
        keys.add(key);
        const list = views.get(id);
        if (list) list.push({ box: seen, node: n });
        else views.set(id, [{ box: seen, node: n }]);
      }
    }
    for (const p of marking) {
      const outgoing = byFirstInput.get(p);
      if (!outgoing) continue;
      for (const { t, from, to, entered, jumpFrom, ids } of outgoing) {
        if (!from.every((q) => marking.includes(q))) continue;
        const rest = marking.filter((q) => !from.includes(q));
        const next = [...new Set([...rest, ...to])].sort((a, b) => a - b);
        for (const b of guardFilter(t, [box])) {
          let after = b;
          for (const s of entered) after = enter(after, s);
          add(next, after, n, ids, via || jumpFrom || '');
        }
      }
    }
  }
  if (exceeded) gaps.push(`the procedure has more than ${budget} combinations of active steps and plant states; only part of it was analysed`);

  return {
    space,
    views,
    endViews,
    start: initial,
    contingencies,
    complete: gaps.length === 0,
    gaps,
    pathTo(node: number) {
      const out: string[] = [];
      for (let n = node; n >= 0; n = nodes[n].parent) out.unshift(...nodes[n].entered);
      return out;
    },
    regionOf,
    whyNotAnalysed: (text) => reasons.get(text),
  };
}

function builtInIn(box: Box): boolean {
  for (const n of builtIns) if (box.has(n)) return true;
  return false;
}

function stripBuiltIns(box: Box): Box {
  const out = new Map(box);
  for (const n of builtIns) out.delete(n);
  return out;
}

/**
 * The part of the target a value moving from `from` reaches first: for each end of `from` outside the target,
 * the nearest point of the target, or a sliver just inside an open end. A signal moves continuously, so while
 * the step is active it takes the values between where it was and where the step stops it.
 */
function nearestPart(from: IntervalSet, target: IntervalSet): IntervalSet {
  let out: IntervalSet = [];
  const t = normalize(target);
  for (const i of from) {
    for (const end of [i.lo, i.hi]) {
      if (!Number.isFinite(end) || contains(t, end)) continue;
      let best: { d: number; piece: IntervalSet } | undefined;
      for (const c of t) {
        const edge = end < c.lo ? c.lo : end > c.hi ? c.hi : end;
        if (!Number.isFinite(edge)) continue;
        const d = Math.abs(edge - end);
        const w = sliverHalfWidth * Math.max(1, Math.abs(edge));
        const piece = intersect([c], [{ lo: edge - w, hi: edge + w, loOpen: false, hiOpen: false }]);
        if (!best || d < best.d) best = { d, piece };
      }
      if (best) out = union(out, best.piece);
    }
  }
  return out;
}

function hull(set: IntervalSet): IntervalSet {
  const s = normalize(set);
  if (s.length < 2) return s;
  const first = s[0];
  const last = s[s.length - 1];
  return [{ lo: first.lo, loOpen: first.loOpen, hi: last.hi, hiOpen: last.hiOpen }];
}

/**
 * A box's key: equal for two boxes exactly when every signal holds the same values in both. Each value set is
 * written out once (a set is shared by the many boxes that copy it, and never changed) and numbered by what it
 * says, so that a key is a short list of numbers.
 */
function boxKeys(names: string[]): (box: Box) => string {
  const numberOf = new Map<string, number>();
  const numbered = new WeakMap<ValueSet, number>();
  const numberFor = (v: ValueSet | undefined): number => {
    if (!v) return 0;
    let n = numbered.get(v);
    if (n === undefined) {
      const shown = showSet(v);
      n = numberOf.get(shown);
      if (n === undefined) numberOf.set(shown, (n = numberOf.size + 1));
      numbered.set(v, n);
    }
    return n;
  };
  return (box) => {
    let key = '';
    for (const name of names) key += `${numberFor(box.get(name))};`;
    return key;
  };
}

function showSet(v: ValueSet): string {
  if (v.kind === 'enum') return [...v.set].sort().join('|');
  return v.set.map((i) => `${i.loOpen ? '(' : '['}${i.lo},${i.hi}${i.hiOpen ? ')' : ']'}`).join('u');
}

export { NotAnalysable };
