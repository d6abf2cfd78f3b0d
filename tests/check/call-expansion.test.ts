// Call expansion as an engine pass: a caller is checked once more with its calls expanded; findings are told
// apart by rule and place (the path with call-site prefixes removed), and the call step to report at is found
// from the path, whatever the underlying rule's message says.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkSources, type SourceInput } from '../../src/check/run-checks.ts';
import { openResultCache } from '../../src/check/result-cache.ts';
import { findingKey, placeOf, type RawFinding } from '../../src/check/call-expansion.ts';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { tempFolder } from '../temp-folder.ts';

const today = '2026-12-01';
const signal = '  PI-1: { text: Line pressure (absolute), unit: kPa, range: [0, 600] }';

function callee(id: string, setpoint: number): string {
  return `---
id: ${id}
title: Pressurise the line to ${setpoint} kPa
kind: normal
revision: 1
status: draft
signals:
${signal}
limits:
  PI-1: { low: 50 kPa, high: 400 kPa, consequence: Above 400 kPa the relief valve lifts, correction: Close XV-1 }
steps:
  - step: pressurise
    do: Pressurise the line with nitrogen
    set: { PI-1: ${setpoint} kPa }
    until: PI-1 >= ${setpoint - 5} kPa
---
`;
}

// The caller limits PI-1 to 150 kPa: U2-T-LOW stays inside it, U2-T-HIGH (second call) goes beyond.
const caller = `---
id: U2-T-CALLER
title: Flush the line, which is rated for 150 kPa
kind: normal
revision: 0
status: draft
signals:
${signal}
limits:
  PI-1: { low: 50 kPa, high: 150 kPa, consequence: Above 150 kPa the hose can burst, correction: Vent the line }
steps:
  - step: first
    do: Pressurise gently
    call: U2-T-LOW
  - step: second
    do: Pressurise for the leak test
    call: U2-T-HIGH
---
`;

const inputs: SourceInput[] = [
  { file: 'p/caller.md', text: caller },
  { file: 'p/low.md', text: callee('U2-T-LOW', 120) },
  { file: 'p/high.md', text: callee('U2-T-HIGH', 200) },
];
const lineOf = (text: string, needle: string) => text.split('\n').findIndex((l) => l.includes(needle)) + 1;

