// The explicit method: plays the token game over the whole step graph, from one token in start, within a budget.
import type { StepGraph } from '../step-graph.ts';
import { explore, type Game } from './token-game.ts';
import type { SoundnessProblem, SoundnessResult } from './verdict.ts';

export const defaultStateBudget = 50_000;

export function exploreSoundness(graph: StepGraph, budget = defaultStateBudget): SoundnessResult {
  const number = new Map(graph.places.map((p, i) => [p.id, i]));
  const game: Game = {
    places: graph.places.map((p) => p.id),
    transitions: graph.transitions.map((t) => ({ from: t.from.map((f) => number.get(f)!), to: t.to.map((p) => number.get(p)!), source: t })),
    entry: number.get(graph.start)!,
    exit: number.get(graph.end)!,
  };
  const run = explore(game, budget);
  const problems: SoundnessProblem[] = [];
  if (run.unsafe) problems.push({ kind: 'unsafe', path: run.unsafe.path, places: [run.unsafe.place] });
  if (run.stuck) problems.push({ kind: 'stuck', path: run.stuck.path, places: run.stuck.active });
  if (run.improper) problems.push({ kind: 'improper', path: run.improper.path, places: run.improper.active });
  const deadPlaces = new Set<string>();
  const deadTransitions = new Set<string>();
  if (!run.exceeded) {
    graph.places.forEach((p, i) => run.firstMarked[i] < 0 && deadPlaces.add(p.id));
    graph.transitions.forEach((t, i) => !run.fired[i] && deadTransitions.add(t.id));
  }
  return {
    method: 'explicit', complete: !run.exceeded, states: run.states,
    regions: [{ region: '', method: 'explored', states: run.states, exceeded: run.exceeded }],
    problems, deadPlaces, deadTransitions,
  };
}
