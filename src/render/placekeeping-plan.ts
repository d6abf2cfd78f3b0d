// Procedure → the compact step plan the placekeeping script reads from the step table's data attribute.
import type { HazardLevel, Procedure, SequenceItem } from '../model/procedure.ts';
import { numberSteps, type StepNumbers } from './step-numbers.ts';

/** One item of a sequence: a step id, a parallel block or a decision, keyed by its YAML path. */
export type PlanItem =
  | { step: string }
  | { parallel: string; number: string; branches: Array<{ name: string; letter: string; items: PlanItem[] }> }
  | { choose: string; number: string; branches: PlanBranch[] };

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
  /** Step id → the hierarchical number the chart and table print (3A.1 …). */
  numbers: Record<string, string>;
  hazards: PlanHazard[];
  /**
   * Step id → where its contingency (`if-not`) sends the operator, when it names a step in the same branch
   * (placekeeping offers that jump; a response without a jump is read from the table).
   */
  ifNot: Record<string, string>;
}

export function placekeepingPlan(procedure: Procedure): PlacekeepingPlan {
  const numbers = numberSteps(procedure.steps);
  return {
    id: procedure.id,
    revision: procedure.revision,
    items: planSequence(procedure.steps, numbers),
    numbers: Object.fromEntries(numbers.ofStep),
    hazards: procedure.hazards.map((h) => ({
      level: h.level,
      hazard: h.hazard,
      ...(h.consequence ? { consequence: h.consequence } : {}),
      ...(h.avoid ? { avoid: h.avoid } : {}),
      at: h.at.map((a) => a.value),
    })),
    ifNot: contingencyJumps(procedure),
  };
}

/** Contingency jumps that stay within the step's own branch (the branch placekeeping keeps the place of). */
function contingencyJumps(procedure: Procedure): Record<string, string> {
  const scope = new Map<string, string>();
  const gotos: Array<[string, string]> = [];
  const visit = (items: SequenceItem[], path: string) => {
    for (const item of items) {
      if (item.kind === 'step') {
        scope.set(item.id, path);
        if (item.ifNot?.goto) gotos.push([item.id, item.ifNot.goto.value]);
      } else if (item.kind === 'parallel') {
        for (const b of item.branches) visit(b.items, `${path}/${item.path.join('.')}:${b.name}`);
      } else {
        for (const b of item.branches) if (b.items) visit(b.items, path);
      }
    }
  };
  visit(procedure.steps, '');
  return Object.fromEntries(gotos.filter(([from, to]) => scope.has(to) && scope.get(to) === scope.get(from)));
}

function planSequence(items: SequenceItem[], numbers: StepNumbers): PlanItem[] {
  return items.map((item): PlanItem => {
    if (item.kind === 'step') return { step: item.id };
    const key = item.path.join('.');
    if (item.kind === 'parallel') {
      return {
        parallel: key,
        number: numbers.ofBlock.get(item) ?? '',
        branches: item.branches.map((b, i) => ({ name: b.name, letter: numbers.letterOf(item, i), items: planSequence(b.items, numbers) })),
      };
    }
    return {
      choose: key,
      number: numbers.ofBlock.get(item) ?? '',
      branches: item.branches.map((b) => ({
        ...(b.when ? { when: b.when.value } : {}),
        ...(b.otherwise ? { otherwise: true } : {}),
        ...(b.items ? { items: planSequence(b.items, numbers) } : {}),
        ...(b.goto ? { goto: b.goto.value } : {}),
      })),
    };
  });
}
