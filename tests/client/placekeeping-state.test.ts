import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { placekeepingPlan, type PlanItem } from '../../src/render/placekeeping-plan.ts';
import { compileFlow, decisionAfter, decisionByKey, markDone, replay, startPlace, undoMark, type Flow, type Mark, type Place } from '../../src/site/client/placekeeping-state.ts';

const current = (place: Place) => place.tokens.map((t) => (t.at.k === 'step' ? t.at.id : t.at.k));
const mark = (flow: Flow, place: Place, step: string, pick?: number) => {
  const next = markDone(flow, place, { step, pick, path: '' });
  if (!next) throw new Error(`cannot mark ${step}`);
  return next;
};

// A small plan with every kind of item: a step, a parallel block with a two-step branch, a looping decision.
const items: PlanItem[] = [
  { step: 'a' },
  { parallel: 'steps.1', number: '2', branches: [
    { name: 'left', letter: 'A', items: [{ step: 'l1' }, { step: 'l2' }] },
    { name: 'right', letter: 'B', items: [{ step: 'r1' }] },
  ] },
  { step: 'sample' },
  { choose: 'steps.3', number: '4', branches: [
    { when: 'x <= 12 mg/g', items: [{ step: 'cool' }] },
    { when: 'x > 12 mg/g', goto: 'sample' },
  ] },
  { step: 'finish' },
];

describe('placekeeping over a plan', () => {
  const flow = compileFlow({ items });

  it('starts at the first step and forks into separately tracked branches', () => {
    let place = startPlace(flow);
    expect(current(place)).toEqual(['a']);
    place = mark(flow, place, 'a');
    expect(current(place)).toEqual(['l1', 'r1']);
    expect(place.tokens.map((t) => t.path)).toEqual(['/steps.1:left', '/steps.1:right']);
  });

  it('joins only when every branch has ended', () => {
    let place = mark(flow, startPlace(flow), 'a');
    place = mark(flow, place, 'r1');
    expect(current(place)).toEqual(['l1', 'join']);
    place = mark(flow, place, 'l1');
    place = mark(flow, place, 'l2');
    expect(current(place)).toEqual(['sample']);
  });

  it('asks for a branch at a decision and follows the jump back', () => {
    let place = replay(flow, ['a', 'l1', 'l2', 'r1'].map((step) => ({ step, path: '' })));
    expect(decisionAfter(flow, 'sample')?.options.map((o) => o.when)).toEqual(['x <= 12 mg/g', 'x > 12 mg/g']);
    expect(markDone(flow, place, { step: 'sample', path: '' })).toBeUndefined();
    place = mark(flow, place, 'sample', 1);
    expect(current(place)).toEqual(['sample']);
    expect(place.done.sample).toBe(1);
    place = mark(flow, place, 'sample', 0);
    expect(current(place)).toEqual(['cool']);
    expect(place.done.sample).toBe(2);
    place = mark(flow, mark(flow, place, 'cool'), 'finish');
    expect(place.finished).toBe(true);
  });

  it('refuses to mark a step that is not current', () => {
    expect(markDone(flow, startPlace(flow), { step: 'cool', path: '' })).toBeUndefined();
  });

  it('takes back the latest mark of the branch being viewed, not of the other branch', () => {
    const place = replay(flow, ['a', 'l1', 'r1'].map((step) => ({ step, path: '' })));
    const marks = undoMark(place.marks, '/steps.1:left');
    expect(marks.map((m) => m.step)).toEqual(['a', 'r1']);
    expect(current(replay(flow, marks))).toEqual(['l1', 'join']);
  });
});

describe('placekeeping properties', () => {
  const flow = compileFlow({ items });
  // Random operator sessions: at each turn pick one current token and, at a decision, one branch.
  const session = fc.array(fc.tuple(fc.nat(), fc.nat()), { maxLength: 40 });
  const play = (choices: Array<[number, number]>) => {
    let place = startPlace(flow);
    for (const [t, p] of choices) {
      const active = place.tokens.filter((tok) => tok.at.k === 'step');
      if (active.length === 0) break;
      const tok = active[t % active.length];
      const id = (tok.at as { id: string }).id;
      const decision = decisionAfter(flow, id);
      place = markDone(flow, place, { step: id, path: tok.path, pick: decision ? p % decision.options.length : undefined })!;
    }
    return place;
  };

  it('replaying the recorded marks gives the same place (what survives a reload)', () => {
    fc.assert(fc.property(session, (choices) => {
      const place = play(choices);
      expect(replay(flow, place.marks)).toEqual(place);
    }));
  });

  it('undoing the latest mark returns to the place before it', () => {
    fc.assert(fc.property(session, fc.tuple(fc.nat(), fc.nat()), (choices, extra) => {
      const before = play(choices);
      const after = play([...choices, extra]);
      if (after.marks.length === before.marks.length) return;
      expect(replay(flow, undoMark(after.marks))).toEqual(before);
    }));
  });

  it('never has two places in one step and never loses a step mark', () => {
    fc.assert(fc.property(session, (choices) => {
      const place = play(choices);
      const steps = current(place).filter((s) => s !== 'join' && s !== 'end');
      expect(new Set(steps).size).toBe(steps.length);
      const total = Object.values(place.done).reduce((a, b) => a + b, 0);
      expect(total).toBe(place.marks.length);
    }));
  });
});

