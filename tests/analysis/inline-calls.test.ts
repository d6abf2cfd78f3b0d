// Call expansion: prefixed ids, renamed jumps and hazards, nested calls, cycles, unknown callees and pins.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { callCycleThrough, callSitesOf, inlineCalls, linkCalls } from '../../src/analysis/inline-calls.ts';
import { estimateCycleTime } from '../../src/analysis/cycle-time.ts';
import { compileStepGraph } from '../../src/analysis/step-graph.ts';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { walkSteps } from '../../src/model/walk-steps.ts';
import type { Procedure } from '../../src/model/procedure.ts';

function proc(id: string, body: string, revision = 0): Procedure {
  const text = `---\nid: ${id}\ntitle: Case ${id}\nkind: normal\nrevision: ${revision}\nstatus: draft\n${body}\n---\n`;
  const p = readProcedure(`${id}.md`, text).procedure;
  if (!p) throw new Error(`${id} did not read`);
  return p;
}

const inert = proc('U2-INERT', `signals:
  AI-1: { text: Oxygen, unit: percent, range: [0, 25] }
hazards:
  - { level: danger, hazard: Nitrogen, consequence: Asphyxiation, avoid: Do not enter, at: [pressurise] }
steps:
  - { step: pressurise, do: Pressurise with nitrogen, confirm: At pressure, expect: 4 min }
  - { step: vent, do: Vent to the scrubber, confirm: Vented, expect: 2 min }
  - choose:
      - when: AI-1 <= 2 percent
      - when: AI-1 > 2 percent
        goto: pressurise
        repeat: { expected: 1, max: 3 }`, 2);

const batch = proc('U2-BATCH', `steps:
  - { step: check, do: Check the kettle, confirm: Checked, expect: 5 min }
  - { step: inert, do: Inert the kettle, call: { procedure: U2-INERT, revision: 2 } }
  - { step: charge, do: Charge solvent, confirm: Charged, expect: 10 min }`);

const lookupOf = (...ps: Procedure[]) => (id: string) => ps.find((p) => p.id === id);
const ids = (p: Procedure) => walkSteps(p.steps).map((s) => s.step.id);

describe('inlineCalls', () => {
  it('replaces the call step by the called steps, prefixed by the call step id', () => {
    const { procedure, problems, inlined } = inlineCalls(batch, lookupOf(batch, inert));
    expect(problems).toEqual([]);
    expect(inlined).toEqual(['U2-INERT']);
    expect(ids(procedure)).toEqual(['check', 'inert/pressurise', 'inert/vent', 'charge']);
    const jump = procedure.steps.find((s) => s.kind === 'choose');
    expect(jump?.kind === 'choose' && jump.branches[1].goto?.value).toBe('inert/pressurise');
    expect(procedure.hazards.map((h) => h.at.map((a) => a.value))).toEqual([['inert/pressurise']]);
    expect(Object.keys(procedure.signals)).toContain('AI-1');
    expect(walkSteps(procedure.steps)[1].step.extra.inlinedFrom).toEqual({ procedure: 'U2-INERT', file: 'U2-INERT.md', callStep: 'inert' });
    // The original procedures are left as they were.
    expect(ids(batch)).toEqual(['check', 'inert', 'charge']);
    expect(ids(inert)).toEqual(['pressurise', 'vent']);
  });

  it('gives an expanded procedure whose graph has no step without a transition and whose jumps resolve', () => {
    const graph = compileStepGraph(inlineCalls(batch, lookupOf(batch, inert)).procedure);
    expect(graph.transitions.filter((t) => t.missing)).toEqual([]);
    expect(graph.transitions.filter((t) => t.jump && !t.jump.resolved)).toEqual([]);
  });

  it('counts the called steps in the cycle time', () => {
    const ct = estimateCycleTime(inlineCalls(batch, lookupOf(batch, inert)).procedure);
    // 5 + (4 + 2) + 10 = 21 min once; the loop adds 1 × 6 typical and 3 × 6 at most.
    expect([ct.shortest / 60, ct.typical / 60, ct.longest / 60]).toEqual([21, 27, 39]);
  });

  it('expands nested calls with nested prefixes', () => {
    const c = proc('U2-C', 'steps:\n  - { step: z, do: Close XV-9, confirm: Closed }');
    const b = proc('U2-B', 'steps:\n  - { step: y, do: Run C, call: U2-C }\n  - { step: y2, do: Open XV-8, confirm: Open }');
    const a = proc('U2-A', 'steps:\n  - { step: x, do: Run B, call: U2-B }');
    const { procedure, inlined } = inlineCalls(a, lookupOf(a, b, c));
    expect(ids(procedure)).toEqual(['x/y/z', 'x/y2']);
    expect(inlined).toEqual(['U2-B', 'U2-C']);
  });

  it('stops at a call cycle and names it', () => {
    const a = proc('U2-A', 'steps:\n  - { step: x, do: Run B, call: U2-B }');
    const b = proc('U2-B', 'steps:\n  - { step: open, do: Open XV-1, confirm: Open }\n  - { step: y, do: Run A, call: U2-A }');
    const { procedure, problems } = inlineCalls(a, lookupOf(a, b));
    expect(problems.map((p) => [p.kind, p.kind === 'cycle' ? p.chain : []])).toEqual([['cycle', ['U2-A', 'U2-B', 'U2-A']]]);
    expect(ids(procedure)).toEqual(['x/open', 'x/y']);
    expect(callCycleThrough(callSitesOf(a)[0], lookupOf(a, b))).toEqual(['U2-A', 'U2-B', 'U2-A']);
    expect(callCycleThrough(callSitesOf(batch)[0], lookupOf(batch, inert))).toBeUndefined();
  });

  it('keeps a call to an unknown procedure as the call step and reports it', () => {
    const { procedure, problems } = inlineCalls(batch, lookupOf(batch));
    expect(problems.map((p) => [p.kind, p.site.callee])).toEqual([['unknown-procedure', 'U2-INERT']]);
    expect(ids(procedure)).toEqual(['check', 'inert', 'charge']);
  });

  it("keeps the call step's own transition as a closing step", () => {
    const a = proc('U2-A', 'steps:\n  - { step: x, do: Run inerting, call: U2-INERT, confirm: Oxygen logged }');
    const { procedure } = inlineCalls(a, lookupOf(a, inert));
    expect(ids(procedure)).toEqual(['x/pressurise', 'x/vent', 'x']);
    expect(walkSteps(procedure.steps)[2].step.confirm?.value).toBe('Oxygen logged');
  });

  it('reads pins and links callers to callees both ways', () => {
    expect(callSitesOf(batch).map((s) => [s.callee, s.revision, s.path.join('.')])).toEqual([['U2-INERT', 2, 'steps.1.call']]);
    const links = linkCalls([batch, inert]);
    expect(links.callers.get('U2-INERT')?.map((s) => `${s.caller}:${s.step.id}`)).toEqual(['U2-BATCH:inert']);
    expect(links.calls.get('U2-INERT')).toEqual([]);
  });
});

