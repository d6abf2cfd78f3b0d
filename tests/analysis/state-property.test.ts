// The plant-state analysis agrees with running the procedure step by step, over every branch choice, on small
// generated plants: the values it says can hold at each step are exactly those some run reaches there.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseCondition } from '../../src/analysis/conditions/parse.ts';
import { evaluateCondition, type KnownValue } from '../../src/analysis/evaluate-condition.ts';
import { analyseState } from '../../src/analysis/state/analyse-state.ts';
import { activeOnlyActions, storedActions, type StateInput } from '../../src/analysis/state/state-input.ts';
import { compileStepGraph, type StepGraph } from '../../src/analysis/step-graph.ts';
import { buildSequence } from '../../src/model/build-procedure.ts';
import type { Step } from '../../src/model/procedure.ts';

// A small plant: three enumerated signals (valves and a pump) and their values.
const plant: Record<string, string[]> = { A: ['open', 'closed'], B: ['open', 'closed'], P: ['running', 'stopped'] };
const names = Object.keys(plant);
const signals = Object.fromEntries(names.map((n) => [n, { values: plant[n] }]));

const signal = fc.constantFrom(...names);
const action = signal.chain((s) => fc.tuple(fc.constant(s), fc.constantFrom(...plant[s]), fc.boolean()));
const guard = signal.chain((s) => fc.constantFrom(...plant[s]).map((v) => `${s} == ${v}`));
let counter = 0;
const step = fc.record({ actions: fc.array(action, { maxLength: 2 }), until: fc.option(guard, { nil: undefined }) }).map((r) => {
  const state: Record<string, unknown> = {};
  for (const [s, v, whileActive] of r.actions) state[s] = whileActive ? { to: v, lasts: 'step' } : v;
  return { step: `s${counter++}`, do: 'Act', ...(r.until ? { until: r.until } : { confirm: 'Done' }), state };
});
type Item = Record<string, unknown>;
const item: fc.Arbitrary<Item[]> = fc.oneof(
  step.map((s) => [s]),
  fc.tuple(step, guard, fc.array(step, { minLength: 1, maxLength: 2 }), fc.array(step, { minLength: 1, maxLength: 2 })).map(([before, when, a, b]) => {
    const [s] = when.split(' == ');
    return [{ ...before, until: undefined, confirm: undefined }, { choose: [{ when, steps: a }, { when: `${s} != ${when.split(' == ')[1]}`, steps: b }] }];
  }),
  fc.tuple(fc.array(step, { minLength: 1, maxLength: 2 }), fc.array(step, { minLength: 1, maxLength: 2 })).map(([a, b]) => [{ parallel: { left: a, right: b } }]),
  fc.tuple(step, step, guard).map(([first, check, when]) => [first, { ...check, until: undefined, confirm: undefined },
    { choose: [{ when, goto: first.step, repeat: { expected: 1, max: 2 } }, { otherwise: true, steps: [{ step: `s${counter++}`, do: 'Go on', confirm: 'Done' }] }] }]),
);
// A time limit or if-not that jumps (goto) from one step of the main sequence to another, forward or back.
const jump = fc.option(fc.tuple(fc.nat(), fc.nat(), fc.constantFrom('time-limit', 'if-not')), { nil: undefined });
const procedure = fc.tuple(fc.array(item, { minLength: 1, maxLength: 4 }), fc.array(guard, { maxLength: 2 }), jump)
  .map(([items, lineUp, j]) => {
    const flat = items.flat().map(clean);
    const top = flat.filter((i) => typeof i.step === 'string');
    if (j && top.length) {
      const [from, to, kind] = j;
      const target = top[to % top.length].step;
      Object.assign(top[from % top.length], kind === 'time-limit'
        ? { 'time-limit': { max: '1 min', then: 'Stop', goto: target } }
        : { 'if-not': { do: 'Stop', goto: target } });
    }
    return { steps: buildSequence(flat, ['steps']), lineUp };
  });

function clean(i: Item): Item {
  return Object.fromEntries(Object.entries(i).filter(([, v]) => v !== undefined));
}

type Valuation = Record<string, string>;
const key = (v: Valuation) => names.map((n) => v[n]).join(',');

