// The structural method: parallel blocks that no jump crosses are single-entry single-exit regions, analysed
// once each and then seen from outside as one place; only regions that jumps make unstructured are explored.
// A region without jumps whose blocks all complete is sound by construction, so a structured procedure costs
// one pass over its graph (Vanhatalo, Völzer, Koehler 2009: well-structured fragments are sound). A block may be
// seen as one place only while it is such a fragment: blocks inside a block that a jump crosses, and branches
// that can end with tokens left in them, are played out in the region around them, so that both methods reach
// the same verdict (tests/analysis/soundness-methods.test.ts).
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
/** One branch seen as one place, inside a block that is played out only because a sibling branch ends unevenly. */
export const branchPrefix = 'branch:';

/** The scope a jump logically starts from: a decision right after a parallel block sits outside it. */
function sourceScope(place: Place): string[] {
  return place.kind === 'branch-done' ? place.scope.slice(0, -1) : place.scope;
}

const summarised = (name: string) => name.startsWith(macroPrefix) || name.startsWith(branchPrefix);
/** The branches a place seen as one stands for. */
const branchesBehind = (name: string, branchesOf: Map<string, Set<string>>): string[] =>
  name.startsWith(macroPrefix) ? [...branchesOf.get(name.slice(macroPrefix.length))!] : [name.slice(branchPrefix.length)];

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
  // A jump out of a branch leaves the tokens of its sibling branches behind, however deep inside the block they
  // are (IEC 60848: a simultaneous divergence ends only at its convergence). A block inside such a branch can be
  // abandoned half way, so it is no single-entry single-exit fragment either: every block inside a block that a
  // jump crosses is played out too.
  for (const p of graph.places) {
    const first = p.scope.findIndex((key) => tainted.has(blockOf(key)));
    if (first >= 0) for (let i = first + 1; i < p.scope.length; i++) tainted.add(blockOf(p.scope[i]));
  }
  const crossed = new Set(tainted);
  // Branches that can end with tokens still inside them (see below): their blocks are played out as well, but
  // only these branches in full; no jump crosses their siblings, which are still one place each.
  const uneven = new Set<string>();
  const isOpen = (key: string) => crossed.has(blockOf(key)) || uneven.has(key);

  // Indexes so that each region touches only its own places and transitions: linear overall.
  const regionOf = (p: Place) => p.scope[p.scope.length - 1] ?? '';
  const placesIn = new Map<string, Place[]>();
  const childBlocks = new Map<string, Set<string>>();
  const doneOf = new Map<string, string>();
  for (const p of graph.places) {
    const r = regionOf(p);
    if (!placesIn.has(r)) placesIn.set(r, []);
    placesIn.get(r)!.push(p);
    if (p.kind === 'branch-done') doneOf.set(r, p.id);
    p.scope.forEach((key, i) => {
      const parent = i === 0 ? '' : p.scope[i - 1];
      if (!childBlocks.has(parent)) childBlocks.set(parent, new Set());
      childBlocks.get(parent)!.add(blockOf(key));
    });
  }
  const transitionsAt = new Map<string, Transition[]>();
  const headOf = new Map<string, string>();
  for (const t of graph.transitions) {
    const scopes = [...t.from, ...t.to].map((id) => placeById.get(id)!.scope);
    let common = scopes.length ? scopes[0].length : 0;
    for (const sc of scopes) {
      let i = 0;
      while (i < common && i < sc.length && sc[i] === scopes[0][i]) i++;
      common = i;
    }
    const home = common === 0 ? '' : scopes[0][common - 1];
    if (!transitionsAt.has(home)) transitionsAt.set(home, []);
    transitionsAt.get(home)!.push(t);
    // A fork names the head of each branch it starts: that head is the branch's entry.
    if (!t.jump) for (const id of t.to) {
      const p = placeById.get(id)!;
      if (p.scope.length === common + 1) headOf.set(regionOf(p), p.id);
    }
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
        if (!isOpen(p.scope[i])) return branchPrefix + p.scope[i];
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
    // This region and the branches that jumps keep open, recursively; other blocks (or branches) are one place each.
    const open = [region];
    for (let i = 0; i < open.length; i++) {
      for (const block of childBlocks.get(open[i]) ?? []) if (tainted.has(block)) open.push(...[...branchesOf.get(block)!].filter(isOpen));
    }
    const repOf = new Map<string, number>();
    const repNumber = (id: string) => {
      let n = repOf.get(id);
      if (n === undefined) {
        n = numberOf(rep(placeById.get(id)!));
        repOf.set(id, n);
      }
      return n;
    };
    for (const r of open) for (const p of placesIn.get(r) ?? []) repNumber(p.id);
    for (const r of open) {
      for (const block of childBlocks.get(r) ?? []) {
        if (!tainted.has(block)) numberOf(macroPrefix + block);
        else for (const key of branchesOf.get(block)!) if (!isOpen(key)) numberOf(branchPrefix + key);
      }
    }

    const completes = new Map<string, boolean>();
    for (const name of names) {
      if (name.startsWith(macroPrefix)) completes.set(name, [...branchesOf.get(name.slice(macroPrefix.length))!].every((key) => analyse(key).canExit));
      else if (name.startsWith(branchPrefix)) completes.set(name, analyse(name.slice(branchPrefix.length)).canExit);
    }

    const entryId = region === '' ? graph.start : headOf.get(region);
    const exitId = region === '' ? graph.end : doneOf.get(region);
    const entry = entryId === undefined ? undefined : repNumber(entryId);
    const exit = exitId === undefined ? undefined : repNumber(exitId);
    const transitions: Game['transitions'] = [];
    for (const r of open) {
      for (const t of transitionsAt.get(r) ?? []) {
        const from = [...new Set(t.from.map(repNumber))];
        const to = [...new Set(t.to.map(repNumber))];
        if (from.length === 1 && to.length === 1 && from[0] === to[0] && summarised(names[from[0]])) continue;
        if (from.some((f) => completes.get(names[f]) === false)) continue;
        transitions.push({ from, to, source: t });
      }
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
      const isMacro = summarised(name);
      if (!s.marked(i)) {
        if (!isMacro) deadPlaces.add(name);
        else {
          const keys = new Set(branchesBehind(name, branchesOf));
          for (const p of graph.places) if (p.scope.some((k) => keys.has(k))) deadPlaces.add(p.id);
        }
        return;
      }
      if (!isMacro) return;
      let here: Transition[] | undefined;
      const reach = () => (here ??= [...prefix(), ...s.pathTo(i)]);
      for (const key of branchesBehind(name, branchesOf)) collect(key, reach);
    });
  };
  // A branch that can reach its end with tokens still inside it (left behind by a jump out of a nested branch)
  // does not complete cleanly: seen from outside as one place, those tokens would vanish at the join, and its
  // "improper" would be judged at the branch's end instead of the procedure's (which a run may never reach).
  // Such a branch is played out in the region around it instead (its siblings, which no jump crosses, stay one
  // place each: only the join meets them), until every block or branch still seen as one place completes
  // cleanly; then only the whole procedure can be improper. Structured procedures never go round this twice.
  let discarded = 0;
  for (;;) {
    collect('', () => []);
    const dirty = regions.filter((r) => r.region !== '' && summaries.get(r.region)!.problems.some((p) => p.kind === 'improper'));
    if (!dirty.length) break;
    for (const r of dirty) {
      uneven.add(r.region);
      tainted.add(blockOf(r.region));
    }
    discarded += regions.reduce((n, r) => n + r.states, 0);
    summaries.clear();
    problems.length = 0;
    regions.length = 0;
    deadPlaces.clear();
  }

  const deadTransitions = new Set(graph.transitions.filter((t) => t.from.some((f) => deadPlaces.has(f))).map((t) => t.id));
  const exceeded = regions.some((r) => r.exceeded);
  return {
    method: 'structural', complete: !exceeded, states: discarded + regions.reduce((n, r) => n + r.states, 0),
    regions, problems, deadPlaces: exceeded ? new Set() : deadPlaces, deadTransitions,
  };
}
