// The procedure page's interlocks, limits and reset steps say what their sources say that matters at the point of
// use: whether a trip latches and how it is reset, and the register's alarms beside the operating limits. Where no
// source says, the view says nothing (it never guesses "does not latch").
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { buildRegister } from '../../src/model/register.ts';
import { readYamlSource } from '../../src/parse/read-yaml-source.ts';
import { buildManualView, type ProcedureView } from '../../src/render/manual.ts';
import { holdsWords, latchingWords } from '../../src/render/trip-latching.ts';
import type { StepRow } from '../../src/render/step-table.ts';

const plant = `
signals:
  TI-900:
    text: Reactor temperature
    unit: degC
    range: [0, 300]
    limits: { low: 20 degC, high: 180 degC, consequence: The batch darkens, correction: Cool the reactor }
    alarms: { low: 25 degC, high: 175 degC }
  PI-900:
    text: Reactor pressure
    unit: kPa
    range: [0, 600]
    limits: { high: 400 kPa }
    alarms: { high: 3.8 bar }
  LI-900: { text: Reactor level, unit: percent, range: [0, 100], limits: { high: 80 percent } }
  XV-901: { text: Steam valve, values: [open, closed] }
safety-functions:
  ESD-900:
    text: Reactor R-900 emergency shutdown
    closes: [XV-901]
    latches: true
    reset: At the R-900 panel by the board operator, once the shift supervisor has cleared the cause
  TSHH-900:
    text: Reactor high-high temperature
    trips-when: TI-900 >= 200 degC
    starts: ESD-900
  PSHH-900:
    text: Reactor high-high pressure
    trips-when: PI-900 >= 450 kPa
    closes: [XV-901]
    latches: true
    reset: At the field panel PP-900 by the field operator
  LSHH-900:
    text: Reactor high-high level
    trips-when: LI-900 >= 90 percent
    closes: [XV-901]
relief-devices:
  PSV-900: { text: Reactor relief valve, set-pressure: 500 kPa, signal: PI-900, protects: [R-900] }
`;
const register = buildRegister('register', [{ file: 'register/plant.yaml', source: readYamlSource('register/plant.yaml', plant) }]);

const procedure = `---
id: FX-R900-ESD
title: Recover reactor R-900 after a trip
kind: emergency-shutdown
revision: 0
status: draft
uses: [TSHH-900, PSHH-900, LSHH-900, PSV-900, LI-900]
signals:
  TI-901: { text: Jacket temperature, unit: degC, range: [0, 300] }
limits:
  TI-900: { low: 20 degC, high: 180 degC }
interlocks:
  - { tag: TSH-901, trips-when: TI-901 >= 150 degC, action: Closes the jacket steam valve, latches: true }
  - { tag: TSH-902, trips-when: TI-901 >= 160 degC, action: Sounds the horn, latches: false }
  - { tag: TSH-903, trips-when: TI-901 >= 170 degC, action: Stops the feed }
steps:
  - { step: cool, do: Cool the reactor, until: 'TI-900 <= 150 degC and PI-900 <= 300 kPa and TI-901 <= 100 degC', time-limit: { max: 2 h, then: Tell the shift supervisor } }
  - { step: reset-trips, do: Reset the trips at the panel, resets: [TSHH-900, PSHH-900, TSH-901], confirm: The panel shows the trips reset }
---
`;

function viewOf(withRegister = true): ProcedureView {
  const result = checkSources([{ file: 'procedures/r-900/esd.md', text: procedure }], { today: '2026-12-01', register });
  const manual = buildManualView({ files: result.files, root: 'procedures', today: '2026-12-01', ...(withRegister ? { register } : {}) });
  return manual.procedures[0];
}
const interlock = (view: ProcedureView, tag: string) => view.interlocks.find((i) => i.tag === tag)!;
const resetRow = (view: ProcedureView) => view.rows.find((r): r is StepRow => r.kind === 'step' && r.id === 'reset-trips')!;

describe('interlocks: latching and reset as the sources say', () => {
  const view = viewOf();

  it('takes a register trip\'s own latching and reset', () => {
    expect(interlock(view, 'PSHH-900')).toMatchObject({
      latches: true, latching: 'Latches: it stays tripped until it is reset.', reset: { text: 'At the field panel PP-900 by the field operator' },
    });
    expect(interlock(view, 'PSHH-900').reset?.through).toBeUndefined();
  });

  it('takes them from the function a trip starts, and names that function', () => {
    expect(interlock(view, 'TSHH-900')).toMatchObject({
      latches: true, latching: 'Latches through ESD-900: it stays tripped until it is reset.',
      reset: { text: 'At the R-900 panel by the board operator, once the shift supervisor has cleared the cause', through: 'ESD-900' },
    });
  });

  it('takes the procedure\'s own latches where written, and says nothing where no source says', () => {
    expect(interlock(view, 'TSH-901')).toMatchObject({ latches: true, latching: 'Latches: it stays tripped until it is reset.' });
    expect(interlock(view, 'TSH-901').reset).toBeUndefined();
    expect(interlock(view, 'TSH-902')).toMatchObject({ latches: false, latching: 'Does not latch.' });
    for (const tag of ['TSH-903', 'LSHH-900', 'PSV-900']) {
      const i = interlock(view, tag);
      expect([i.latches, i.latching, i.reset], tag).toEqual([undefined, undefined, undefined]);
    }
    expect(latchingWords({})).toBeUndefined();
  });

  it('keeps the trip condition and action as before', () => {
    expect(interlock(view, 'PSHH-900')).toMatchObject({ tripsWhen: 'PI-900 >= 450 kPa', action: expect.stringMatching(/^Closes XV-901; stays tripped until reset\.$/) });
    expect(interlock(view, 'TSH-903')).toMatchObject({ tripsWhen: 'TI-901 >= 170 degC', action: 'Stops the feed' });
  });

  it('reads the register entries the procedure was read against when the view is made without the register', () => {
    const bare = viewOf(false);
    expect(interlock(bare, 'PSHH-900')).toMatchObject({ latches: true, reset: { text: 'At the field panel PP-900 by the field operator' } });
    // The function TSHH-900 starts is not among the entries the procedure uses: nothing is said rather than a guess.
    expect([interlock(bare, 'TSHH-900').latches, interlock(bare, 'TSHH-900').reset]).toEqual([undefined, undefined]);
    expect(bare.limits.find((l) => l.signal === 'TI-900')).toMatchObject({ alarmLow: '25', alarmHigh: '175' });
  });
});

