// One soundness analysis per procedure, shared by the sequence rules and --explain; plus the words and
// places the rules need to tell the operator's author what happens ("after heat-up → sample → ...").
import type { PathKey } from '../../parse/read-source.ts';
import type { ChooseBlock, ParallelBlock } from '../../model/procedure.ts';
import { parallelScopeKey, walkBlocks } from '../../model/walk-steps.ts';
import type { ProcedureFacts } from '../procedure-facts.ts';
import type { Place, StepGraph, Transition } from '../step-graph.ts';
import { findLoops, type Loop } from './loops.ts';
import { branchPrefix, macroPrefix, structuralSoundness } from './structural.ts';
import type { SoundnessResult } from './verdict.ts';
import { RuleMemo } from '../rule-memo.ts';

export interface SequenceAnalysis {
  graph: StepGraph;
  /** Null when the sequence cannot be analysed yet (a jump to an unknown step). */
  result: SoundnessResult | null;
  loops: Loop[];
  /** Loops that nothing leaves. */
  endless: Loop[];
}

const cache = new RuleMemo<ProcedureFacts, SequenceAnalysis>();

export function analyseSequence(facts: ProcedureFacts): SequenceAnalysis {
  const known = cache.get(facts);
  if (known) return known;
  const graph = facts.graph;
  const unresolved = graph.transitions.some((t) => t.jump && !t.jump.resolved);
  const loops = unresolved ? [] : findLoops(graph);
  const analysis: SequenceAnalysis = {
    graph,
    result: unresolved ? null : structuralSoundness(graph),
    loops,
    endless: loops.filter((l) => l.exits.length === 0),
  };
  cache.set(facts, analysis);
  return analysis;
}

/** What the author sees of a run: steps as they become active, and the decisions taken. */
export function traceWords(path: Transition[], graph: StepGraph): string[] {
  const byId = new Map(graph.places.map((p) => [p.id, p]));
  const words: string[] = [];
  for (const t of path) {
    for (const g of t.guard) if (g.kind === 'when' || g.kind === 'otherwise') words.push(g.text);
    // Steps started together by a parallel block are one event: "check-vent + check-seal".
    const started = t.to.map((id) => byId.get(id)).filter((p) => p?.kind === 'step').map((p) => p!.label || p!.id);
    if (started.length) words.push(started.join(' + '));
  }
  return words;
}

/** "heat-up → sample → lab-result == fail → heat-up", keeping the last steps of a long run. */
export function showTrace(words: string[], keep = 8): string {
  if (!words.length) return 'the start';
  return (words.length > keep ? ['…', ...words.slice(-keep)] : words).join(' → ');
}

export interface PlaceLocator {
  /** Where a place is written: a step's id, a parallel branch, a collapsed block. */
  pathOf(place: string): PathKey[] | undefined;
  describe(place: string): string;
  place(id: string): Place | undefined;
  /** Where the decision or jump a transition takes is written. */
  causePath(t: Transition): PathKey[] | undefined;
  /** Whether a jump leaves or enters a parallel branch (goto-crosses-parallel reports the jump itself). */
  crossesParallel(t: Transition): boolean;
  /** Branches of parallel blocks that hold no active place while a sibling does: what a join waits for. */
  idleBranches(active: string[]): Array<{ block: ParallelBlock; name: string; path: PathKey[] }>;
}

export function locatePlaces(facts: ProcedureFacts): PlaceLocator {
  const graph = facts.graph;
  const byId = new Map(graph.places.map((p) => [p.id, p]));
  const branches = new Map<string, { block: ParallelBlock; name: string; path: PathKey[] }>();
  const blocks = new Map<string, ParallelBlock>();
  const chooses = new Map<string, ChooseBlock>();
  for (const b of walkBlocks(facts.procedure.steps)) {
    if (b.kind === 'choose') chooses.set(b.path.join('.'), b);
    else {
      blocks.set(b.path.join('.'), b);
      for (const br of b.branches) branches.set(parallelScopeKey(b, br.name), { block: b, name: br.name, path: br.path });
    }
  }
  const scopeOf = (p: Place) => (p.kind === 'branch-done' ? p.scope.slice(0, -1) : p.scope);
  // A branch seen as one place by the structural method is active in that branch (and the ones around it).
  const branchScope = new Map<string, string[]>();
  for (const p of graph.places) p.scope.forEach((key, i) => branchScope.set(key, p.scope.slice(0, i + 1)));
  const activeScope = (id: string) => (id.startsWith(branchPrefix) ? branchScope.get(id.slice(branchPrefix.length)) : byId.get(id)?.scope) ?? [];
  const locator: PlaceLocator = {
    place: (id) => byId.get(id),
    pathOf(id) {
      if (id.startsWith(macroPrefix)) return blocks.get(id.slice(macroPrefix.length))?.path;
      if (id.startsWith(branchPrefix)) return branches.get(id.slice(branchPrefix.length))?.path;
      const p = byId.get(id);
      if (!p) return undefined;
      if (p.kind === 'step' && p.step) return [...p.step.path, 'step'];
      const key = p.scope[p.scope.length - 1];
      return key ? branches.get(key)?.path : undefined;
    },
    describe(id) {
      if (id.startsWith(macroPrefix)) {
        const block = blocks.get(id.slice(macroPrefix.length));
        return `the parallel block (${block?.branches.map((b) => b.name).join(', ')})`;
      }
      if (id.startsWith(branchPrefix)) return `branch '${branches.get(id.slice(branchPrefix.length))?.name}'`;
      const p = byId.get(id);
      if (!p) return id;
      if (p.kind === 'step') return `step '${p.label}'`;
      if (p.kind === 'end') return 'the end';
      if (p.kind === 'start') return 'the start';
      const key = p.scope[p.scope.length - 1];
      const branch = key ? branches.get(key) : undefined;
      return p.kind === 'branch-done' ? `the end of branch '${branch?.name}'` : `the start of branch '${branch?.name}'`;
    },
    causePath(t) {
      if (t.jump) return t.jump.path;
      if (!t.choose) return undefined;
      const block = chooses.get(t.choose.path.join('.'));
      const branch = block?.branches[t.choose.branch];
      if (!branch) return t.choose.path;
      return branch.when ? branch.when.path : branch.otherwise ? [...branch.path, 'otherwise'] : branch.path;
    },
    idleBranches(active) {
      const busy = new Set(active.flatMap(activeScope));
      const idle: Array<{ block: ParallelBlock; name: string; path: PathKey[] }> = [];
      const seen = new Set<ParallelBlock>();
      for (const key of busy) {
        const branch = branches.get(key);
        if (!branch || seen.has(branch.block)) continue;
        seen.add(branch.block);
        for (const other of branch.block.branches) {
          if (!busy.has(parallelScopeKey(branch.block, other.name))) idle.push({ block: branch.block, name: other.name, path: other.path });
        }
      }
      return idle;
    },
    crossesParallel(t) {
      if (!t.jump?.resolved || !t.from.length || !t.to.length) return false;
      const from = byId.get(t.from[0]);
      const to = byId.get(t.to[0]);
      return !!from && !!to && scopeOf(from).join('|') !== to.scope.join('|');
    },
  };
  return locator;
}

/** The jump or decision that led into the problem: the last one taken (a jump first, for tokens that multiply). */
export function causeOf(path: Transition[], preferJump: boolean): Transition | undefined {
  if (preferJump) for (let i = path.length - 1; i >= 0; i--) if (path[i].jump) return path[i];
  for (let i = path.length - 1; i >= 0; i--) if (path[i].jump || path[i].choose) return path[i];
  return undefined;
}
