// The redline between two revisions: steps keyed by id, word-level text changes, safety-relevant changes flagged.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readProcedure } from '../../src/read/read-procedure.ts';
import type { Procedure } from '../../src/model/procedure.ts';
import { redline, stepMarks } from '../../src/history/redline.ts';
import { categoriesOf, defaultReviewPolicy, parseReviewPolicy, requiredSignOffs } from '../../src/history/approval-policy.ts';
import { hazardsV1, procedureText, stepsV1, stepsV2, type ProcedureOptions } from './temp-repo.ts';

function procedure(o: Partial<ProcedureOptions> = {}): Procedure {
  const p = readProcedure('p.md', procedureText({ revision: 1, status: 'draft', steps: stepsV1, ...o })).procedure;
  if (!p) throw new Error('fixture did not read');
  return p;
}

const kindsById = (r: ReturnType<typeof redline>) => Object.fromEntries(r.steps.map((s) => [s.id, s.kinds]));

describe('redline: steps', () => {
  it('finds added, moved, changed and renamed steps between the two revisions', () => {
    const r = redline(procedure(), procedure({ revision: 2, steps: stepsV2 }));
    expect(r.steps.map((s) => s.id)).toEqual(['check-inert', 'purge', 'heat-up', 'sample', 'cook', 'cool-down']);
    expect(kindsById(r)).toEqual({
      'check-inert': [], purge: ['added'], 'heat-up': [], sample: [], cook: ['moved', 'changed'], 'cool-down': ['renamed'],
    });
    expect(r.steps.find((s) => s.id === 'cool-down')?.renamedFrom).toBe('cool');
    const cook = r.steps.find((s) => s.id === 'cook')!;
    expect(cook.fields.map((f) => f.field)).toEqual(['do', 'set TI-210', 'until']);
    const words = cook.fields[0].words!;
    expect(words.filter((w) => w.kind === 'removed').map((w) => w.text.trim())).toEqual(['225']);
    expect(words.filter((w) => w.kind === 'added').map((w) => w.text.trim())).toEqual(['230', 'xylene']);
    expect(words.filter((w) => w.kind !== 'added').map((w) => w.text).join('')).toBe('Hold the kettle at 225 degC under reflux');
    expect(words.filter((w) => w.kind !== 'removed').map((w) => w.text).join('')).toBe('Hold the kettle at 230 degC under xylene reflux');
    expect(stepMarks(r)).toEqual(new Map([['purge', 'added'], ['cook', 'changed'], ['cool-down', 'changed']]));
  });

  it('keeps a removed step at its old place', () => {
    const withoutSample = stepsV1.filter((_, i) => i < 11 || i > 13);
    const r = redline(procedure(), procedure({ steps: withoutSample }));
    expect(r.steps.map((s) => `${s.id}:${s.kinds.join('+')}`)).toEqual(['check-inert:', 'heat-up:', 'cook:', 'sample:removed', 'cool:']);
  });

  it('reports a step moved into a parallel branch with where it was', () => {
    const parallel = [
      ...stepsV1.slice(0, 3),
      '  - parallel:',
      '      heat:',
      ...stepsV1.slice(3, 7).map((l) => `      ${l}`),
      '      check:',
      ...stepsV1.slice(11, 14).map((l) => `      ${l}`),
      ...stepsV1.slice(7, 11),
      ...stepsV1.slice(14),
    ];
    const after = procedure({ steps: parallel });
    const r = redline(procedure(), after);
    const sample = r.steps.find((s) => s.id === 'sample')!;
    expect(sample.kinds).toEqual(['moved']);
    expect(sample.before?.where).toBe('main sequence');
    expect(sample.after?.where).toBe("parallel branch 'check'");
    expect(r.steps.find((s) => s.id === 'heat-up')!.kinds).toEqual(['moved']);
  });

  it('has no changes between a procedure and itself, and only moves for a re-ordering (property)', () => {
    const ids = ['a', 'b', 'c', 'd', 'e', 'f'];
    const stepLines = (order: string[]) => order.flatMap((id) => [`  - step: ${id}`, `    do: Do ${id}`, '    until: elapsed >= 1 min']);
    fc.assert(fc.property(fc.shuffledSubarray(ids, { minLength: 1 }), fc.shuffledSubarray(ids, { minLength: 1 }), (x, y) => {
      const a = procedure({ steps: stepLines(x), hazards: [] });
      const b = procedure({ steps: stepLines(y), hazards: [] });
      expect(redline(a, a).steps.every((s) => s.kinds.length === 0)).toBe(true);
      const r = redline(a, b);
      // Every id of either side appears exactly once.
      expect(r.steps.map((s) => s.id).sort()).toEqual([...new Set([...x, ...y])].sort());
      for (const s of r.steps) {
        if (!y.includes(s.id)) expect(s.kinds).toEqual(['removed']);
        else if (!x.includes(s.id)) expect(s.kinds).toEqual(['added']);
        else expect(s.kinds.filter((k) => k !== 'moved')).toEqual([]);
      }
      // The steps left in place keep their relative order: the kept, unmoved steps are in the same order on both sides.
      const still = r.steps.filter((s) => s.kinds.length === 0).map((s) => s.id);
      expect(x.filter((id) => still.includes(id))).toEqual(y.filter((id) => still.includes(id)));
    }), { numRuns: 40 });
  });
});