describe('call expansion pass', () => {
  it('reports a problem of the combination at the call step it comes through, found from the path', () => {
    const found = checkSources(inputs, { today }).diagnostics.filter((d) => d.rule === 'call-expansion-problem');
    expect(found.length).toBeGreaterThan(0);
    // All at the second call (U2-T-HIGH), none at the first, though the first call site comes first.
    for (const d of found) {
      expect(d.file).toBe('p/caller.md');
      expect(d.line).toBe(lineOf(caller, 'call: U2-T-HIGH'));
      expect(d.message).toMatch(/^With 'U2-T-HIGH' run by step 'second': /);
      expect(d.trace?.[0]).toMatch(/^rule [a-z-]+$/);
    }
    // Each callee alone is inside its own limits: nothing of the pass in their files.
    expect(checkSources(inputs.slice(1), { today }).diagnostics.filter((d) => d.rule === 'call-expansion-problem')).toEqual([]);
  });

  it('does not report again what the called procedure reports on its own', () => {
    // The callee alone breaks its own 400 kPa limit: its own file says so; the caller gets only the combination.
    const own = callee('U2-T-HIGH', 450);
    const files: SourceInput[] = [inputs[0], inputs[1], { file: 'p/high.md', text: own }];
    const result = checkSources(files, { today });
    const inCallee = result.diagnostics.filter((d) => d.file === 'p/high.md' && d.severity === 'error').map((d) => d.rule);
    expect(inCallee.length).toBeGreaterThan(0);
    const pass = result.diagnostics.filter((d) => d.rule === 'call-expansion-problem');
    // The callee's own finding (same rule, same place in its file) is not repeated at the call; the caller's
    // 150 kPa limit, which the callee cannot know, still is.
    for (const rule of inCallee) {
      const ownFinding = result.diagnostics.find((d) => d.file === 'p/high.md' && d.rule === rule)!;
      expect(pass.some((d) => d.message.endsWith(ownFinding.message))).toBe(false);
    }
    const combined = pass.find((d) => /150/.test(d.message))!;
    expect(combined).toBeDefined();
    // The caller's own limit it breaks is shown as a related place in the caller's file.
    expect(combined.related?.map((r) => r.line)).toContain(lineOf(caller, 'high: 150 kPa'));
  });

  it('gives the same findings when the files come from the result cache (the pass reruns what it needs)', () => {
    const store = openResultCache(tempFolder('stepwright-expansion-cache-'));
    const cache = { store, salt: 'test' };
    const first = checkSources(inputs, { today, cache }).diagnostics;
    const second = checkSources(inputs, { today, cache }).diagnostics;
    expect(store.stats.hits).toBeGreaterThanOrEqual(3);
    expect(second).toEqual(first);
    expect(second.some((d) => d.rule === 'call-expansion-problem')).toBe(true);
  });

  it("keeps a related place in a called procedure's file, pointing into that file", () => {
    // The caller sets PI-1 itself and declares no limit for it; the limit it breaks is the called procedure's.
    const setter = caller
      .replace(/^limits:\n.*\n/m, '')
      .replace('  - step: first\n    do: Pressurise gently\n    call: U2-T-LOW', '  - step: first\n    do: Pressurise the line for the flush\n    set: { PI-1: 450 kPa }\n    until: PI-1 >= 445 kPa\n  - step: then\n    do: Hold the pressure\n    call: U2-T-LOW');
    const low = callee('U2-T-LOW', 120);
    const result = checkSources([{ file: 'p/caller.md', text: setter }, { file: 'p/low.md', text: low }, inputs[2]], { today });
    const combined = result.diagnostics.find((d) => d.rule === 'call-expansion-problem' && /450 kPa/.test(d.message));
    expect(combined, JSON.stringify(result.diagnostics, null, 1)).toBeDefined();
    expect(combined!.file).toBe('p/caller.md');
    expect(combined!.related).toContainEqual(expect.objectContaining({ file: 'p/low.md', line: lineOf(low, 'PI-1: { low: 50 kPa') }));
  });

  it('tells apart findings placed by range, which have no path to compare', () => {
    const rule = { id: 'some-rule', category: 'conditions' } as RawFinding['rule'];
    const procedure = readProcedure('p/caller.md', caller).procedure!;
    const lookup = () => undefined;
    const at = (line: number, message: string): RawFinding => ({ rule, report: { range: { line, column: 3, endLine: line, endColumn: 9 }, message } });
    // Two different problems of one rule at two places are two findings, not one.
    expect(findingKey(at(12, 'a'), procedure, lookup)).not.toBe(findingKey(at(14, 'b'), procedure, lookup));
    expect(findingKey(at(12, 'a'), procedure, lookup)).not.toBe(findingKey(at(12, 'b'), procedure, lookup));
    // The same problem at the same place is one.
    expect(findingKey(at(12, 'a'), procedure, lookup)).toBe(findingKey(at(12, 'a'), procedure, lookup));
  });

  it('places a path of expanded content in the file that holds it, call after call', () => {
    const procedures = new Map(inputs.map((i) => {
      const p = readProcedure(i.file, 'text' in i ? i.text : '').procedure!;
      return [p.id, p] as const;
    }));
    const lookup = (id: string) => procedures.get(id);
    const c = procedures.get('U2-T-CALLER')!;
    const inCallee = placeOf(c, ['steps', 1, 'call', 'steps', 0, 'set', 'PI-1'], lookup);
    expect(inCallee).toMatchObject({ procedure: 'U2-T-HIGH', path: ['steps', 0, 'set', 'PI-1'] });
    expect(inCallee.site?.step.id).toBe('second');
    // The call value itself, and the caller's own content, stay in the caller.
    expect(placeOf(c, ['steps', 1, 'call'], lookup)).toEqual({ procedure: 'U2-T-CALLER', path: ['steps', 1, 'call'] });
    expect(placeOf(c, ['limits', 'PI-1', 'high'], lookup)).toEqual({ procedure: 'U2-T-CALLER', path: ['limits', 'PI-1', 'high'] });
  });
});

// The emergency rules (contingency-missing, emergency-wait-without-time-limit) hold the steps an emergency procedure
// runs through a call to what they hold its own steps to; the called procedure is fine on its own in normal use.
interface DrownCase { kind: string; calledIfNot: boolean; calledTimeLimit: boolean; callIfNot: boolean; callTimeLimit: boolean }

