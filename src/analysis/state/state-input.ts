// What the state analysis reads: a small interface, filled from a procedure (and, where there is one, the
// plant register), so that the analysis does not depend on where the facts were declared.
import type { Procedure, StateAction, Step } from '../../model/procedure.ts';
import type { SignalInfo } from '../decisions/signal-space.ts';
import { compileStepGraph, type StepGraph } from '../step-graph.ts';

export interface TripInput {
  tag: string;
  latches: boolean;
  /** Outputs the trip forces while in force. */
  holds: Array<{ signal: string; value: string }>;
}

export interface StateInput {
  signals: Readonly<Record<string, SignalInfo>>;
  trips: TripInput[];
  /** Conditions true before the first step. */
  lineUp: string[];
  /** Latching trips that may already be in force at the start (an emergency procedure starts after a trip). */
  latchedAtStart: string[];
  graph: StepGraph;
  /**
   * A reset that clears more than the trip it names: the trips that share one latch (each starts the same latching
   * function), by the name a step resets (one of them, or the function itself).
   */
  resetsAlso?: ReadonlyMap<string, string[]>;
}

/** Emergency procedures start when something has gone wrong: any latching trip may be in force. */
export const startsAfterTrip = new Set(['emergency', 'emergency-shutdown']);

export function stateInputOf(procedure: Procedure, graph: StepGraph = compileStepGraph(procedure)): StateInput {
  const trips = procedure.interlocks.map((i) => ({ tag: i.tag, latches: i.latches, holds: i.holds.map((h) => ({ signal: h.signal, value: h.value })) }));
  return {
    signals: procedure.signals,
    trips,
    lineUp: (procedure.lineUp ?? []).map((l) => l.value),
    latchedAtStart: startsAfterTrip.has(procedure.kind) ? trips.filter((t) => t.latches).map((t) => t.tag) : [],
    graph,
    resetsAlso: sharedLatches(procedure),
  };
}

/** Each trip that latches through a function, and the function, mapped to every trip latching through it. */
export function sharedLatches(procedure: Procedure): Map<string, string[]> {
  const by = new Map<string, string[]>();
  for (const i of procedure.interlocks) if (i.latches && i.latchesThrough) by.set(i.latchesThrough, [...(by.get(i.latchesThrough) ?? []), i.tag]);
  const out = new Map<string, string[]>();
  for (const [fn, tags] of by) {
    out.set(fn, tags);
    for (const t of tags) out.set(t, tags);
  }
  return out;
}

/** The variable that says whether a latching trip is in force; ':' never occurs in a signal name. */
export const tripVariable = (tag: string): string => `trip:${tag}`;
export const latched = 'latched';
export const clear = 'clear';

export function storedActions(step: Step): StateAction[] {
  return (step.state ?? []).filter((a) => a.lasts === 'stored' || (a.lasts === 'delayed' && !a.whileActive));
}

export function activeOnlyActions(step: Step): StateAction[] {
  return (step.state ?? []).filter((a) => a.lasts === 'step' || a.lasts === 'limited' || (a.lasts === 'delayed' && a.whileActive));
}
