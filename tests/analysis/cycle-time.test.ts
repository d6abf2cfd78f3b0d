// Cycle time on hand-computed procedures, and properties that hold for any loop-free procedure.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { estimateCycleTime, formatSeconds } from '../../src/analysis/cycle-time.ts';
import { readProcedure } from '../../src/read/read-procedure.ts';

const min = 60;
function procedureOf(steps: string) {
  const text = `---\nid: U2-CT-001\ntitle: Cycle time case\nkind: normal\nrevision: 0\nstatus: draft\nsteps:\n${steps}\n---\n`;
  const { procedure } = readProcedure('case.md', text);
  if (!procedure) throw new Error('fixture did not read');
  return procedure;
}
const minutes = (r: { shortest: number; typical: number; longest: number }) => [r.shortest / min, r.typical / min, r.longest / min];

describe('estimateCycleTime', () => {
  it('adds a sequence; a range counts its middle as typical', () => {
    const ct = estimateCycleTime(procedureOf(`
  - { step: a, do: Open XV-1, confirm: Open, expect: 10 min }
  - { step: b, do: Heat K-1, confirm: Hot, expect: 20..40 min }
  - { step: c, do: Close XV-1, confirm: Closed, expect: 300 s }`));
    // 10 + 20 + 5 = 35; 10 + 30 + 5 = 45; 10 + 40 + 5 = 55
    expect(minutes(ct)).toEqual([35, 45, 55]);
    expect(ct.criticalPath).toEqual(['a', 'b', 'c']);
    expect(ct.timeline.map((b) => [b.id, b.start / min, b.typical / min])).toEqual([['a', 0, 10], ['b', 10, 30], ['c', 40, 5]]);
    expect(ct.notes).toEqual([]);
  });

  it('takes the longest branch of a parallel block', () => {
    const ct = estimateCycleTime(procedureOf(`
  - { step: before, do: Start, confirm: Started, expect: 5 min }
  - parallel:
      x:
        - { step: x1, do: Charge A, confirm: Done, expect: 10 min }
        - { step: x2, do: Charge B, confirm: Done, expect: 10 min }
      y:
        - { step: y1, do: Charge C, confirm: Done, expect: 15..35 min }
  - { step: after, do: Stop, confirm: Stopped, expect: 5 min }`));
    // shortest 5 + max(20, 15) + 5 = 30; typical 5 + max(20, 25) + 5 = 35; longest 5 + max(20, 35) + 5 = 45
    expect(minutes(ct)).toEqual([30, 35, 45]);
    expect(ct.criticalPath).toEqual(['before', 'y1', 'after']);
    const x2 = ct.timeline.find((b) => b.id === 'x2')!;
    expect([x2.start / min, x2.critical, x2.lane]).toEqual([15, false, ['x']]);
    expect(ct.timeline.find((b) => b.id === 'after')!.start / min).toBe(30);
  });

  it('gives a choose a range and follows its longest typical branch', () => {
    const ct = estimateCycleTime(procedureOf(`
  - { step: s, do: Sample, confirm: Sampled, expect: 10 min }
  - choose:
      - when: done
        steps: [ { step: p, do: Pump out, confirm: Empty, expect: 20 min } ]
      - otherwise: true
        steps: [ { step: q, do: Drain, confirm: Empty, expect: 5..15 min } ]`));
    // shortest 10 + 5 = 15; typical 10 + max(20, 10) = 30; longest 10 + max(20, 15) = 30
    expect(minutes(ct)).toEqual([15, 30, 30]);
    expect(ct.criticalPath).toEqual(['s', 'p']);
    expect(ct.timeline.map((b) => b.id)).toEqual(['s', 'p']);
  });

  it('repeats a loop by the count declared on its jump', () => {
    const ct = estimateCycleTime(procedureOf(`
  - { step: pressurise, do: Pressurise, confirm: At pressure, expect: 3..5 min }
  - { step: hold, do: Hold, confirm: Held, expect: 2 min }
  - { step: vent, do: Vent, confirm: Vented, expect: 2..4 min }
  - { step: read, do: Read AI-1, expect: 1 min }
  - choose:
      - when: done
        steps: [ { step: record, do: Record the reading, confirm: Recorded } ]
      - otherwise: true
        goto: pressurise
        repeat: { expected: 1.5, max: 3 }
  - { step: blanket, do: Set the blanket, confirm: Set, expect: 5 min }`));
    // one pass: 8 / 10 / 12 min; typical adds 1.5 × 10 = 15, longest adds 3 × 12 = 36, shortest adds none.
    // shortest 8 + 5 = 13; typical 10 + 15 + 5 = 30; longest 12 + 36 + 5 = 53
    expect(minutes(ct)).toEqual([13, 30, 53]);
    const loop = ct.timeline.find((b) => b.kind === 'loop')!;
    expect([loop.id, loop.start / min, loop.typical / min]).toEqual(['pressurise', 10, 15]);
    expect(ct.timeline.find((b) => b.id === 'blanket')!.start / min).toBe(25);
    expect(ct.notes.map((n) => n.kind)).toEqual(['no-expect']);
    expect(ct.stepsTimed).toBe(5);
    expect(ct.stepsTotal).toBe(6);
  });

  it('repeats a loop that jumps from inside a branch back to the enclosing sequence', () => {
    const ct = estimateCycleTime(procedureOf(`
  - { step: a, do: Heat, confirm: Hot, expect: 10 min }
  - choose:
      - when: done
        steps:
          - { step: b, do: Test, expect: 5 min }
          - choose:
              - when: done
                goto: a
                repeat: { expected: 1, max: 2 }
              - otherwise: true
      - otherwise: true`));
    // loop body a + b = 15. inner choose: 0 / 15 / 30; branch: 5 / 20 / 35; outer: min(5,0) / max(20,0) / 35
    // total: 10 + (0, 20, 35) = 10 / 30 / 45
    expect(minutes(ct)).toEqual([10, 30, 45]);
  });

  it('has no bound when a loop declares no repeat count, and says so', () => {
    const ct = estimateCycleTime(procedureOf(`
  - { step: a, do: Heat, expect: 10 min }
  - choose:
      - when: done
      - otherwise: true
        goto: a`));
    expect(minutes(ct)).toEqual([10, 10, Infinity]);
    expect(ct.notes.map((n) => [n.kind, n.path.join('.')])).toEqual([['loop-without-repeat', 'steps.1.choose.1.goto']]);
    expect(formatSeconds(ct.longest)).toBe('no bound');
  });

  it('keeps each note once when a loop measures an earlier loop again', () => {
    const ct = estimateCycleTime(procedureOf(`
  - { step: a, do: Heat, confirm: Hot, expect: 10 min }
  - choose:
      - when: cold
        goto: a
      - otherwise: true
  - { step: b, do: Stir, confirm: Stirred }
  - choose:
      - when: again
        goto: a
        repeat: { expected: 1, max: 2 }
      - otherwise: true`));
    // The second loop's body (a, the first decision, b) holds the first loop, so it is measured twice.
    expect(ct.notes.map((n) => [n.kind, n.path.join('.')])).toEqual([
      ['loop-without-repeat', 'steps.1.choose.0.goto'],
      ['no-expect', 'steps.2.step'],
    ]);
  });

  it('notes a bad expect and counts it as zero', () => {
    const ct = estimateCycleTime(procedureOf(`
  - { step: a, do: Heat, confirm: Hot, expect: 10 kg }
  - { step: b, do: Cool, confirm: Cool, expect: 1 h }`));
    expect(minutes(ct)).toEqual([60, 60, 60]);
    expect(ct.notes.map((n) => n.kind)).toEqual(['bad-expect']);
  });

  it('formats durations for people', () => {
    expect([formatSeconds(45), formatSeconds(40 * min), formatSeconds(95 * min), formatSeconds(120 * min)]).toEqual(['45 s', '40 min', '1 h 35 min', '2 h']);
  });

  it('for any loop-free procedure: shortest <= typical <= longest, and the critical bars add up to the typical time', () => {
    type Node = { kind: 'step'; lo: number; hi: number } | { kind: 'par' | 'choose'; branches: Node[][] };
    const tree = fc.letrec<{ seq: Node[]; node: Node }>((tie) => ({
      seq: fc.array(tie('node'), { minLength: 1, maxLength: 3 }),
      node: fc.oneof({ depthSize: 'small', withCrossShrink: true },
        fc.record({ kind: fc.constant('step' as const), lo: fc.integer({ min: 0, max: 50 }), hi: fc.integer({ min: 0, max: 50 }) }),
        fc.record({ kind: fc.constantFrom('par' as const, 'choose' as const), branches: fc.array(tie('seq'), { minLength: 1, maxLength: 3 }) })),
    })).seq;
    fc.assert(fc.property(tree, (seq) => {
      let n = 0;
      const yamlOf = (items: Node[], indent: string): string => items.map((item) => {
        if (item.kind === 'step') {
          const [lo, hi] = item.lo <= item.hi ? [item.lo, item.hi] : [item.hi, item.lo];
          return `${indent}- { step: s${n++}, do: Act, confirm: Done, expect: ${lo}..${hi} min }`;
        }
        if (item.kind === 'par') return `${indent}- parallel:\n${item.branches.map((b, i) => `${indent}    b${i}:\n${yamlOf(b, `${indent}      `)}`).join('\n')}`;
        return `${indent}- choose:\n${item.branches.map((b) => `${indent}    - when: done\n${indent}      steps:\n${yamlOf(b, `${indent}        `)}`).join('\n')}`;
      }).join('\n');
      const ct = estimateCycleTime(procedureOf(yamlOf(seq, '  ')));
      expect(ct.shortest).toBeLessThanOrEqual(ct.typical + 1e-9);
      expect(ct.typical).toBeLessThanOrEqual(ct.longest + 1e-9);
      const critical = ct.timeline.filter((b) => b.critical);
      expect(critical.reduce((t, b) => t + b.typical, 0)).toBeCloseTo(ct.typical, 6);
      for (const b of ct.timeline) expect(b.start + b.typical).toBeLessThanOrEqual(ct.typical + 1e-6);
      expect(critical.map((b) => b.id)).toEqual(ct.criticalPath);
    }), { numRuns: 150 });
  });
});
