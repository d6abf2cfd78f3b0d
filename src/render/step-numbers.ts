// Hierarchical step numbers shared by the chart, the table and every later view: 1, 2, 3A.1, 8b.2 …
import type { ChooseBlock, ParallelBlock, SequenceItem } from '../model/procedure.ts';

/**
 * Numbering scheme (operators read these aloud, so they stay short):
 * - top-level items count 1, 2, 3 …; a parallel or choose block takes one number like a step;
 * - parallel branches get capital letters in the order written: step 1 of branch A of block 3 is `3A.1`;
 * - choose branches get small letters: step 2 of the second branch of decision 8 is `8b.2`;
 * - nesting repeats the pattern: `3A.2b.1`.
 */
export interface StepNumbers {
  /** Step id → number (first occurrence when ids repeat). */
  ofStep: Map<string, string>;
  /** A block → its number (the decision or parallel block's own number). */
  ofBlock: Map<ParallelBlock | ChooseBlock, string>;
  /** A parallel or choose branch → its letter ('A', 'b' …). */
  letterOf(block: ParallelBlock | ChooseBlock, branch: number): string;
  /** The number of the first step a sequence runs, or undefined when it is empty. */
  firstIn(items: SequenceItem[]): string | undefined;
}

export function branchLetter(index: number, upper: boolean): string {
  let n = index;
  let out = '';
  do {
    out = String.fromCharCode(97 + (n % 26)) + out;
    n = Math.floor(n / 26) - 1;
  } while (n >= 0);
  return upper ? out.toUpperCase() : out;
}

export function numberSteps(steps: SequenceItem[]): StepNumbers {
  const ofStep = new Map<string, string>();
  const ofBlock = new Map<ParallelBlock | ChooseBlock, string>();
  const numberOfItem = new Map<SequenceItem, string>();

  const visit = (items: SequenceItem[], prefix: string) => {
    items.forEach((item, index) => {
      const own = `${prefix}${index + 1}`;
      numberOfItem.set(item, own);
      if (item.kind === 'step') {
        if (item.id && !ofStep.has(item.id)) ofStep.set(item.id, own);
        return;
      }
      ofBlock.set(item, own);
      const upper = item.kind === 'parallel';
      item.branches.forEach((branch, b) => {
        const branchItems = 'items' in branch ? branch.items : undefined;
        if (branchItems) visit(branchItems, `${own}${branchLetter(b, upper)}.`);
      });
    });
  };
  visit(steps, '');

  const firstIn = (items: SequenceItem[]): string | undefined => {
    const first = items[0];
    if (!first) return undefined;
    if (first.kind === 'step') return numberOfItem.get(first);
    // A block starts with its own number: the operator goes to the decision or the parallel start.
    return numberOfItem.get(first);
  };

  return {
    ofStep,
    ofBlock,
    letterOf: (block, branch) => branchLetter(branch, block.kind === 'parallel'),
    firstIn,
  };
}
