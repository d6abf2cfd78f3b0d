// Every key a step can carry reaches its row of the step table, or is listed here as deliberately not shown,
// with the reason. A key added to the schema fails this file until it is shown or listed.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { stepSchema } from '../../src/model/schema.ts';
import { buildStepTable, stateWords, callEndWords, type StepRow, type TableRow } from '../../src/render/step-table.ts';
import { renderChartSvg } from '../../src/render/chart-svg.ts';
import { readTestProcedure } from './procedure-text.ts';

const signals = {
  'TI-1': { text: 'Kettle temperature', unit: 'degC', range: [0, 300] },
  'PI-1': { text: 'Kettle pressure', unit: 'kPa', range: [0, 400] },
  'XV-1': { text: 'Charge valve', values: ['open', 'closed'] },
  'FV-1': { text: 'Solvent valve', values: ['open', 'closed'] },
  'fan': { values: ['running', 'stopped'] },
  'lab-ok': { text: 'Lab release', values: ['pass', 'fail'] },
};

const stepsOf = (rows: TableRow[]) => rows.filter((r): r is StepRow => r.kind === 'step');
const rowOf = (rows: TableRow[], id: string) => stepsOf(rows).find((r) => r.id === id)!;

/** What a row holds for each step key: the value the page shows for it (undefined or empty: not shown). */
const shownAs: Record<string, (row: StepRow) => unknown> = {
  step: (r) => r.id,
  do: (r) => r.actions,
  phase: (r) => r.phase,
  set: (r) => r.setpoints,
  params: (r) => r.params,
  until: (r) => r.until,
  confirm: (r) => r.confirm,
  expect: (r) => r.expect,
  'sign-off': (r) => r.signOff,
  note: (r) => r.note,
  waive: (r) => r.waivers,
  call: (r) => r.call,
  state: (r) => r.state,
  needs: (r) => r.needs,
  trips: (r) => r.trips,
  resets: (r) => r.resets,
  performer: (r) => r.performer,
  verify: (r) => r.verify,
  'max-drop': (r) => r.maxDrop,
  'time-limit': (r) => r.timeLimit,
  'if-not': (r) => r.ifNot,
};

/**
 * Step keys (or parts of one) the row leaves out on purpose, each with the reason. Whole keys listed here must
 * not also be in `shownAs`.
 */
const notShown: Record<string, string> = {
  'waive (without a reason, or of a rule that cannot be waived)':
    'Such a waiver is not honoured: the checker reports it and still applies the rule, so the page must not say the rule is set aside.',
  'resets (how to reset a trip that no source says how to reset)':
    'A procedure interlock has no reset text, and a register safety function may leave out its reset: the row names the trip it resets and invents no instruction.',
};

/** A sample value for every optional key; the steps 'target' and 'other' exist for the jumps. */
const samples: Record<string, unknown> = {
  phase: 'charge',
  set: { 'TI-1': '40 degC' },
  params: { speed: 'low' },
  until: 'TI-1 >= 40 degC',
  confirm: 'The lid is shut',
  expect: '10..15 min',
  'sign-off': 'Shift supervisor',
  note: 'The valve is slow to move.',
  waive: [{ rule: 'one-action-per-step', reason: 'Both valves move on one hand wheel' }],
  call: { procedure: 'T-002', revision: 3 },
  state: { 'XV-1': 'open', 'FV-1': { to: 'open', lasts: 'step' } },
  needs: 'fan == running',
  trips: ['TSHH-1'],
  resets: ['PSHH-1'],
  performer: 'Board operator',
  verify: { kind: 'independent', role: 'Shift supervisor' },
  'max-drop': { 'PI-1': '5 kPa' },
  'time-limit': { max: '15 min', then: 'Tell the shift supervisor', goto: 'other' },
  'if-not': { do: 'Close hand valve HV-1', goto: 'other' },
};

const optionalKeys = Object.keys(samples);

