import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compileStepGraph } from '../../src/analysis/step-graph.ts';
import { exploreSoundness } from '../../src/analysis/soundness/explicit.ts';
import { structuralSoundness } from '../../src/analysis/soundness/structural.ts';
import { summarize } from '../../src/analysis/soundness/verdict.ts';
import { buildShapes, randomShapes, type Shape } from './soundness-random.ts';

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
      // A fixed seed keeps CI repeatable; STEPWRIGHT_SOUNDNESS_SEED explores others (npm run fuzz-style runs).
      { numRuns: 2000, seed: Number(process.env.STEPWRIGHT_SOUNDNESS_SEED ?? 20261203) },
    );
  }, 180_000);

  // KNOWN DISAGREEMENT, not yet fixed: found by a random seed (604770194). A jump out of a parallel branch into an
  // earlier step, beside nested parallels: the structural method calls the sequence improper, the explicit token
  // game does not. Such a jump is already an error of its own (goto-crosses-parallel), but the two methods must
  // agree. This test passes while they disagree and fails once they agree: then make it a plain test.
  it.fails('on a jump out of a parallel branch beside nested parallels (known disagreement on "improper")', () => {
    const s = (): Shape => ({ kind: 'step', until: false });
    const shapes: Shape[] = [s(), s(), {
      kind: 'parallel', branches: [
        [s(), s(), { kind: 'choose', branches: [{ items: null, jump: 47 }] }],
        [s()],
        [{ kind: 'parallel', branches: [
          [{ kind: 'parallel', branches: [[s(), s()], [s()]] }, s(), s()],
          [{ kind: 'choose', branches: [{ items: [s(), s()], jump: null }, { items: [s()], jump: 13 }] }, { kind: 'choose', branches: [{ items: null, jump: null }] }],
        ] }, s(), s()],
      ],
    }];
    const graph = compileStepGraph(buildShapes(shapes));
    const explicit = exploreSoundness(graph, 1000);
    expect(explicit.complete).toBe(true);
    expect(summarize(structuralSoundness(graph, 1000)).improper).toBe(summarize(explicit).improper);
  });
});
