// The cycle-time section of a procedure page: figures, critical path with step numbers, timeline, and caveats.
import { estimateCycleTime, formatSeconds } from '../analysis/cycle-time.ts';
import { inlineCalls, inlineSeparator } from '../analysis/inline-calls.ts';
import type { Procedure } from '../model/procedure.ts';
import { numberSteps } from './step-numbers.ts';
import { renderTimelineSvg } from './timeline-svg.ts';

export interface CycleTimeView {
  shortest: string;
  typical: string;
  longest: string;
  /** The critical path; steps of called procedures carry the call step they run under. */
  criticalPath: Array<{ id: string; number?: string; label: string; href: string }>;
  timelineSvg: string;
  notes: string[];
  stepsTimed: number;
  stepsTotal: number;
  /** Procedures expanded into this estimate. */
  inlined: string[];
}

/** Undefined when no step has an `expect` duration: then there is nothing to show. */
export function buildCycleTimeView(procedure: Procedure, lookup: (id: string) => Procedure | undefined): CycleTimeView | undefined {
  const { procedure: expanded, inlined } = inlineCalls(procedure, lookup);
  const cycle = estimateCycleTime(expanded);
  if (cycle.stepsTimed === 0) return undefined;
  const numbers = numberSteps(procedure.steps);
  // A called step links to the row of the call step that runs it.
  const ownStep = (id: string) => id.split(inlineSeparator)[0];
  return {
    shortest: formatSeconds(cycle.shortest),
    typical: formatSeconds(cycle.typical),
    longest: formatSeconds(cycle.longest),
    criticalPath: cycle.criticalPath.map((id) => ({
      id, number: numbers.ofStep.get(ownStep(id)), label: id.split(inlineSeparator).join(' → '), href: `#step-${ownStep(id)}`,
    })),
    timelineSvg: renderTimelineSvg(cycle, { title: `Timeline of a typical run of ${procedure.id}: ${formatSeconds(cycle.typical)}`, hrefOf: (id) => `#step-${ownStep(id)}` }),
    notes: cycle.notes.map((n) => n.message),
    stepsTimed: cycle.stepsTimed,
    stepsTotal: cycle.stepsTotal,
    inlined,
  };
}
