// Procedure → the compact step plan the placekeeping script reads from the step table's data attribute.
import type { HazardLevel, Procedure, SequenceItem } from '../model/procedure.ts';

/** One item of a sequence: a step id, a parallel block or a decision, keyed by its YAML path. */
export type PlanItem =
  | { step: string }
  | { parallel: string; branches: Array<{ name: string; items: PlanItem[] }> }
  | { choose: string; branches: PlanBranch[] };

export interface PlanBranch {
  /** The branch condition as written, or absent for `otherwise`. */
  when?: string;
  otherwise?: boolean;
  items?: PlanItem[];
  goto?: string;
}

export interface PlanHazard {
  level: HazardLevel;
  hazard: string;
  consequence?: string;
  avoid?: string;
  at: string[];
}

export interface PlacekeepingPlan {
  id: string;
  revision: number;
  items: PlanItem[];
  hazards: PlanHazard[];
}

export function placekeepingPlan(procedure: Procedure): PlacekeepingPlan {
  return {
    id: procedure.id,
    revision: procedure.revision,
    items: planSequence(procedure.steps),
    hazards: procedure.hazards.map((h) => ({
      level: h.level,
      hazard: h.hazard,
      ...(h.consequence ? { consequence: h.consequence } : {}),
      ...(h.avoid ? { avoid: h.avoid } : {}),
      at: h.at.map((a) => a.value),
    })),
  };
}

function planSequence(items: SequenceItem[]): PlanItem[] {
  return items.map((item): PlanItem => {
    if (item.kind === 'step') return { step: item.id };
    const key = item.path.join('.');
    if (item.kind === 'parallel') {
      return { parallel: key, branches: item.branches.map((b) => ({ name: b.name, items: planSequence(b.items) })) };
    }
    return {
      choose: key,
      branches: item.branches.map((b) => ({
        ...(b.when ? { when: b.when.value } : {}),
        ...(b.otherwise ? { otherwise: true } : {}),
        ...(b.items ? { items: planSequence(b.items) } : {}),
        ...(b.goto ? { goto: b.goto.value } : {}),
      })),
    };
  });
}