function drownFiles(c: DrownCase): SourceInput[] {
  const callee = `---
id: U2-T-DROWN
title: Drown kettle K-210
kind: normal
revision: 1
status: draft
signals:
  XV-2109: { text: Drown valve, values: [open, closed] }
  LI-210: { text: Kettle level, unit: percent, range: [0, 100] }
steps:
  - step: open-drown
    do: Open drown valve XV-2109
    state: { XV-2109: open }
    until: XV-2109 == open
${c.calledIfNot ? '    if-not: { do: Open hand valve HV-2109 }\n' : ''}${c.calledTimeLimit ? '    time-limit: { max: 1 min, then: Open hand valve HV-2109 }\n' : ''}  - step: wait-drain
    do: Wait for the kettle to drain
    until: LI-210 <= 5 percent
${c.calledTimeLimit ? '    time-limit: { max: 20 min, then: Tell the shift supervisor }\n' : ''}---
`;
  const caller = `---
id: U2-T-ESD
title: Shut down kettle K-210 on high temperature
kind: ${c.kind}
revision: 0
status: draft
signals:
  LI-210: { text: Kettle level, unit: percent, range: [0, 100] }
steps:
  - step: alarm
    do: Press the kettle shutdown button
    confirm: Button is pressed
  - step: drown
    do: Drown the kettle
    call: U2-T-DROWN
${c.callIfNot ? '    if-not: { do: Open hand valve HV-2109 }\n' : ''}${c.callTimeLimit ? '    time-limit: { max: 30 min, then: Tell the shift supervisor }\n' : ''}---
`;
  return [{ file: 'p/esd.md', text: caller }, { file: 'p/drown.md', text: callee }];
}

const emergencyFindings = (files: SourceInput[]) => checkSources(files, { today }).diagnostics
  .filter((d) => d.rule === 'call-expansion-problem' && /^rule (contingency-missing|emergency-wait-without-time-limit)$/.test(d.trace?.[0] ?? ''));

describe('call expansion and the emergency rules', () => {
  const plain: DrownCase = { kind: 'emergency-shutdown', calledIfNot: false, calledTimeLimit: false, callIfNot: false, callTimeLimit: false };

  it('reports the called steps at the call step of the emergency procedure, naming the called procedure and step', () => {
    const files = drownFiles(plain);
    const found = emergencyFindings(files);
    expect(found.map((d) => [d.trace![0], d.severity]).sort()).toEqual([
      ['rule contingency-missing', 'error'],
      ['rule emergency-wait-without-time-limit', 'warning'],
      ['rule emergency-wait-without-time-limit', 'warning'],
    ]);
    for (const d of found) {
      expect(d.file).toBe('p/esd.md');
      expect(d.line).toBe(lineOf((files[0] as { text: string }).text, 'call: U2-T-DROWN'));
      expect(d.message).toMatch(/^With 'U2-T-DROWN' run by step 'drown': Emergency step 'drown\/(open-drown|wait-drain)'/);
    }
    // The called procedure is fine on its own: nothing of either rule in its file.
    const own = checkSources(files, { today }).diagnostics.filter((d) => d.file === 'p/drown.md');
    expect(own.filter((d) => d.rule === 'contingency-missing' || d.rule === 'emergency-wait-without-time-limit')).toEqual([]);
  });

  it('holds a called step to a rule exactly when the caller is an emergency procedure and nothing answers for the step', () => {
    fc.assert(fc.property(
      fc.record({
        kind: fc.constantFrom('emergency', 'emergency-shutdown', 'normal', 'shutdown'),
        calledIfNot: fc.boolean(), calledTimeLimit: fc.boolean(), callIfNot: fc.boolean(), callTimeLimit: fc.boolean(),
      }),
      (c) => {
        const emergency = c.kind.startsWith('emergency');
        const found = emergencyFindings(drownFiles(c)).map((d) => d.trace![0]);
        const missing = found.filter((r) => r === 'rule contingency-missing').length;
        const waits = found.filter((r) => r === 'rule emergency-wait-without-time-limit').length;
        expect(missing).toBe(emergency && !c.calledIfNot && !c.callIfNot ? 1 : 0);
        expect(waits).toBe(emergency && !c.calledTimeLimit && !c.callTimeLimit ? 2 : 0);
      },
    ), { numRuns: 40 });
  });
});
