import { describe, expect, it } from 'vitest';
import { branchLetter, numberSteps } from '../../src/render/step-numbers.ts';
import { readTestProcedure } from './procedure-text.ts';

const s = (step: string, extra: Record<string, unknown> = {}) => ({ step, do: `Do ${step}`, until: 'done', ...extra });

describe('numberSteps', () => {
  const procedure = readTestProcedure({
    steps: [
      s('a'),
      s('b'),
      { parallel: { left: [s('l1'), s('l2')], right: [s('r1'), { choose: [{ when: 'done', steps: [s('r2')] }, { otherwise: true }] }] } },
      s('c'),
      { choose: [{ when: 'done', steps: [s('d1')] }, { otherwise: true, steps: [s('e1'), s('e2')], goto: 'c' }] },
      s('f'),
    ],
  });
  const numbers = numberSteps(procedure.steps);

  it('counts top-level steps and blocks 1, 2, 3 …', () => {
    expect(numbers.ofStep.get('a')).toBe('1');
    expect(numbers.ofStep.get('b')).toBe('2');
    expect(numbers.ofStep.get('c')).toBe('4');
    expect(numbers.ofStep.get('f')).toBe('6');
  });

  it('numbers parallel branches with capital letters: 3A.1', () => {
    expect(numbers.ofStep.get('l1')).toBe('3A.1');
    expect(numbers.ofStep.get('l2')).toBe('3A.2');
    expect(numbers.ofStep.get('r1')).toBe('3B.1');
  });

  it('numbers decision branches with small letters, nested inside parallel branches too', () => {
    expect(numbers.ofStep.get('d1')).toBe('5a.1');
    expect(numbers.ofStep.get('e2')).toBe('5b.2');
    expect(numbers.ofStep.get('r2')).toBe('3B.2a.1');
  });

  it('gives every step a distinct number', () => {
    const all = [...numbers.ofStep.values()];
    expect(new Set(all).size).toBe(all.length);
    expect(all).toHaveLength(11);
  });

  it('letters branches past Z as AA, AB …', () => {
    expect(branchLetter(0, true)).toBe('A');
    expect(branchLetter(25, false)).toBe('z');
    expect(branchLetter(26, true)).toBe('AA');
    expect(branchLetter(27, false)).toBe('ab');
  });
});