/** Runs the procedure as an operator would: every order of parallel steps, every branch whose condition holds. */
function execute(graph: StepGraph, lineUp: string[]): Map<string, Set<string>> {
  const seen = new Map<string, Set<string>>();
  const place = new Map(graph.places.map((p) => [p.id, p]));
  const holds = (text: string, v: Valuation) => {
    const parsed = parseCondition(text);
    if (!parsed.ok) throw new Error(text);
    return evaluateCondition(parsed.condition, new Map<string, KnownValue>(names.map((n) => [n, { kind: 'word', value: v[n] }]))) === true;
  };
  const whens = (t: StepGraph['transitions'][number]) => graph.transitions
    .filter((o) => o !== t && o.choose && t.choose && o.choose.path.join('.') === t.choose.path.join('.') && o.from.join() === t.from.join())
    .flatMap((o) => o.guard.filter((g) => g.kind === 'when').map((g) => g.text));
  const all: Valuation[] = [{}];
  for (const n of names) all.splice(0, all.length, ...all.flatMap((v) => plant[n].map((w) => ({ ...v, [n]: w }))));
  const queue: Array<{ marking: string[]; v: Valuation }> = all.filter((v) => lineUp.every((c) => holds(c, v))).map((v) => ({ marking: [graph.start], v }));
  const visited = new Set<string>();
  while (queue.length) {
    const { marking, v } = queue.shift()!;
    const id = `${[...marking].sort().join('|')}#${key(v)}`;
    if (visited.has(id)) continue;
    visited.add(id);
    const active = marking.map((m) => place.get(m)!.step).filter((s): s is Step => !!s);
    // Steps active together that hold one signal at different values: which one the plant shows is not
    // defined, so every one of them can be seen (a reviewer reads that as a conflict, not as a choice).
    const held = new Map<string, Set<string>>();
    for (const s of active) for (const a of activeOnlyActions(s)) held.set(a.signal, (held.get(a.signal) ?? new Set()).add(String(a.value)));
    let views: Valuation[] = [{ ...v }];
    for (const [signal, values] of held) views = views.flatMap((w) => [...values].map((value) => ({ ...w, [signal]: value })));
    for (const m of marking) if (place.get(m)!.step) for (const view of views) seen.set(m, (seen.get(m) ?? new Set()).add(key(view)));
    if (marking.includes(graph.end)) seen.set(graph.end, (seen.get(graph.end) ?? new Set()).add(key(v)));
    // A step whose time limit runs out (or whose result does not come) may jump, whatever the plant shows.
    for (const m of marking) {
      const s = place.get(m)!.step;
      for (const g of [s?.timeLimit?.goto, s?.ifNot?.goto]) {
        const target = g && graph.placeOfStep.get(g.value);
        if (!target) continue;
        const next = { ...v };
        for (const a of storedActions(place.get(target)!.step!)) next[a.signal] = a.value;
        queue.push({ marking: [...marking.filter((x) => x !== m), target], v: next });
      }
    }
    for (const t of graph.transitions) {
      if (!t.from.every((f) => marking.includes(f))) continue;
      const ok = t.guard.every((g) => (g.kind === 'until' || g.kind === 'when' ? holds(g.text, v) : g.kind === 'otherwise' ? !whens(t).some((w) => holds(w, v)) : true));
      if (!ok) continue;
      const next = { ...v };
      for (const to of t.to) for (const a of storedActions(place.get(to)?.step ?? ({ state: [] } as unknown as Step))) next[a.signal] = a.value;
      queue.push({ marking: [...marking.filter((m) => !t.from.includes(m)), ...t.to], v: next });
    }
  }
  return seen;
}

/** Every valuation in the analysis's boxes for a step (all signals are enumerated, so this is exhaustive). */
function pointsOf(boxes: Array<{ box: Map<string, { kind: string; set: unknown }> }>): Set<string> {
  const out = new Set<string>();
  for (const { box } of boxes) {
    let partial: Valuation[] = [{}];
    for (const n of names) {
      const v = box.get(n);
      const values = v && v.kind === 'enum' ? (v.set as string[]) : plant[n];
      partial = partial.flatMap((p) => values.map((w) => ({ ...p, [n]: w })));
    }
    for (const p of partial) out.add(key(p));
  }
  return out;
}

describe('plant state along every path', () => {
  // Source: IEC 61131-3 SFC: a stored action (S) lasts until reset; a non-stored action (N) only while its step is active.
  it('agrees with step-by-step execution over all branch choices on small generated plants', () => {
    fc.assert(fc.property(procedure, ({ steps, lineUp }) => {
      const graph = compileStepGraph({ steps });
      const input: StateInput = { signals, trips: [], lineUp, latchedAtStart: [], graph };
      const analysis = analyseState(input);
      expect(analysis.gaps).toEqual([]);
      const concrete = execute(graph, lineUp);
      for (const p of graph.places.filter((x) => x.kind === 'step')) {
        const expected = [...(concrete.get(p.id) ?? [])].sort();
        const got = [...pointsOf((analysis.views.get(p.id) ?? []) as never)].sort();
        expect(got, `values at ${p.id}`).toEqual(expected);
      }
      const ends = [...analysis.endViews.values()].flat();
      expect([...pointsOf(ends as never)].sort(), 'values at the end').toEqual([...(concrete.get(graph.end) ?? [])].sort());
    }), { numRuns: 300 });
  });

  it('a latched trip holds its outputs until a reset step', () => {
    const steps = buildSequence([
      { step: 'test', do: 'Test the trip', trips: ['T'], confirm: 'Tested' },
      { step: 'open-early', do: 'Open A', state: { A: 'open' }, confirm: 'Done' },
      { step: 'reset', do: 'Reset T', resets: ['T'], confirm: 'Reset' },
      { step: 'open-late', do: 'Open A', state: { A: 'open' }, confirm: 'Done' },
    ], ['steps']);
    const graph = compileStepGraph({ steps });
    const analysis = analyseState({ signals, trips: [{ tag: 'T', latches: true, holds: [{ signal: 'A', value: 'closed' }] }], lineUp: ['A == closed'], latchedAtStart: [], graph });
    const valuesOf = (id: string) => pointsOf((analysis.views.get(id) ?? []) as never);
    expect([...valuesOf('open-early')].every((k) => k.startsWith('closed'))).toBe(true);
    expect([...valuesOf('open-late')].every((k) => k.startsWith('open'))).toBe(true);
  });
});
