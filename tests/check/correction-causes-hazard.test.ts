// Which words of a limit's correction are read as instructions that put equipment in a state.
import { describe, expect, it } from 'vitest';
import { actionsIn } from '../../src/check/rules/correction-causes-hazard.ts';
import type { Signal } from '../../src/model/procedure.ts';

const signal = (values: string[]): Signal => ({ name: '', text: '', values, path: [] });
const p = { signals: { 'XV-2105': signal(['open', 'closed']), 'M-210': signal(['running', 'stopped']), 'TI-210': { name: 'TI-210', text: '', unit: 'degC', path: [] } } };

describe('actionsIn', () => {
  it('reads open/close/start/stop followed by an enumerated signal, clause by clause', () => {
    expect(actionsIn('Open cooling-oil valve XV-2105 and stop agitator M-210', p).map((a) => `${a.signal}=${a.value}`)).toEqual(['XV-2105=open', 'M-210=stopped']);
    expect(actionsIn('Close XV-2105; start M-210', p).map((a) => `${a.signal}=${a.value}`)).toEqual(['XV-2105=closed', 'M-210=running']);
  });

  it('skips conditions and prohibitions, words without a tag, and signals without values', () => {
    expect(actionsIn('Open XV-2105 only once TI-210 reads 200 degC or less', p)).toEqual([]);
    expect(actionsIn('Do not open XV-2105 above 200 degC', p)).toEqual([]);
    expect(actionsIn('Switch the jacket to cooling oil from E-222', p)).toEqual([]);
    expect(actionsIn('Open TI-210', p)).toEqual([]);
  });
});
