// Questions asked of the plant state at each step: can a hazard's condition hold, may a step's needs fail,
// does a step drive an output that a latched trip holds, does a step reset a trip whose cause can be present.
import type { Region } from '../decisions/signal-space.ts';
import type { Step } from '../../model/procedure.ts';
import type { StepGraph } from '../step-graph.ts';
import type { StateAnalysis } from './analyse-state.ts';
import { latched, tripVariable, type TripInput } from './state-input.ts';

export interface StateFinding {
  step: Step;
  /** The steps that lead there, first to last, ending with the step itself. */
  path: string[];
  /** The values at the step that make it true, in words. */
  values: string;
}

function steps(graph: StepGraph): Array<{ place: string; step: Step }> {
  return graph.places.filter((p) => p.kind === 'step' && p.step).map((p) => ({ place: p.id, step: p.step! }));
}

/** Steps at which the region can hold: the first such state found per step, with the path to it. */
export function stepsWhere(analysis: StateAnalysis, graph: StepGraph, region: Region): StateFinding[] {
  const out: StateFinding[] = [];
  for (const { place, step } of steps(graph)) {
    for (const view of analysis.views.get(place) ?? []) {
      const met = analysis.space.and([view.box], region);
      if (!met.length) continue;
      out.push({ step, path: analysis.pathTo(view.node), values: analysis.space.describe(restrict(met[0], region)) });
      break;
    }
  }
  return out;
}

/** Only the signals the condition names, so the message speaks about what matters. */
function restrict(box: Map<string, unknown>, region: Region): Map<string, never> {
  const named = new Set(region.flatMap((b) => [...b.keys()]));
  return new Map([...box].filter(([k]) => named.has(k))) as Map<string, never>;
}

export interface NeedFinding extends StateFinding {
  /** The latched trip that holds an output the step needs, when that is why. */
  trip?: string;
}

/** Steps whose `needs` may be false on some path. */
export function unmetNeeds(analysis: StateAnalysis, graph: StepGraph, trips: TripInput[]): NeedFinding[] {
  const out: NeedFinding[] = [];
  for (const { place, step } of steps(graph)) {
    if (!step.needs) continue;
    const need = analysis.regionOf(step.needs.value);
    if (!need) continue;
    const failing = analysis.space.not(need);
    for (const view of analysis.views.get(place) ?? []) {
      const met = analysis.space.and([view.box], failing);
      if (!met.length) continue;
      const trip = trips.find((t) => t.latches && isLatched(view.box, t.tag) && t.holds.some((h) => [...need.flatMap((b) => [...b.keys()])].includes(h.signal)));
      out.push({ step, path: analysis.pathTo(view.node), values: analysis.space.describe(restrict(met[0], need)), trip: trip?.tag });
      break;
    }
  }
  return out;
}

export interface HeldOutputFinding extends StateFinding {
  trip: string;
  signal: string;
  wanted: string;
  held: string;
}

/** Steps that drive an output to a value other than the one a latched trip holds it at. */
export function heldOutputConflicts(analysis: StateAnalysis, graph: StepGraph, trips: TripInput[]): HeldOutputFinding[] {
  const out: HeldOutputFinding[] = [];
  for (const { place, step } of steps(graph)) {
    const wanted = step.state ?? [];
    if (!wanted.length) continue;
    const done = new Set<string>();
    for (const view of analysis.views.get(place) ?? []) {
      for (const trip of trips) {
        if (!trip.latches || !isLatched(view.box, trip.tag)) continue;
        for (const h of trip.holds) {
          const a = wanted.find((w) => w.signal === h.signal && w.value !== h.value);
          const key = `${trip.tag}|${h.signal}`;
          if (!a || done.has(key) || (step.resets ?? []).some((r) => r.value === trip.tag)) continue;
          done.add(key);
          out.push({ step, path: analysis.pathTo(view.node), values: `${trip.tag} in force`, trip: trip.tag, signal: h.signal, wanted: a.value, held: h.value });
        }
      }
    }
  }
  return out;
}

export interface ResetFinding extends StateFinding {
  /** The latching trip whose condition can hold when the step resets it. */
  trip: string;
  /** The name the step resets: the trip itself, another trip sharing its latch, or the latching function. */
  reset: string;
}

/**
 * Steps that reset a latching trip while its condition can still hold there, on some path: the reset is tried with
 * the cause present. A step's own `needs` is taken as holding when it starts (step-need-unmet reports it where it may
 * not); `trips` maps each latching trip whose condition could be analysed to that condition as a region.
 */
export function resetsWithCausePresent(
  analysis: StateAnalysis, graph: StepGraph, trips: ReadonlyMap<string, Region>, causesOf: (reset: string) => string[] = (r) => [r],
): ResetFinding[] {
  const out: ResetFinding[] = [];
  for (const { place, step } of steps(graph)) {
    const resets = (step.resets ?? []).flatMap((r) => causesOf(r.value).filter((c) => trips.has(c)).map((c) => ({ value: c, reset: r.value })));
    if (!resets.length) continue;
    const need = step.needs ? analysis.regionOf(step.needs.value) : undefined;
    const done = new Set<string>();
    for (const view of analysis.views.get(place) ?? []) {
      const boxes = need ? analysis.space.and([view.box], need) : [view.box];
      if (!boxes.length) continue;
      for (const r of resets) {
        if (done.has(r.value)) continue;
        const cause = trips.get(r.value)!;
        const met = analysis.space.and(boxes, cause);
        if (!met.length) continue;
        done.add(r.value);
        out.push({ step, trip: r.value, reset: r.reset, path: analysis.pathTo(view.node), values: analysis.space.describe(restrict(met[0], cause)) });
      }
    }
  }
  return out;
}

function isLatched(box: Map<string, { kind: string; set: unknown }>, tag: string): boolean {
  const v = box.get(tripVariable(tag));
  return v?.kind === 'enum' && Array.isArray(v.set) && v.set.includes(latched);
}
