// Where each step sits (main sequence, a parallel branch, a decision branch) and each decision branch's stable key,
// so two revisions can be compared by step id rather than by position in the YAML.
import type { ChooseBranch, Procedure, SequenceItem, Step } from '../model/procedure.ts';

export interface StepSlot {
  step: Step;
  /** Reading order in the whole procedure. */
  order: number;
  /** Stable key of the container: does not change when steps are inserted before the block. */
  container: string;
  /** The container in words, e.g. "parallel branch 'solvent'". */
  where: string;
}

export interface DecisionSlot {
  /** e.g. "await-lab → record-acid-value": the step decided after, and what the branch leads to. */
  key: string;
  label: string;
  condition: string;
  goto?: string;
  branch: ChooseBranch;
}

export interface StepLayout {
  steps: StepSlot[];
  decisions: DecisionSlot[];
}

export function layoutSteps(procedure: Pick<Procedure, 'steps'>): StepLayout {
  const steps: StepSlot[] = [];
  const decisions: DecisionSlot[] = [];
  const visit = (items: SequenceItem[], container: string, where: string, before: string) => {
    let previous = before;
    for (const item of items) {
      if (item.kind === 'step') {
        steps.push({ step: item, order: steps.length, container, where });
        previous = item.id;
      } else if (item.kind === 'parallel') {
        for (const b of item.branches) visit(b.items, `${container}/parallel:${b.name}`, `parallel branch '${b.name}'`, previous);
        previous = `${previous}+parallel`;
      } else {
        item.branches.forEach((b, i) => {
          const first = firstStepId(b.items ?? []);
          const target = first ?? (b.goto ? `goto ${b.goto.value}` : b.otherwise ? 'otherwise' : `branch ${i + 1}`);
          const condition = b.otherwise ? 'otherwise' : b.when?.value ?? '';
          decisions.push({
            key: `${previous} → ${target}`,
            label: `decision after ${previous}, branch to ${target}`,
            condition, goto: b.goto?.value, branch: b,
          });
          if (b.items) visit(b.items, `${container}/choose:${previous}:${i}`, `branch '${condition}' after ${previous}`, previous);
        });
        previous = `${previous}+decision`;
      }
    }
  };
  visit(procedure.steps, 'main', 'main sequence', 'start');
  return { steps, decisions };
}

function firstStepId(items: SequenceItem[]): string | undefined {
  for (const item of items) {
    if (item.kind === 'step') return item.id;
    for (const b of item.branches) {
      const id = firstStepId(b.items ?? []);
      if (id) return id;
    }
  }
  return undefined;
}
