// Hazards kept away only by an old reading. The state analysis carries a measured value (a numeric signal) from
// the step that established it to every later step that does not name it: "a signal changes only in steps that
// name it". That is how the state is followed, but a pressure read before an hour of heating says nothing about the
// pressure when the manway is opened. So at each step where a hazard's condition cannot hold as analysed, the
// condition is judged again with every numeric signal it names that was not established right there (by the step's
// own `needs`, or by the condition of the transition that entered the step on every way in) taken anywhere in its
// declared range. Enumerated signals (valves, hatches, trips) stay as analysed: they change only when a step names
// them, and only the step that puts one of them into a state is judged (opening the manway, opening the cooling
// valve). When the hazard can then hold, the step acts on a reading taken earlier.
// Source: common practice (a permissive is checked immediately before the action it permits, not carried over).
import type { Region, Box, ValueSet } from '../decisions/signal-space.ts';
import type { Step } from '../../model/procedure.ts';
import type { StepGraph, Transition } from '../step-graph.ts';
import type { StateAnalysis } from './analyse-state.ts';
import type { StateFinding } from './state-findings.ts';

export interface OldReading {
  signal: string;
  /** The step whose needs, until, set or decision last established the value on the path; undefined for the line-up. */
  step?: string;
  /** How that step established it. */
  by: 'needs' | 'until' | 'set' | 'when' | 'line-up' | 'range';
}

export interface OldReadingFinding extends StateFinding {
  /** The numeric signals that, taken at any value, let the hazard's condition hold. */
  readings: OldReading[];
  /** Why the step's entry does not establish the value, when it is more than "the step before does not name it". */
  entry: 'jump' | 'join' | 'plain';
}

/** Numeric signals whose value is established when the step starts, by place id (the step's needs apart). */
interface Entry {
  fresh: Set<string>;
  entry: OldReadingFinding['entry'];
}

const entryMemo = new WeakMap<StateAnalysis, Map<string, Entry>>();

/**
 * Steps at which `region` cannot hold as analysed but can when the numeric signals it names, other than those
 * established as the step starts, are taken anywhere in their range. The first such state per step, with its path.
 */
export function hazardOnOldReadings(analysis: StateAnalysis, graph: StepGraph, region: Region, lineUp: readonly string[], skip?: ReadonlySet<string>): OldReadingFinding[] {
  const { space } = analysis;
  const named = [...new Set(region.flatMap((b) => [...b.keys()]))];
  const numeric = named.filter((n) => space.variables.get(n)?.kind === 'number');
  const enumerated = new Set(named.filter((n) => space.variables.get(n)?.kind === 'enum'));
  if (!numeric.length || !enumerated.size) return [];
  const establishes = establishedBy(analysis);
  const entries = entriesOf(analysis, graph, lineUp, establishes);
  const out: OldReadingFinding[] = [];
  for (const place of graph.places) {
    const step = place.kind === 'step' ? place.step : undefined;
    // Only the step that acts: its state puts a valve, hatch or drive the condition names into a state. A step that
    // leaves them as they were relies on no new reading: the value moves only as the steps that name it drive it.
    if (!step || skip?.has(step.id) || !(step.state ?? []).some((a) => enumerated.has(a.signal))) continue;
    const views = analysis.views.get(place.id);
    // Where the hazard can hold as analysed, hazard-can-occur reports the step already.
    if (!views?.length || views.some((v) => space.and([v.box], region).length)) continue;
    const entry = entries.get(place.id)!;
    const needs = step.needs?.value;
    const old = numeric.filter((n) => !entry.fresh.has(n) && !(needs && establishes(needs, n)));
    if (!old.length) continue;
    const needRegion = needs ? analysis.regionOf(needs) : undefined;
    const widen = (box: Box, names: string[]): Box[] => {
      const wide: Box = new Map(box);
      for (const n of names) wide.set(n, space.full(space.variables.get(n)!));
      return needRegion ? space.and([wide], needRegion) : [wide];
    };
    for (const view of views) {
      const met = space.and(widen(view.box, old), region);
      if (!met.length) continue;
      // Name the readings that matter: each one that alone lets the condition hold, or else all of them.
      const alone = old.filter((n) => space.and(widen(view.box, [n]), region).length > 0);
      const path = analysis.pathTo(view.node);
      const readings = (alone.length ? alone : old).map((signal) => lastEstablished(signal, path, graph, lineUp, establishes));
      out.push({
        step, path, readings, entry: entry.entry,
        values: space.describe(new Map([...met[0]].filter(([k]) => named.includes(k))) as Box),
      });
      break;
    }
  }
  return out;
}

/** Whether a condition, when it holds, pins the signal down (every case of it limits the signal). */
function establishedBy(analysis: StateAnalysis): (text: string, signal: string) => boolean {
  const { space } = analysis;
  return (text, signal) => {
    const r = analysis.regionOf(text);
    return !!r && r.length > 0 && r.every((b) => limits(b.get(signal), space.full(space.variables.get(signal)!)));
  };
}

function limits(v: ValueSet | undefined, full: ValueSet): boolean {
  if (!v || v.kind !== 'number' || full.kind !== 'number') return false;
  if (v.set.length !== full.set.length) return true;
  return v.set.some((i, k) => {
    const f = full.set[k];
    return i.lo !== f.lo || i.hi !== f.hi || i.loOpen !== f.loOpen || i.hiOpen !== f.hiOpen;
  });
}

/**
 * For every step place, the numeric signals established on every way in: by the condition of each transition that
 * enters it (through the virtual places of parallel branches; from the start, the line-up). A contingency jump
 * (time limit, if-not) enters without its step's until holding, so it establishes nothing; a join establishes only
 * what every joined branch establishes at its end, since the branches end at different times.
 */
