// What a soundness analysis finds: the problems with their firing sequences, and which places are dead.
import type { Transition } from '../step-graph.ts';

export type ProblemKind = 'unsafe' | 'stuck' | 'improper';

export interface SoundnessProblem {
  /** unsafe: a place can hold two tokens; stuck: the end can no longer be reached; improper: the end is reached with steps still active. */
  kind: ProblemKind;
  /** Firings from the start to the marking that shows the problem. */
  path: Transition[];
  /** unsafe: the place activated twice; otherwise the places active in that marking. */
  places: string[];
}

export interface RegionReport {
  /** '' for the whole procedure, else the parallel-branch key. */
  region: string;
  method: 'by-construction' | 'state-machine' | 'explored';
  states: number;
  exceeded: boolean;
}

export interface SoundnessResult {
  method: 'structural' | 'explicit';
  /** False when a state budget ran out: then the findings are incomplete. */
  complete: boolean;
  states: number;
  regions: RegionReport[];
  problems: SoundnessProblem[];
  /** Places no run can mark (step-graph place ids). */
  deadPlaces: Set<string>;
  /** Transitions no run can fire (step-graph transition ids). */
  deadTransitions: Set<string>;
}

/** The comparable core of a result, used to check that both methods agree. */
export function summarize(result: SoundnessResult): { unsafe: boolean; stuck: boolean; improper: boolean; dead: string[] } {
  const has = (k: ProblemKind) => result.problems.some((p) => p.kind === k);
  return { unsafe: has('unsafe'), stuck: has('stuck'), improper: has('improper'), dead: [...result.deadPlaces].sort() };
}
