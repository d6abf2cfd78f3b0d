import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compileStepGraph } from '../../src/analysis/step-graph.ts';
import { exploreSoundness } from '../../src/analysis/soundness/explicit.ts';
import { structuralSoundness } from '../../src/analysis/soundness/structural.ts';
import { summarize } from '../../src/analysis/soundness/verdict.ts';
import { buildShapes, randomShapes } from './soundness-random.ts';

describe('structural and explicit soundness agree', () => {
  it('on thousands of random procedures with jumps, nested parallels and choices', () => {
    fc.assert(
      fc.property(randomShapes(3), (shapes) => {
        const graph = compileStepGraph(buildShapes(shapes));
        const explicit = exploreSoundness(graph, 1000);
        fc.pre(explicit.complete);
        const structural = structuralSoundness(graph, 1000);
        const a = summarize(explicit);
        const b = summarize(structural);
        expect(b.unsafe || b.stuck || b.improper).toBe(a.unsafe || a.stuck || a.improper);
        expect(b.unsafe).toBe(a.unsafe);
        if (!a.unsafe) {
          expect(b.stuck).toBe(a.stuck);
          expect(b.improper).toBe(a.improper);
          expect(b.dead).toEqual(a.dead);
        }
      }),
      { numRuns: 2000 },
    );
  }, 180_000);
});
