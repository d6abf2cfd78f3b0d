import { describe, expect, it } from 'vitest';
import { buildStepTable, formatDuration, type TableRow } from '../../src/render/step-table.ts';
import { readTestProcedure } from './procedure-text.ts';

const s = (step: string, extra: Record<string, unknown> = {}) => ({ step, do: `Do ${step}`, until: 'done', ...extra });

const procedure = readTestProcedure({
  signals: { 'TI-1': { text: 'Kettle temperature', unit: 'degC', range: [0, 300] }, 'lab-ok': { text: 'Lab release', values: ['pass', 'fail'] } },
  hazards: [
    { level: 'caution', hazard: 'Dust', consequence: 'Irritation', avoid: 'Wear a mask', at: ['charge'] },
    { level: 'danger', hazard: 'Hot oil', consequence: 'Burns', avoid: 'Keep the drain shut', at: ['heat', 'charge'] },
  ],
  steps: [
    s('charge', { set: { 'TI-1': '40 degC' }, params: { speed: 'low' }, expect: '10..15 min' }),
    { parallel: { left: [s('l1')], right: [s('r1')] } },
    s('heat', { 'sign-off': 'Shift supervisor' }),
    { step: 'sample', do: 'Take a sample', confirm: 'Sample is at the lab' },
    { choose: [{ when: 'lab-ok == pass', steps: [s('release')] }, { when: 'lab-ok == fail', goto: 'heat' }] },
    s('cool'),
  ],
});
const rows = buildStepTable(procedure);
const stepIndex = (id: string) => rows.findIndex((r) => r.kind === 'step' && r.id === id);

describe('step table', () => {
  it('repeats hazards directly before the steps they name, most severe first', () => {
    const i = stepIndex('charge');
    const before = rows.slice(0, i);
    expect(before.map((r) => (r as Extract<TableRow, { kind: 'hazard' }>).level)).toEqual(['danger', 'caution']);
    const heat = stepIndex('heat');
    expect(rows[heat - 1]).toMatchObject({ kind: 'hazard', level: 'danger', beforeStep: 'heat' });
    expect(rows[heat - 2].kind).not.toBe('hazard');
  });

  it('shows setpoints and parameters with their units, the transition and the duration', () => {
    expect(rows[stepIndex('charge')]).toMatchObject({
      number: '1', setpoints: [{ signal: 'TI-1', quantity: '40 degC', text: 'Kettle temperature' }],
      params: [{ name: 'speed', value: 'low' }], until: 'done', expect: '10–15 min',
    });
    expect(rows[stepIndex('sample')]).toMatchObject({ confirm: 'Sample is at the lab' });
    expect(rows[stepIndex('heat')]).toMatchObject({ signOff: 'Shift supervisor' });
  });

  it('spells out parallel blocks with their branches', () => {
    const kinds = rows.filter((r) => r.kind !== 'hazard').map((r) => (r.kind === 'step' ? r.number : r.kind));
    expect(kinds.slice(0, 7)).toEqual(['1', 'parallel-start', 'branch', '2A.1', 'branch', '2B.1', 'parallel-end']);
    expect(rows.find((r) => r.kind === 'parallel-end')).toMatchObject({ text: 'Go on to step 3 only when every branch of 2 is done.' });
  });

  it('reads decisions as IF condition THEN go to step N', () => {
    const decision = rows.find((r) => r.kind === 'decision') as Extract<TableRow, { kind: 'decision' }>;
    expect(decision.number).toBe('5');
    expect(decision.after).toMatchObject({ number: '4', id: 'sample' });
    expect(decision.choices.map((c) => c.text)).toEqual(['IF lab-ok == pass THEN go to step 5a.1 (release)', 'IF lab-ok == fail THEN go to step 3 (heat)']);
  });

  it('makes loops visible at the jump and at the step they return to', () => {
    expect(rows.find((r) => r.kind === 'jump')).toMatchObject({ targetId: 'heat', targetNumber: '3', loop: true });
    expect(rows[stepIndex('heat')]).toMatchObject({ loopFrom: ['5b'] });
    expect(rows[stepIndex('cool')]).toMatchObject({ number: '6', loopFrom: [] });
  });

  it('formats ranges of durations with an en dash', () => {
    expect(formatDuration('30..50 min')).toBe('30–50 min');
    expect(formatDuration('40 min')).toBe('40 min');
  });
});