describe('placekeeping over the demo batch procedure', () => {
  const file = 'procedures/k-210-resin/u2-k210-batch-001.md';
  const { procedure } = readProcedure(file, readFileSync(file, 'utf8'));
  const plan = placekeepingPlan(procedure!);
  const flow = compileFlow(plan);

  it('covers every step of the procedure once, in table order', () => {
    expect(flow.order[0]).toBe('check-inert');
    expect(new Set(flow.order).size).toBe(flow.order.length);
    expect(flow.order).toContain('tip-anhydride');
  });

  it('can be walked to the end by always taking the first branch', () => {
    let place = startPlace(flow);
    for (let turn = 0; turn < 200 && !place.finished; turn++) {
      const tok = place.tokens.find((t) => t.at.k === 'step');
      if (!tok || tok.at.k !== 'step') break;
      const decision = decisionAfter(flow, tok.at.id);
      const mark: Mark = { step: tok.at.id, path: tok.path, pick: decision ? 0 : undefined };
      place = markDone(flow, place, mark)!;
    }
    expect(place.finished).toBe(true);
    expect(Object.keys(place.done).length).toBeGreaterThan(5);
  });

  it('carries the hazards with the steps they name', () => {
    expect(plan.hazards.find((h) => h.at.includes('tip-anhydride'))?.level).toBeDefined();
  });
});

describe('plan numbers', () => {
  it('uses the step numbers the chart and table print', () => {
    const file = 'procedures/k-210-resin/u2-k210-batch-001.md';
    const plan = placekeepingPlan(readProcedure(file, readFileSync(file, 'utf8')).procedure!);
    expect(plan.numbers['check-inert']).toBe('1');
    expect(plan.numbers['start-agitator']).toBe('3A.1');
    expect(plan.numbers['bond-bags']).toBe('3B.2');
  });
});

describe('placekeeping over every demo procedure', () => {
  const files = readdirSync('procedures', { recursive: true, encoding: 'utf8' }).filter((f) => f.endsWith('.md')).map((f) => `procedures/${f}`);
  const flows = files.flatMap((file) => {
    const { procedure } = readProcedure(file, readFileSync(file, 'utf8'));
    return procedure ? [{ file, flow: compileFlow(placekeepingPlan(procedure)) }] : [];
  });

  it('reads every demo procedure', () => {
    expect(flows.length).toBe(files.length);
  });

  it('keeps its invariants on random walks: one place per step, marks add up, a reload gives the same place', () => {
    fc.assert(fc.property(fc.nat(flows.length - 1), fc.array(fc.tuple(fc.nat(), fc.nat()), { maxLength: 60 }), (which, choices) => {
      const { flow } = flows[which];
      let place = startPlace(flow);
      for (const [t, p] of choices) {
        const active = place.tokens.filter((tok) => tok.at.k === 'step' || tok.at.k === 'choose');
        if (active.length === 0) break;
        const tok = active[t % active.length];
        const step = tok.at.k === 'step' ? tok.at.id : (tok.at as { key: string }).key;
        const decision = tok.at.k === 'step' ? decisionAfter(flow, step) : decisionByKey(flow, step);
        const next = markDone(flow, place, { step, path: tok.path, pick: decision ? p % decision.options.length : undefined });
        expect(next).toBeDefined();
        place = next!;
      }
      const steps = current(place).filter((s) => s !== 'join' && s !== 'end' && s !== 'choose');
      expect(new Set(steps).size).toBe(steps.length);
      expect(steps.every((s) => flow.order.includes(s))).toBe(true);
      expect(replay(flow, place.marks)).toEqual(place);
    }), { numRuns: 200 });
  });
});

describe('contingencies in placekeeping', () => {
  const file = 'procedures/k-210-resin/u2-k210-esd-001.md';
  const procedure = readProcedure(file, readFileSync(file, 'utf8')).procedure!;
  const plan = placekeepingPlan(procedure);
  const flow = compileFlow(plan);

  it('offers the jump of a contingency that names a step in the same branch, and only those', () => {
    // Every if-not with a goto in this procedure stays in the main sequence.
    const expected = Object.fromEntries(procedure.steps.flatMap((s) => (s.kind === 'step' && s.ifNot?.goto ? [[s.id, s.ifNot.goto.value]] : [])));
    expect(Object.keys(expected).length).toBeGreaterThan(0);
    expect(plan.ifNot).toEqual(expected);
  });

  it('moves the place to the contingency target, and a reload gives the same place', () => {
    const [from, to] = Object.entries(plan.ifNot)[0];
    let place = startPlace(flow);
    for (let guard = 0; guard < 20; guard++) {
      const tok = place.tokens.find((t) => t.at.k === 'step')!;
      if ((tok.at as { id: string }).id === from) break;
      place = markDone(flow, place, { step: (tok.at as { id: string }).id, path: tok.path })!;
    }
    expect(markDone(flow, place, { step: 'write-log', path: '', ifNot: true })).toBeUndefined();
    const jumped = markDone(flow, place, { step: from, path: '', ifNot: true })!;
    expect(jumped.tokens.map((t) => t.at)).toEqual([{ k: 'step', id: to }]);
    expect(jumped.done[from]).toBe(1);
    expect(replay(flow, jumped.marks)).toEqual(jumped);
  });

  it('refuses a contingency jump at a step without one', () => {
    const place = startPlace(flow);
    const tok = place.tokens[0];
    const id = (tok.at as { id: string }).id;
    expect(plan.ifNot[id]).toBeUndefined();
    expect(markDone(flow, place, { step: id, path: tok.path, ifNot: true })).toBeUndefined();
  });
});

describe('contingency jumps across parallel branches', () => {
  it('are left to the table (placekeeping keeps one place per branch)', () => {
    const text = readFileSync('procedures/k-210-resin/u2-k210-batch-001.md', 'utf8');
    const procedure = readProcedure('x.md', text).procedure!;
    const plan = placekeepingPlan(procedure);
    for (const [from, to] of Object.entries(plan.ifNot)) expect(plan.numbers[from].replace(/\.\d+$/, '')).toBe(plan.numbers[to].replace(/\.\d+$/, ''));
  });
});
