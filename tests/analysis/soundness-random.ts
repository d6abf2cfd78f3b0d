// Random procedures for the soundness property tests: nested parallels, choices and jumps anywhere.
import fc from 'fast-check';
import type { ChooseBranch, SequenceItem, Step } from '../../src/model/procedure.ts';

export type Shape =
  | { kind: 'step'; until: boolean }
  | { kind: 'parallel'; branches: Shape[][] }
  | { kind: 'choose'; branches: Array<{ items: Shape[] | null; jump: number | null }> };

const shape = (depth: number): fc.Arbitrary<Shape> => {
  const step = fc.record({ kind: fc.constant('step' as const), until: fc.boolean() });
  if (depth <= 0) return step;
  const seq = fc.array(shape(depth - 1), { minLength: 1, maxLength: 3 });
  return fc.oneof(
    { weight: 4, arbitrary: step },
    { weight: 1, arbitrary: fc.record({ kind: fc.constant('parallel' as const), branches: fc.array(seq, { minLength: 2, maxLength: 3 }) }) },
    {
      weight: 2,
      arbitrary: fc.record({
        kind: fc.constant('choose' as const),
        branches: fc.array(fc.record({ items: fc.option(seq, { freq: 2 }), jump: fc.option(fc.nat(50), { freq: 2 }) }), { minLength: 1, maxLength: 3 }),
      }),
    },
  );
};

/** A sequence of 1–4 items, nested up to `depth` blocks deep. */
export const randomShapes = (depth = 3) => fc.array(shape(depth), { minLength: 1, maxLength: 4 });

/** Builds model steps from a shape; jumps go to step number `jump mod count`. */
export function buildShapes(shapes: Shape[]): { steps: SequenceItem[] } {
  let count = 0;
  const jumps: Array<{ branch: ChooseBranch; to: number }> = [];
  const allSteps: Step[] = [];
  const build = (items: Shape[], path: (string | number)[]): SequenceItem[] =>
    items.map((s, i): SequenceItem => {
      const here = [...path, i];
      if (s.kind === 'step') {
        const step: Step = {
          kind: 'step', id: `s${++count}`, actions: ['Do it'], set: [], params: [], path: here, extra: {},
          ...(s.until ? { until: { value: 'done', path: [...here, 'until'] } } : {}),
        };
        allSteps.push(step);
        return step;
      }
      if (s.kind === 'parallel') {
        return {
          kind: 'parallel', path: here,
          branches: s.branches.map((b, j) => ({ name: `b${j}`, items: build(b, [...here, 'parallel', `b${j}`]), path: [...here, 'parallel', `b${j}`] })),
        };
      }
      return {
        kind: 'choose', path: here,
        branches: s.branches.map((b, j) => {
          const bp = [...here, 'choose', j];
          const branch: ChooseBranch = {
            when: { value: `x == v${j}`, path: [...bp, 'when'] }, otherwise: false, path: bp, extra: {},
            ...(b.items ? { items: build(b.items, [...bp, 'steps']) } : {}),
          };
          if (b.jump !== null) jumps.push({ branch, to: b.jump });
          return branch;
        }),
      };
    });
  const steps = build(shapes, ['steps']);
  for (const j of jumps) {
    if (!allSteps.length) continue;
    const target = allSteps[j.to % allSteps.length];
    j.branch.goto = { value: target.id, path: [...j.branch.path, 'goto'] };
  }
  return { steps };
}