function rowWith(keys: string[]): StepRow {
  const step: Record<string, unknown> = { step: 'probe', do: 'Do the probe step' };
  for (const k of keys) step[k] = samples[k];
  const procedure = readTestProcedure({
    signals,
    steps: [step, { step: 'other', do: 'Do the other step', confirm: 'Done' }],
  });
  return rowOf(buildStepTable(procedure), 'probe');
}

const present = (value: unknown) => value !== undefined && value !== '' && !(Array.isArray(value) && value.length === 0);

describe('step table: every step key is shown or listed as not shown', () => {
  it('covers every key of the step schema exactly once', () => {
    const schemaKeys = Object.keys(stepSchema.shape).sort();
    expect(Object.keys(shownAs).sort()).toEqual(schemaKeys);
    for (const k of Object.keys(notShown)) expect(schemaKeys).not.toContain(k);
    for (const reason of Object.values(notShown)) expect(reason.length).toBeGreaterThan(20);
    expect([...optionalKeys, 'step', 'do'].sort()).toEqual(schemaKeys);
  });

  it('shows every key when a step carries them all', () => {
    const row = rowWith(optionalKeys);
    for (const [key, of] of Object.entries(shownAs)) expect(present(of(row)), key).toBe(true);
  });

  it('shows exactly the keys a step carries, for any set of them (property)', () => {
    fc.assert(
      fc.property(fc.subarray(optionalKeys), (keys) => {
        const row = rowWith(keys);
        for (const key of optionalKeys) {
          const value = shownAs[key](row);
          if (keys.includes(key)) expect(present(value), `${key} is shown`).toBe(true);
          else expect(present(value), `${key} is not invented`).toBe(false);
        }
      }),
      { numRuns: 60 },
    );
  });

  it('does not show a waiver without a reason', () => {
    const procedure = readTestProcedure({ signals, steps: [{ step: 'a', do: 'Do a', confirm: 'Done', waive: [{ rule: 'one-action-per-step' }] }] });
    expect(rowOf(buildStepTable(procedure), 'a').waivers).toEqual([]);
  });
});

describe('step table: needs, lasting states, trips and resets', () => {
  const procedure = readTestProcedure({
    signals: { ...signals, 'bags-bonded': { text: 'Bag-tip station bonded', values: [true, false] } },
    steps: [
      { step: 'open', do: 'Open XV-1', state: { 'XV-1': 'open', 'FV-1': { to: 'open', lasts: 'step' } }, until: 'XV-1 == open' },
      { step: 'pulse', do: 'Pulse FV-1', state: { 'FV-1': { to: 'open', lasts: '30 s' } }, confirm: 'Pulsed' },
      { step: 'later', do: 'Wait', state: { 'XV-1': { to: 'closed', after: '5 min' }, 'FV-1': { to: 'closed', after: '2 min', lasts: 'step' } }, confirm: 'Done' },
      { step: 'tip', do: 'Tip the bags', needs: 'TI-1 <= 40 degC and XV-1 == open', until: 'TI-1 >= 30 degC' },
      { step: 'odd', do: 'Go on', needs: 'fan == running', confirm: 'Done' },
      { step: 'test', do: 'Test the trips', trips: ['TSHH-1', 'PSHH-1'], confirm: 'Recorded' },
      { step: 'reset', do: 'Reset the trips', resets: ['TSHH-1', 'PSHH-1'], confirm: 'Reset' },
    ],
  });
  const rows = buildStepTable(procedure);

  it('shows the precondition, with its plant words', () => {
    expect(rowOf(rows, 'tip')).toMatchObject({ needs: 'TI-1 <= 40 degC and XV-1 == open' });
    expect(rowOf(rows, 'tip').needsWords).toMatch(/Kettle temperature.*40 degC.*Charge valve/);
    expect(rowOf(rows, 'odd')).toMatchObject({ needs: 'fan == running' });
  });

  it('says how long each lasting state lasts', () => {
    expect(rowOf(rows, 'open').state?.map((s) => s.words)).toEqual(['Leaves XV-1 open', 'Holds FV-1 open during this step']);
    expect(rowOf(rows, 'pulse').state?.map((s) => s.words)).toEqual(['Holds FV-1 open for 30 s at most, not past this step']);
    expect(rowOf(rows, 'later').state?.map((s) => s.words)).toEqual([
      'Leaves XV-1 closed from 5 min into this step',
      'Holds FV-1 closed from 2 min into this step until it ends',
    ]);
    expect(rowOf(rows, 'open').state?.[0]).toMatchObject({ verb: 'Leaves', signal: 'XV-1', value: 'open', tail: '' });
  });

  it('lists the trips tested and the trips reset', () => {
    expect(rowOf(rows, 'test').trips).toEqual(['TSHH-1', 'PSHH-1']);
    expect(rowOf(rows, 'reset').resets).toEqual(['TSHH-1', 'PSHH-1']);
    expect(rowOf(rows, 'open').trips).toBeUndefined();
  });

  it('gives the reset instruction of each reset trip a source gives one for, and none for the others', () => {
    const how = new Map([['PSHH-1', { text: 'At the kettle panel by the board operator', through: 'ESD-1' }]]);
    const row = rowOf(buildStepTable(procedure, undefined, how), 'reset');
    expect(row.resets).toEqual(['TSHH-1', 'PSHH-1']);
    expect(row.resetHow).toEqual([{ tag: 'PSHH-1', text: 'At the kettle panel by the board operator', through: 'ESD-1' }]);
    expect(rowOf(rows, 'reset').resetHow).toBeUndefined();
    expect(rowOf(buildStepTable(procedure, undefined, how), 'test').resetHow).toBeUndefined();
  });

  it('words a state from its parts', () => {
    expect(stateWords({ signal: 'XV-2107', value: 'open', lasts: 'stored' }).words).toBe('Leaves XV-2107 open');
  });
});

