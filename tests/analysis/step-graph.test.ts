// The step graph: sequence, parallel, choose and goto compiled into alternating steps and transitions.
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { buildSequence } from '../../src/model/build-procedure.ts';
import { compileStepGraph, type StepGraph } from '../../src/analysis/step-graph.ts';

function graphOf(yaml: string): StepGraph {
  return compileStepGraph({ steps: buildSequence(parse(yaml), ['steps']) });
}

/** Transitions as "from -> to [guard]" lines, easy to read in assertions. */
function edges(g: StepGraph): string[] {
  return g.transitions.map((t) => `${t.from.join('+')} -> ${t.to.join('+')}${t.guard.length ? ` [${t.guard.map((p) => p.text).join(' & ')}]` : ''}`);
}

describe('compileStepGraph', () => {
  it('links a sequence through one transition per step, from start to end', () => {
    const g = graphOf(`
- {step: a, do: A, until: x >= 1 bar}
- {step: b, do: B, confirm: B done}
`);
    expect(edges(g)).toEqual(['(start) -> a', 'a -> b [x >= 1 bar]', 'b -> (end) [B done]']);
  });

  it('opens a parallel block with one transition to every branch and closes it with one join', () => {
    // Source: IEC 61131-3 SFC simultaneous divergence and convergence (common practice reading)
    const g = graphOf(`
- {step: a, do: A, confirm: ok}
- parallel:
    left: [ {step: l1, do: L, confirm: l} ]
    right: [ {step: r1, do: R, confirm: r}, {step: r2, do: R2, confirm: r2} ]
- {step: z, do: Z, confirm: z}
`);
    expect(edges(g)).toEqual([
      '(start) -> a',
      'a -> l1+r1 [ok]',
      'l1 -> (left done) [l]',
      'r1 -> r2 [r]',
      'r2 -> (right done) [r2]',
      '(left done)+(right done) -> z',
      'z -> (end) [z]',
    ]);
    expect(g.places.find((p) => p.id === 'r2')?.scope).toHaveLength(1);
  });

  it("gives each branch of a decision the step's own condition and the branch condition together", () => {
    const g = graphOf(`
- {step: wait, do: Wait, until: elapsed >= 5 min}
- choose:
    - when: r == pass
      steps: [ {step: go, do: Go, confirm: gone} ]
    - when: r == fail
      goto: wait
`);
    expect(edges(g)).toEqual([
      '(start) -> wait',
      'wait -> go [elapsed >= 5 min & r == pass]',
      'wait -> wait [elapsed >= 5 min & r == fail]',
      'go -> (end) [gone]',
    ]);
    const loop = g.transitions.find((t) => t.jump);
    expect(loop?.jump).toMatchObject({ target: 'wait', resolved: true });
  });

  it('marks a step with no transition and no decision after it as missing', () => {
    const g = graphOf(`
- {step: a, do: A}
- {step: b, do: B, confirm: ok}
`);
    expect(g.transitions.find((t) => t.fromStep === 'a')?.missing).toBe(true);
    expect(g.transitions.find((t) => t.fromStep === 'b')?.missing).toBe(false);
  });

  it('does not mark a step followed by a decision as missing, and keeps an unresolved jump', () => {
    const g = graphOf(`
- {step: a, do: A}
- choose:
    - {when: r == pass}
    - {otherwise: true, goto: nowhere}
`);
    expect(g.transitions.filter((t) => t.fromStep === 'a').every((t) => !t.missing)).toBe(true);
    expect(g.transitions.find((t) => t.jump)?.jump).toMatchObject({ target: 'nowhere', resolved: false });
  });

  it('uses a virtual branch start when a parallel branch opens with a decision', () => {
    const g = graphOf(`
- parallel:
    left:
      - choose:
          - {when: r == pass, steps: [ {step: p, do: P, confirm: p} ]}
          - {otherwise: true}
    right: [ {step: q, do: Q, confirm: q} ]
`);
    expect(edges(g)).toContain('(start) -> (left begins)+q');
    expect(edges(g)).toContain('(left begins) -> p [r == pass]');
    expect(edges(g)).toContain('(left begins) -> (left done) [otherwise]');
  });
});
