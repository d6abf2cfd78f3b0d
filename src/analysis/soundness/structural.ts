// The structural method: parallel blocks that no jump crosses are single-entry single-exit regions, analysed
// once each and then seen from outside as one place; only regions that jumps make unstructured are explored.
// A region without jumps whose blocks all complete is sound by construction, so a structured procedure costs
// one pass over its graph (Vanhatalo, Völzer, Koehler 2009: well-structured fragments are sound).
import type { Place, StepGraph, Transition } from '../step-graph.ts';
import { explore, type Exploration, type Game } from './token-game.ts';
import type { RegionReport, SoundnessProblem, SoundnessResult } from './verdict.ts';
import { defaultStateBudget } from './explicit.ts';

interface RegionSummary {
  region: string;
  game: Game;
  method: RegionReport['method'];
  canExit: boolean;
  /** Whether the block of each macro place can complete. */
  completes: Map<string, boolean>;
  run?: Exploration;
  exceeded: boolean;
  problems: SoundnessProblem[];
  /** Firings from the region's entry to the first marking of a game place. */
  pathTo(place: number): Transition[];
  marked(place: number): boolean;
}

const blockOf = (key: string) => key.slice(0, key.lastIndexOf('/'));
export const macroPrefix = 'block:';

/** The scope a jump logically starts from: a decision right after a parallel block sits outside it. */
function sourceScope(place: Place): string[] {
  return place.kind === 'branch-done' ? place.scope.slice(0, -1) : place.scope;
}

