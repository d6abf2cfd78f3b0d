import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { exploreSoundness } from '../../src/analysis/soundness/explicit.ts';
import { structuralSoundness } from '../../src/analysis/soundness/structural.ts';
import { summarize, type SoundnessResult } from '../../src/analysis/soundness/verdict.ts';
import { traceWords } from '../../src/analysis/soundness/analyse-sequence.ts';
import { compileStepGraph } from '../../src/analysis/step-graph.ts';

const head = `---
id: T-SOUND-1
title: Soundness test
kind: batch
revision: 0
status: draft
signals:
  TI-210: { text: Kettle temperature, unit: degC, range: [0, 300] }
  lab-result: { text: Lab release, values: [pass, fail] }
  x: { text: Test switch, values: [a, b] }
steps:
`;
const s = (id: string) => `{ step: ${id}, do: Do ${id}., confirm: ${id} done }`;

function both(steps: string): { explicit: SoundnessResult; structural: SoundnessResult; words: (r: SoundnessResult) => string[][] } {
  const { facts } = readProcedure('t.md', `${head}${steps}---\n`);
  const graph = facts!.graph;
  const explicit = exploreSoundness(graph);
  const structural = structuralSoundness(graph);
  expect(summarize(structural)).toEqual(summarize(explicit));
  return { explicit, structural, words: (r) => r.problems.map((p) => traceWords(p.path, graph)) };
}

describe('IEC 61131-3 faulty sequences', () => {
  it('finds the "unsafe" network: a jump out of a parallel branch activates a step twice', () => {
    // Source: IEC 61131-3, sequential function charts: an unsafe network lets a step be activated twice
    // (the classic case is a jump out of one branch of a simultaneous divergence). Restated, not quoted.
    const r = both(`  - ${s('prepare')}
  - parallel:
      a:
        - { step: a1, do: Do a1. }
        - choose:
            - { when: x == a, goto: prepare }
            - { when: x == b }
      b:
        - ${s('b1')}
  - ${s('finish')}
`);
    expect(summarize(r.explicit).unsafe).toBe(true);
    expect(r.structural.problems.find((p) => p.kind === 'unsafe')!.places).toEqual(['b1']);
  });

  it('finds the "unreachable" network: a jump into a parallel branch never lets the block finish', () => {
    // Source: IEC 61131-3, sequential function charts: an unreachable network has steps or a convergence that
    // can never be reached; a jump into one branch of a simultaneous divergence is the classic case.
    const r = both(`  - parallel:
      a:
        - ${s('a1')}
      b:
        - ${s('b1')}
        - ${s('b2')}
  - { step: check, do: Check. }
  - choose:
      - { when: x == a, goto: b2 }
      - { when: x == b }
`);
    const v = summarize(r.explicit);
    expect(v.stuck).toBe(true);
    expect(v.unsafe).toBe(false);
    expect(r.words(r.structural)[0].slice(-2)).toEqual(['x == a', 'b2']);
  });
});

describe('van der Aalst (1997) soundness on classic unsound shapes, written as procedures', () => {
  // Source: W.M.P. van der Aalst, "Verification of workflow nets" (1997): a workflow net is sound when from every
  // reachable state the end can be reached, the end is reached with nothing else active, and no transition is dead.
  it('AND-split closed by an XOR-join (a branch skips the join): completes improperly', () => {
    const r = both(`  - parallel:
      a:
        - { step: a1, do: Do a1. }
        - choose:
            - { when: x == a, goto: finish }
            - { when: x == b }
      b:
        - ${s('b1')}
  - ${s('finish')}
`);
    expect(summarize(r.explicit).improper).toBe(true);
  });

  it('XOR-split closed by an AND-join: deadlocks', () => {
    const r = both(`  - { step: decide, do: Decide. }
  - choose:
      - { when: x == a, goto: b1 }
      - { when: x == b }
  - parallel:
      a:
        - ${s('a1')}
      b:
        - ${s('b1')}
  - ${s('finish')}
`);
    expect(summarize(r.explicit).stuck).toBe(true);
  });

  it('a loop that nothing leaves: the end can never be reached', () => {
    const r = both(`  - ${s('heat-up')}
  - { step: sample, do: Sample. }
  - choose:
      - { when: lab-result == fail, goto: heat-up }
      - { when: lab-result == pass, goto: heat-up }
  - ${s('cool')}
`);
    const v = summarize(r.explicit);
    expect(v.stuck).toBe(true);
    expect(v.dead).toEqual(['(end)', 'cool']);
  });

  it('a decision whose every branch jumps away leaves dead steps', () => {
    const r = both(`  - { step: sample, do: Sample. }
  - choose:
      - { when: lab-result == fail, goto: sample }
      - { when: lab-result == pass, goto: cool }
  - ${s('record')}
  - ${s('cool')}
`);
    expect(summarize(r.explicit)).toEqual({ unsafe: false, stuck: false, improper: false, dead: ['record'] });
  });

  it('accepts sound shapes: a loop with an exit around nested parallel blocks', () => {
    const r = both(`  - ${s('heat-up')}
  - parallel:
      a:
        - ${s('a1')}
        - parallel:
            c: [${s('c1')}]
            d: [${s('d1')}]
      b:
        - { step: b1, do: Do b1. }
        - choose:
            - { when: x == a, goto: b1 }
            - { when: x == b }
  - { step: sample, do: Sample. }
  - choose:
      - { when: lab-result == fail, goto: heat-up }
      - { when: lab-result == pass }
`);
    expect(r.explicit.problems).toEqual([]);
    expect(r.explicit.deadPlaces.size).toBe(0);
  });
});