describe('step table: call steps and what ends a step', () => {
  const procedure = readTestProcedure({
    signals,
    steps: [
      { step: 'inert', do: 'Inert the kettle', call: 'U2-K210-INERT-001' },
      { step: 'pinned', do: 'Inert again', call: { procedure: 'U2-K210-INERT-001', revision: 2 }, confirm: 'Oxygen below 2 percent' },
      { step: 'await-lab', do: 'Wait for the lab' },
      { choose: [{ when: 'lab-ok == pass', steps: [{ step: 'pass', do: 'Go on', confirm: 'Done' }] }, { when: 'lab-ok == fail', goto: 'await-lab' }] },
      { step: 'bare', do: 'Do something' },
    ],
  });
  const rows = buildStepTable(procedure);

  it('a call step ends when the called procedure has ended', () => {
    expect(rowOf(rows, 'inert')).toMatchObject({ call: { procedure: 'U2-K210-INERT-001' } });
    expect(rowOf(rows, 'inert').decisionFollows).toBeUndefined();
    expect(callEndWords('U2-K210-INERT-001')).toBe('When U2-K210-INERT-001 has ended');
    expect(rowOf(rows, 'pinned')).toMatchObject({ call: { procedure: 'U2-K210-INERT-001', revision: 2 }, confirm: 'Oxygen below 2 percent' });
  });

  it('marks only the steps a decision directly follows', () => {
    expect(rowOf(rows, 'await-lab').decisionFollows).toBe(true);
    expect(rowOf(rows, 'bare').decisionFollows).toBeUndefined();
    expect(rowOf(rows, 'pass').decisionFollows).toBeUndefined();
  });
});

describe('sequence chart: a call step', () => {
  it('ends at a transition naming the called procedure, not at "(no transition)"', () => {
    const procedure = readTestProcedure({ signals, steps: [{ step: 'inert', do: 'Inert the kettle', call: 'U2-K210-INERT-001' }, { step: 'next', do: 'Go on', confirm: 'Done' }] });
    const svg = renderChartSvg(procedure, { title: 'Chart' });
    expect(svg).toContain('U2-K210-INERT-001 ended');
    expect(svg).not.toContain('(no transition)');
  });
});