export function structuralSoundness(graph: StepGraph, budget = defaultStateBudget): SoundnessResult {
  const placeById = new Map(graph.places.map((p) => [p.id, p]));
  const depthOf = new Map<string, number>([['', 0]]);
  const branchesOf = new Map<string, Set<string>>();
  for (const p of graph.places) {
    p.scope.forEach((key, i) => {
      depthOf.set(key, i + 1);
      const block = blockOf(key);
      if (!branchesOf.has(block)) branchesOf.set(block, new Set());
      branchesOf.get(block)!.add(key);
    });
  }
  const inSubtree = (scope: string[], region: string) => region === '' || scope[depthOf.get(region)! - 1] === region;

  // Jumps between scopes, and the blocks they cross: those blocks stay open; every other block is collapsed.
  const tainted = new Set<string>();
  const unstructured = new Set<string>();
  for (const t of graph.transitions) {
    if (!t.jump?.resolved || !t.from.length || !t.to.length) continue;
    const source = sourceScope(placeById.get(t.from[0])!);
    const target = placeById.get(t.to[0])!.scope;
    if (source.join('|') === target.join('|')) continue;
    let common = 0;
    while (common < source.length && common < target.length && source[common] === target[common]) common++;
    for (const end of [source, target]) for (let i = common; i < end.length; i++) tainted.add(blockOf(end[i]));
    unstructured.add(common === 0 ? '' : source[common - 1]);
  }

  const summaries = new Map<string, RegionSummary>();
  const analyse = (region: string): RegionSummary => {
    const known = summaries.get(region);
    if (known) return known;
    const depth = depthOf.get(region) ?? 0;
    const rep = (p: Place): string => {
      for (let i = depth; i < p.scope.length; i++) {
        const block = blockOf(p.scope[i]);
        if (!tainted.has(block)) return macroPrefix + block;
      }
      return p.id;
    };
    const names: string[] = [];
    const number = new Map<string, number>();
    const numberOf = (name: string) => {
      let n = number.get(name);
      if (n === undefined) {
        n = names.length;
        names.push(name);
        number.set(name, n);
      }
      return n;
    };
    const repOf = new Map<string, number>();
    for (const p of graph.places) if (inSubtree(p.scope, region)) repOf.set(p.id, numberOf(rep(p)));

    const completes = new Map<string, boolean>();
    for (const name of names) {
      if (!name.startsWith(macroPrefix)) continue;
      const block = name.slice(macroPrefix.length);
      completes.set(name, [...branchesOf.get(block)!].every((key) => analyse(key).canExit));
    }

    let entry: number | undefined;
    let exit: number | undefined;
    if (region === '') {
      entry = repOf.get(graph.start);
      exit = repOf.get(graph.end);
    }
    const transitions: Game['transitions'] = [];
    for (const t of graph.transitions) {
      const inside = [...t.from, ...t.to].every((id) => repOf.has(id));
      if (!inside) {
        // The fork into this branch names its head; the head is the region's entry.
        if (region !== '' && !t.jump) {
          for (const id of t.to) {
            const p = placeById.get(id)!;
            if (p.scope.length === depth && p.scope[depth - 1] === region) entry = repOf.get(id);
          }
        }
        continue;
      }
      const from = [...new Set(t.from.map((id) => repOf.get(id)!))];
      const to = [...new Set(t.to.map((id) => repOf.get(id)!))];
      if (from.length === 1 && to.length === 1 && from[0] === to[0] && names[from[0]].startsWith(macroPrefix)) continue;
      if (from.some((f) => completes.get(names[f]) === false)) continue;
      transitions.push({ from, to, source: t });
    }
    if (region !== '') {
      const done = graph.places.find((p) => p.kind === 'branch-done' && p.scope.length === depth && p.scope[depth - 1] === region);
      exit = done ? repOf.get(done.id) : undefined;
    }
    const game: Game = { places: names, transitions, entry: entry ?? 0, exit: exit ?? 0 };

    const byConstruction = !transitions.some((t) => t.source.jump) && [...completes.values()].every(Boolean) && entry !== undefined && exit !== undefined;
    let run: Exploration | undefined;
    const runGame = () => (run ??= explore(game, budget));
    const summary: RegionSummary = {
      region, game, completes, problems: [], exceeded: false,
      method: byConstruction ? 'by-construction' : transitions.every((t) => t.from.length === 1 && t.to.length === 1) ? 'state-machine' : 'explored',
      canExit: true,
      pathTo: (place) => runGame().pathTo(place),
      marked: (place) => byConstruction || runGame().firstMarked[place] >= 0,
    };
    if (!byConstruction) {
      const r = runGame();
      summary.run = r;
      summary.exceeded = r.exceeded;
      summary.canExit = r.exitReached || r.exceeded;
      if (r.unsafe) summary.problems.push({ kind: 'unsafe', path: r.unsafe.path, places: [r.unsafe.place] });
      // A block that can never complete is explained inside it; do not blame the region around it too.
      if (r.stuck && !r.stuck.active.some((a) => completes.get(a) === false)) summary.problems.push({ kind: 'stuck', path: r.stuck.path, places: r.stuck.active });
      if (r.improper) summary.problems.push({ kind: 'improper', path: r.improper.path, places: r.improper.active });
    }
    summaries.set(region, summary);
    return summary;
  };

  // Walk down from the whole procedure into the blocks a run can reach, joining firing sequences on the way.
  const problems: SoundnessProblem[] = [];
  const deadPlaces = new Set<string>();
  const regions: RegionReport[] = [];
  const collect = (region: string, prefix: () => Transition[]) => {
    const s = analyse(region);
    regions.push({ region, method: s.method, states: s.run?.states ?? 0, exceeded: s.exceeded });
    for (const p of s.problems) problems.push({ ...p, path: [...prefix(), ...p.path] });
    s.game.places.forEach((name, i) => {
      const isMacro = name.startsWith(macroPrefix);
      if (!s.marked(i)) {
        if (!isMacro) deadPlaces.add(name);
        else {
          const block = name.slice(macroPrefix.length);
          for (const p of graph.places) if (p.scope.some((k) => blockOf(k) === block)) deadPlaces.add(p.id);
        }
        return;
      }
      if (!isMacro) return;
      let here: Transition[] | undefined;
      const reach = () => (here ??= [...prefix(), ...s.pathTo(i)]);
      for (const key of branchesOf.get(name.slice(macroPrefix.length))!) collect(key, reach);
    });
  };
  collect('', () => []);

  const deadTransitions = new Set(graph.transitions.filter((t) => t.from.some((f) => deadPlaces.has(f))).map((t) => t.id));
  const exceeded = regions.some((r) => r.exceeded);
  return {
    method: 'structural', complete: !exceeded, states: regions.reduce((n, r) => n + r.states, 0),
    regions, problems, deadPlaces: exceeded ? new Set() : deadPlaces, deadTransitions,
  };
}