describe('inlineCalls on generated procedures', () => {
  it('replaces each call by exactly the called steps, keeps every jump resolvable, and leaves the inputs alone', () => {
    const stepIds = (prefix: string) => fc.array(fc.constantFrom('open', 'close', 'wait'), { minLength: 1, maxLength: 4 })
      .map((kinds) => kinds.map((k, i) => `${prefix}${i}-${k}`));
    const stepLines = (list: string[]) => list.map((id, i) => `  - { step: ${id}, do: Act on XV-${i}, confirm: Done }`);
    fc.assert(fc.property(stepIds('c'), stepIds('s'), fc.nat({ max: 4 }), (calleeIds, callerIds, at) => {
      // The shared operation loops back to its first step, so its jump must be renamed with the prefix.
      const callee = [...stepLines(calleeIds), `  - choose:\n      - when: done\n      - otherwise: true\n        goto: ${calleeIds[0]}`];
      const caller = stepLines(callerIds);
      const shared = proc('U2-SHARED', `steps:\n${callee.join('\n')}`);
      const position = Math.min(at, caller.length);
      const lines = [...caller];
      lines.splice(position, 0, '  - { step: run, do: Run the shared operation, call: U2-SHARED }');
      const main = proc('U2-MAIN', `steps:\n${lines.join('\n')}`);
      const before = JSON.stringify(main.steps);
      const { procedure, problems } = inlineCalls(main, lookupOf(main, shared));
      expect(problems).toEqual([]);
      const got = ids(procedure);
      expect(got.length).toBe(callerIds.length + calleeIds.length);
      expect(got.slice(position, position + calleeIds.length)).toEqual(ids(shared).map((id) => `run/${id}`));
      expect(compileStepGraph(procedure).transitions.filter((t) => t.jump && !t.jump.resolved)).toEqual([]);
      expect(JSON.stringify(main.steps)).toBe(before);
    }), { numRuns: 100 });
  });
});

describe('paths of inlined content', () => {
  it('never collide with the caller: every condition path in the expanded procedure is distinct', async () => {
    const { readFileSync } = await import('node:fs');
    const { join } = await import('node:path');
    const { readProcedure } = await import('../../src/read/read-procedure.ts');
    const { inlineCalls } = await import('../../src/analysis/inline-calls.ts');
    const { collectFacts } = await import('../../src/analysis/procedure-facts.ts');
    const dir = join(import.meta.dirname, '../../procedures/k-210-resin');
    const read = (name: string) => readProcedure(name, readFileSync(join(dir, name), 'utf8')).procedure!;
    const caller = read('u2-k210-tar-su-001.md');
    const callee = read('u2-k210-inert-001.md');
    const expanded = inlineCalls(caller, (id) => (id === callee.id ? callee : undefined));
    expect(expanded.inlined).toEqual([callee.id]);
    const keys = collectFacts(expanded.procedure).conditions.map((c) => c.path.join('/'));
    expect(new Set(keys).size).toBe(keys.length);
  });
});