describe('a step that resets trips', () => {
  const row = resetRow(viewOf());

  it('keeps every trip it resets, and gives the reset instruction of each trip a source gives one for', () => {
    expect(row.resets).toEqual(['TSHH-900', 'PSHH-900', 'TSH-901']);
    expect(row.resetHow).toEqual([
      { tag: 'TSHH-900', text: 'At the R-900 panel by the board operator, once the shift supervisor has cleared the cause', through: 'ESD-900' },
      { tag: 'PSHH-900', text: 'At the field panel PP-900 by the field operator' },
    ]);
  });

  it('has no reset instructions on a step that resets nothing', () => {
    const cool = viewOf().rows.find((r): r is StepRow => r.kind === 'step' && r.id === 'cool')!;
    expect(cool.resets).toBeUndefined();
    expect(cool.resetHow).toBeUndefined();
  });
});

describe('operating limits: the register\'s alarms beside them', () => {
  const limits = viewOf().limits;
  const limit = (signal: string) => limits.find((l) => l.signal === signal)!;

  it('shows an alarm as a number in the row\'s unit, and as written when its unit differs', () => {
    // The procedure's own limits on a register signal get the register's alarms too.
    expect(limit('TI-900')).toMatchObject({ low: '20', high: '180', unit: 'degC', alarmLow: '25', alarmHigh: '175' });
    expect(limit('PI-900')).toMatchObject({ high: '400', unit: 'kPa', alarmHigh: '3.8 bar' });
    expect(limit('PI-900').alarmLow).toBeUndefined();
  });

  it('shows no alarm where the register sets none', () => {
    expect(limit('LI-900')).toMatchObject({ high: '80', unit: 'percent' });
    expect([limit('LI-900').alarmLow, limit('LI-900').alarmHigh]).toEqual([undefined, undefined]);
  });
});

describe('interlocks: the outputs a trip holds', () => {
  it('says which outputs a latched trip holds until reset, the procedure\'s own holds and the register\'s', () => {
    const text = procedure
      .replace('  TI-901: {', '  XV-905: { text: Feed valve, values: [open, closed] }\n  TI-901: {')
      .replace('action: Closes the jacket steam valve, latches: true }', 'action: Closes the feed valve, latches: true, holds: { XV-905: closed } }');
    const result = checkSources([{ file: 'procedures/r-900/esd.md', text }], { today: '2026-12-01', register });
    const view = buildManualView({ files: result.files, root: 'procedures', today: '2026-12-01', register }).procedures[0];
    expect(interlock(view, 'TSH-901').holds).toBe('Holds XV-905 closed until reset.');
    expect(interlock(view, 'TSH-903').holds).toBeUndefined();
  });

  it('names each output once, and says "while tripped" for a trip that does not latch', () => {
    expect(holdsWords([{ signal: 'XV-1', value: 'closed' }, { signal: 'XV-1', value: 'closed' }, { signal: 'M-1', value: 'stopped' }, { signal: 'XV-2', value: 'open' }], true))
      .toBe('Holds XV-1 closed, M-1 stopped and XV-2 open until reset.');
    expect(holdsWords([{ signal: 'XV-1', value: 'closed' }], false)).toBe('Holds XV-1 closed while tripped.');
    expect(holdsWords([], true)).toBeUndefined();
  });
});

describe('interlocks table: every interlock key is shown or listed as not shown', () => {
  /** What the interlocks table shows for each key of an interlock (undefined or empty: not shown). */
  const shownAs: Record<string, (i: ProcedureView['interlocks'][number]) => unknown> = {
    tag: (i) => i.tag,
    'trips-when': (i) => i.tripsWhen,
    action: (i) => i.action,
    latches: (i) => i.latching,
    holds: (i) => i.holds,
  };
  /** Keys left out on purpose, with the reason (none so far). */
  const notShown: Record<string, string> = {};

  it('covers every key of the interlock schema exactly once', async () => {
    const { interlockSchema } = await import('../../src/model/schema.ts');
    const keys = Object.keys(interlockSchema.shape).sort();
    expect([...Object.keys(shownAs), ...Object.keys(notShown)].sort()).toEqual(keys);
  });

  it('shows every key when an interlock carries them all', () => {
    const text = procedure
      .replace('  TI-901: {', '  XV-905: { text: Feed valve, values: [open, closed] }\n  TI-901: {')
      .replace('action: Closes the jacket steam valve, latches: true }', 'action: Closes the feed valve, latches: true, holds: { XV-905: closed } }');
    const result = checkSources([{ file: 'procedures/r-900/esd.md', text }], { today: '2026-12-01', register });
    const i = interlock(buildManualView({ files: result.files, root: 'procedures', today: '2026-12-01', register }).procedures[0], 'TSH-901');
    for (const [key, shown] of Object.entries(shownAs)) expect(shown(i), key).toBeTruthy();
  });
});
