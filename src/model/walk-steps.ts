// Visits every step of a sequence with the parallel branches and choose branches that contain it.
import type { ChooseBlock, ParallelBlock, SequenceItem, Step } from './procedure.ts';

export interface StepPlace {
  step: Step;
  /** Keys of the parallel branches the step is inside, outermost first ("steps.2/solvent"). */
  parallelScope: string[];
  /** The blocks around the step, outermost first. */
  enclosing: Array<{ block: ParallelBlock | ChooseBlock; branch: number }>;
}

export function walkSteps(items: SequenceItem[]): StepPlace[] {
  const out: StepPlace[] = [];
  const visit = (seq: SequenceItem[], scope: string[], enclosing: StepPlace['enclosing']) => {
    for (const item of seq) {
      if (item.kind === 'step') out.push({ step: item, parallelScope: scope, enclosing });
      else if (item.kind === 'parallel') {
        item.branches.forEach((b, i) => visit(b.items, [...scope, parallelScopeKey(item, b.name)], [...enclosing, { block: item, branch: i }]));
      } else {
        item.branches.forEach((b, i) => b.items && visit(b.items, scope, [...enclosing, { block: item, branch: i }]));
      }
    }
  };
  visit(items, [], []);
  return out;
}

export function parallelScopeKey(block: ParallelBlock, branch: string): string {
  return `${block.path.join('.')}/${branch}`;
}

/** Every block in the sequence, depth first. */
export function walkBlocks(items: SequenceItem[]): Array<ParallelBlock | ChooseBlock> {
  const out: Array<ParallelBlock | ChooseBlock> = [];
  const visit = (seq: SequenceItem[]) => {
    for (const item of seq) {
      if (item.kind === 'step') continue;
      out.push(item);
      for (const b of item.branches) if (b.items) visit(b.items);
    }
  };
  visit(items);
  return out;
}