function entriesOf(analysis: StateAnalysis, graph: StepGraph, lineUp: readonly string[], establishes: (text: string, signal: string) => boolean): Map<string, Entry> {
  const known = entryMemo.get(analysis);
  if (known) return known;
  const { space } = analysis;
  const numeric = [...space.variables.values()].filter((v) => v.kind === 'number' && v.name !== 'elapsed').map((v) => v.name);
  const incoming = new Map<string, Transition[]>();
  for (const t of graph.transitions) for (const p of t.to) incoming.set(p, [...(incoming.get(p) ?? []), t]);
  const jumpedInto = new Set(analysis.contingencies.map((c) => graph.placeOfStep.get(c.target)).filter((p): p is string => !!p));
  const siblings = new Map<string, Transition[]>();
  for (const t of graph.transitions) {
    if (!t.choose) continue;
    const key = `${t.choose.path.join('.')}|${t.from.join(',')}`;
    siblings.set(key, [...(siblings.get(key) ?? []), t]);
  }
  const placeKind = new Map(graph.places.map((p) => [p.id, p.kind]));
  const byGuard = (t: Transition): Set<string> => {
    const out = new Set<string>();
    for (const g of t.guard) {
      if (g.kind === 'until' || g.kind === 'when') {
        for (const n of numeric) if (establishes(g.text, n)) out.add(n);
      } else if (g.kind === 'otherwise' && t.choose) {
        // The branch taken when no other holds: it establishes what the complement of the others pins down.
        const others = (siblings.get(`${t.choose.path.join('.')}|${t.from.join(',')}`) ?? []).filter((s) => s !== t)
          .flatMap((s) => s.guard.filter((p) => p.kind === 'when').map((p) => analysis.regionOf(p.text)));
        if (!others.length || others.some((r) => r === undefined)) continue;
        const rest = space.not((others as Region[]).reduce<Region>((a, b) => space.or(a, b), []));
        for (const n of numeric) if (rest.length && rest.every((b) => limits(b.get(n), space.full(space.variables.get(n)!)))) out.add(n);
      }
    }
    return out;
  };
  const lineUpFresh = new Set(numeric.filter((n) => lineUp.some((l) => establishes(l, n))));
  const memo = new Map<string, Set<string>>();
  // What holds when the place is entered, through virtual places (start, branch entry and end) back to real steps.
  const via = (place: string, visiting: Set<string>): { fresh: Set<string>; join: boolean } => {
    const kind = placeKind.get(place);
    if (kind === 'start') return { fresh: lineUpFresh, join: false };
    let fresh: Set<string> | undefined;
    let join = false;
    for (const t of incoming.get(place) ?? []) {
      let here = byGuard(t);
      const virtual = t.from.filter((p) => placeKind.get(p) !== 'step');
      if (virtual.length && virtual.length === t.from.length) {
        // Only virtual places before it: what they hold carries through (for a join, what all of them hold).
        let carried: Set<string> | undefined;
        for (const p of virtual) {
          if (visiting.has(p)) { carried = new Set(); break; }
          let c = memo.get(p);
          if (!c) {
            visiting.add(p);
            const r = via(p, visiting);
            visiting.delete(p);
            c = r.fresh;
            join ||= r.join;
            memo.set(p, c);
          }
          carried = carried ? new Set([...carried].filter((n) => c!.has(n))) : new Set(c);
        }
        if (t.from.length > 1) join = true;
        here = new Set([...here, ...(carried ?? [])]);
      } else if (t.from.length > 1) join = true;
      fresh = fresh ? new Set([...fresh].filter((n) => here.has(n))) : here;
    }
    return { fresh: fresh ?? new Set(), join };
  };
  const out = new Map<string, Entry>();
  for (const p of graph.places) {
    if (p.kind !== 'step') continue;
    const r = via(p.id, new Set([p.id]));
    const jump = jumpedInto.has(p.id);
    out.set(p.id, { fresh: jump ? new Set() : r.fresh, entry: jump ? 'jump' : r.join ? 'join' : 'plain' });
  }
  entryMemo.set(analysis, out);
  return out;
}

/** Walks the path back from the step before the last to the step that last established the signal. */
function lastEstablished(signal: string, path: string[], graph: StepGraph, lineUp: readonly string[], establishes: (text: string, signal: string) => boolean): OldReading {
  const stepAt = (id: string): Step | undefined => {
    const place = graph.placeOfStep.get(id.split(' (')[0]);
    return graph.places.find((p) => p.id === place)?.step;
  };
  for (let i = path.length - 2; i >= 0; i--) {
    const step = stepAt(path[i]);
    if (!step) continue;
    // Left by a contingency jump, the step's until did not hold.
    const jumped = path[i + 1]?.includes(' (jump from ');
    if (!jumped && step.until && establishes(step.until.value, signal)) return { signal, step: step.id, by: 'until' };
    const place = graph.placeOfStep.get(step.id);
    const when = graph.transitions.find((t) => place && t.from.includes(place) && t.guard.some((g) => g.kind === 'when' && establishes(g.text, signal)));
    if (when && !jumped) return { signal, step: step.id, by: 'when' };
    if (step.set.some((s) => s.signal === signal)) return { signal, step: step.id, by: 'set' };
    if (step.needs && establishes(step.needs.value, signal)) return { signal, step: step.id, by: 'needs' };
  }
  return { signal, by: lineUp.some((l) => establishes(l, signal)) ? 'line-up' : 'range' };
}