describe('the structural method', () => {
  it('proves 12 parallel branches of 10 steps without exploring a single state', () => {
    const branches = Array.from({ length: 12 }, (_, b) => `      line-${b}:\n${Array.from({ length: 10 }, (_, k) => `        - ${s(`l${b}-s${k}`)}\n`).join('')}`).join('');
    const { facts } = readProcedure('t.md', `${head}  - parallel:\n${branches}---\n`);
    const result = structuralSoundness(facts!.graph);
    expect(result.problems).toEqual([]);
    expect(result.states).toBe(0);
    expect(result.regions.every((r) => r.method === 'by-construction')).toBe(true);
    // The explicit method runs out of budget on the same graph (11^12 markings).
    expect(exploreSoundness(facts!.graph, 5000).complete).toBe(false);
  });

  it('explores only the region that a crossing jump makes unstructured', () => {
    const { facts } = readProcedure('t.md', `${head}  - parallel:
      outer-a:
        - ${s('p1')}
        - parallel:
            x1: [{ step: x1, do: Do x1. }, { choose: [{ when: x == a, goto: y1 }, { when: x == b }] }]
            y1: [${s('y1')}]
      outer-b:
        - parallel:
            u: [${s('u1')}, ${s('u2')}]
            v: [${s('v1')}]
---
`);
    const result = structuralSoundness(facts!.graph);
    const explored = result.regions.filter((r) => r.method === 'explored').map((r) => r.region);
    expect(explored).toEqual(['steps.0/outer-a']);
    expect(result.regions.find((r) => r.region === 'steps.0/outer-b')!.method).toBe('by-construction');
    expect(summarize(result)).toEqual(summarize(exploreSoundness(facts!.graph)));
  });
});

describe('traces in the plant’s words', () => {
  it('tells the run that enters an endless loop, at the goto', () => {
    const text = `${head}  - { step: heat-up, do: Heat K-210., until: TI-210 >= 180 degC }
  - { step: sample, do: Sample. }
  - choose:
      - { when: lab-result == fail, goto: heat-up }
      - { when: lab-result == pass, goto: sample }
---
`;
    const result = checkSources([{ file: 't.md', text }], { today: '2026-12-01' });
    const loop = result.diagnostics.find((d) => d.rule === 'loop-without-exit')!;
    expect(loop.trace).toEqual(['heat-up', 'sample', 'lab-result == fail', 'heat-up']);
    expect(loop.message).toContain('after heat-up → sample → lab-result == fail → heat-up …');
    expect(loop.line).toBe(text.split('\n').findIndex((l) => l.includes('goto: heat-up')) + 1);
    expect(result.diagnostics.filter((d) => d.rule === 'sequence-deadlock')).toEqual([]);
  });

  it('compiles the same graph whatever reads it', () => {
    const { facts } = readProcedure('t.md', `${head}  - ${s('only')}\n---\n`);
    expect(compileStepGraph(facts!.procedure).transitions.length).toBe(facts!.graph.transitions.length);
  });
});