describe('redline: safety content', () => {
  it('flags limit, interlock and setpoint changes, and transitions on guarded signals only', () => {
    const stepsEdited = stepsV1.map((l) => l.replace('AI-210 <= 2 percent', 'AI-210 <= 3 percent').replace('TI-210 <= 155 degC', 'TI-210 <= 160 degC'));
    const r = redline(procedure(), procedure({ high: '250 degC', trip: 'TI-210 >= 260 degC', steps: stepsEdited }));
    const byKey = Object.fromEntries(r.items.map((i) => [`${i.area} ${i.key}`, i]));
    expect(byKey['limits TI-210'].fields).toEqual([{ field: 'high', before: '245 degC', after: '250 degC', words: expect.any(Array) }]);
    expect(byKey['limits TI-210'].safety).toBeDefined();
    // The reviewer sees where the new limit sits: against the trip of the new revision.
    expect(byKey['limits TI-210'].context).toBe('TI-210: TSHH-210 trips at TI-210 >= 260 degC');
    expect(byKey['transitions after cool'].context).toBe('TI-210: operating limits 15 degC to 250 degC; TSHH-210 trips at TI-210 >= 260 degC');
    expect(byKey['interlocks TSHH-210'].safety).toBeDefined();
    // TI-210 has a limit and a trip; AI-210 has neither in this procedure.
    expect(byKey['transitions after cool'].safety).toMatch(/TI-210/);
    expect(byKey['transitions after check-inert'].safety).toBeUndefined();
    expect(r.areas).toEqual(['limits', 'interlocks', 'steps']);
  });

  it('pairs a reworded hazard as changed and calls out a removed caution', () => {
    const reworded = hazardsV1.map((l) => l.replace('Resin at up to 245 degC', 'Resin at up to 250 degC'));
    const r = redline(procedure(), procedure({ hazards: reworded.slice(0, 5) }));
    const hazards = r.items.filter((i) => i.area === 'hazards');
    expect(hazards.map((h) => h.kind)).toEqual(['changed', 'removed']);
    expect(hazards[1].key).toBe('CAUTION: Hot kettle shell');
    expect(hazards[1].safety).toMatch(/removed/);
    expect(categoriesOf(r)).toEqual(new Set(['content', 'hazards', 'removed-hazards']));
  });

  it('tells document control from content', () => {
    const r = redline(procedure(), procedure({ status: 'effective', effective: '2026-05-01', approvals: [{ role: 'Process engineer', name: 'Ada Ferrand', date: '2026-04-30' }] }));
    expect(r.areas).toEqual([]);
    expect(r.items).toEqual([]);
    expect(r.control.map((c) => c.field)).toEqual(['status', 'effective', 'approvals']);
    expect(requiredSignOffs(r, defaultReviewPolicy)).toEqual([]);
  });
});

describe('approval policy', () => {
  it('requires the roles of every matching entry, once each, and finds new signatures', () => {
    const before = procedure({ status: 'effective', approvals: [{ role: 'Process safety lead', name: 'Ines Varga', date: '2026-01-05' }] });
    const after = procedure({
      revision: 2, high: '250 degC', steps: stepsV2,
      approvals: [{ role: 'Process safety lead', name: 'Ines Varga', date: '2026-01-05' }, { role: 'Shift supervisor', name: 'Tom Reyes', date: '2026-06-01' }],
    });
    const signOffs = requiredSignOffs(redline(before, after), defaultReviewPolicy);
    expect(signOffs.map((s) => s.role)).toEqual(['Process engineer', 'Operations superintendent', 'Shift supervisor', 'Process safety lead']);
    expect(signOffs.find((s) => s.role === 'Shift supervisor')?.signedBy?.name).toBe('Tom Reyes');
    // The process safety lead's signature is carried over from revision 1, so it does not count for revision 2.
    expect(signOffs.find((s) => s.role === 'Process safety lead')?.signedBy).toBeUndefined();
    expect(signOffs.find((s) => s.role === 'Process safety lead')?.reasons).toEqual(['operating limits changed', 'setpoints changed', 'transitions on signals with limits or interlocks changed']);
  });

  it('reads a policy from configuration and names each problem by its place', () => {
    expect(parseReviewPolicy([{ when: ['limits'], require: ['Unit manager'] }])).toEqual({ policy: [{ when: ['limits'], require: ['Unit manager'] }] });
    const bad = parseReviewPolicy([{ when: ['limitz'], require: [] }]);
    expect('problems' in bad && bad.problems.map((p) => p.split(':')[0])).toEqual(['review-policy[0].when[0]', 'review-policy[0].require']);
  });
});
