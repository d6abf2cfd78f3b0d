// emergency-wait-without-time-limit: in an emergency, a wait for a process signal says how long and what then.
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';

const procedure = (kind: string, step: string) => `---
id: FX-R900-EM
title: Respond to a high temperature in reactor R-900
kind: ${kind}
revision: 0
status: draft
signals:
  TI-900: { text: Reactor temperature, unit: degC, range: [0, 300] }
  XV-901: { text: Steam valve, values: [open, closed] }
steps:
  - ${step}
  - { step: log-event, do: Record the event in the shift log, confirm: Logged }
---
`;
const found = (kind: string, step: string) =>
  checkSources([{ file: 'r.md', text: procedure(kind, step) }], { today: '2026-12-01' }).diagnostics.filter((d) => d.rule === 'emergency-wait-without-time-limit');

describe('emergency-wait-without-time-limit', () => {
  it('reports a wait for a process signal without a time limit in an emergency, as a warning at the until', () => {
    const [d, ...rest] = found('emergency-shutdown', "{ step: cool, do: Cool the reactor, until: 'TI-900 <= 150 degC' }");
    expect(rest).toEqual([]);
    expect(d.severity).toBe('warning');
    expect(d.message).toBe("Emergency step 'cool' waits until TI-900 <= 150 degC, on TI-900, with no time limit: if the value never comes, the operator waits for ever.");
    expect(d.hint).toMatch(/time-limit: \{ max: .*then: /);
    expect(found('emergency', "{ step: close, do: Close XV-901, until: 'XV-901 == closed', if-not: { do: Close hand valve HV-901 } }")).toHaveLength(1);
    // A signal joined with elapsed time is still a wait for the signal.
    expect(found('emergency', "{ step: cool, do: Cool the reactor, until: 'TI-900 <= 150 degC and elapsed >= 5 min' }")).toHaveLength(1);
  });

  it('passes a wait with a time limit, a wait for time or for the step\'s own actions, and other kinds of procedure', () => {
    expect(found('emergency-shutdown', "{ step: cool, do: Cool the reactor, until: 'TI-900 <= 150 degC', time-limit: { max: 2 h, then: Tell the shift supervisor } }")).toEqual([]);
    expect(found('emergency-shutdown', "{ step: settle, do: Let the reactor settle, until: 'elapsed >= 10 min' }")).toEqual([]);
    expect(found('emergency-shutdown', '{ step: call, do: Call the shift supervisor, until: done }')).toEqual([]);
    for (const kind of ['shutdown', 'batch', 'startup']) expect(found(kind, "{ step: cool, do: Cool the reactor, until: 'TI-900 <= 150 degC' }")).toEqual([]);
  });

  it('leaves an until that does not read to condition-syntax, without a stack trace', () => {
    const result = checkSources([{ file: 'r.md', text: procedure('emergency', "{ step: cool, do: Cool the reactor, until: 'TI-900 =< 150 degC' }") }], { today: '2026-12-01' });
    expect(result.diagnostics.filter((d) => d.rule === 'emergency-wait-without-time-limit')).toEqual([]);
    expect(result.diagnostics.some((d) => d.rule === 'condition-syntax')).toBe(true);
  });

  it('marks its source as common practice', () => {
    // Source: common practice; contingency actions for an expected result that does not come: DOE-STD-1029-92
    expect(rules['emergency-wait-without-time-limit'].meta.source).toMatch(/^Common practice.*DOE-STD-1029-92/);
  });
});