describe('step waivers in the step table', () => {
  const waived = readTestProcedure({
    steps: [
      s('prime', {
        do: 'Open XV-201 and start P-201',
        waive: [
          { rule: 'one-action-per-step', reason: '  The valve and pump are interlocked and started as one move  ' },
          { rule: 'sentence-too-long', reason: '' },
          { rule: 'yaml-syntax', reason: 'Cannot be set aside' },
        ],
      }),
      s('run'),
    ],
  });
  const table = buildStepTable(waived);
  const rowOf = (id: string) => table.find((r): r is Extract<TableRow, { kind: 'step' }> => r.kind === 'step' && r.id === id)!;

  it('carries each waiver with a written reason on the row of its step', () => {
    expect(rowOf('prime').waivers).toEqual([
      { rule: 'one-action-per-step', reason: 'The valve and pump are interlocked and started as one move' },
    ]);
  });

  it('leaves steps without waivers with none, and drops waivers the checker would not honour', () => {
    expect(rowOf('run').waivers).toEqual([]);
    expect(rowOf('prime').waivers.map((w) => w.rule)).not.toContain('sentence-too-long');
    expect(rowOf('prime').waivers.map((w) => w.rule)).not.toContain('yaml-syntax');
  });
});

describe('step table: hold-test acceptance', () => {
  it('carries max-drop with the step, and nothing for steps without it', () => {
    const table = buildStepTable(readTestProcedure({
      steps: [
        { step: 'hold', do: 'Close XV-1 for the hold test', until: 'elapsed >= 30 min', 'max-drop': { 'PI-1': '5 kPa' } },
        { step: 'record', do: 'Record the end pressure', until: 'done' },
      ],
    })).filter((r): r is Extract<TableRow, { kind: 'step' }> => r.kind === 'step');
    expect(table.find((r) => r.id === 'hold')!.maxDrop).toEqual([{ signal: 'PI-1', quantity: '5 kPa' }]);
    expect(table.find((r) => r.id === 'record')!.maxDrop).toBeUndefined();
  });
});

describe('step table: contingency, time limit, performer and verification', () => {
  const withRoles = readTestProcedure({
    steps: [
      { step: 'close', do: 'Close XV-1', until: 'done', performer: 'Board operator', 'time-limit': { max: '1..2 min', then: 'Treat XV-1 as failed open', goto: 'report' }, 'if-not': { do: ['Close HV-1 by hand', 'Tell the supervisor'], goto: 'report' } },
      { step: 'check', do: 'Check XV-1 closed', until: 'done', verify: { kind: 'independent', role: 'Second operator' } },
      { step: 'report', do: 'Report', until: 'done', verify: { kind: 'peer-check', role: 'Field operator' } },
    ],
  });
  const table = buildStepTable(withRoles).filter((r): r is Extract<TableRow, { kind: 'step' }> => r.kind === 'step');
  const row = (id: string) => table.find((r) => r.id === id)!;

  it('carries the contingency with its jump numbered as the table numbers steps', () => {
    expect(row('close').ifNot).toEqual({ actions: ['Close HV-1 by hand', 'Tell the supervisor'], goto: { id: 'report', number: row('report').number } });
    expect(row('close').timeLimit).toEqual({ max: '1–2 min', then: 'Treat XV-1 as failed open', goto: { id: 'report', number: '3' } });
    expect(row('check').ifNot).toBeUndefined();
  });

  it('names the performer and the kind of verification in words', () => {
    // Source: DOE-STD-1029 / HSE HSG48 (independent verification, peer check, second-person sign-off as kinds of check).
    expect(row('close').performer).toBe('Board operator');
    expect(row('check').verify).toEqual({ kind: 'independent', label: 'Independent verification', role: 'Second operator' });
    expect(row('report').verify?.label).toBe('Peer check');
  });
});
