import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { conditionInWords } from '../../src/render/condition-words.ts';

const signals = {
  'agitator-on': { text: 'Agitator M-210 running' },
  'XV-2107': { text: 'Charge chute valve' },
  'TI-210': { text: 'Kettle temperature', unit: 'degC' },
  'AI-210': { text: 'Kettle oxygen content AI-210', unit: 'percent' },
};

describe('conditions in plant words', () => {
  it('reads the examples the operators asked for', () => {
    expect(conditionInWords('agitator-on == true', signals)).toBe('Agitator M-210 running');
    expect(conditionInWords('XV-2107 == closed', signals)).toBe('Charge chute valve XV-2107 closed');
    expect(conditionInWords('TI-210 >= 205 degC', signals)).toBe('Kettle temperature TI-210 at or above 205 degC');
  });
  it('says "no" for a false flag and keeps a tag the text already names once', () => {
    expect(conditionInWords('agitator-on == false', signals)).toBe('Agitator M-210 running: no');
    expect(conditionInWords('not agitator-on', signals)).toBe('Agitator M-210 running: no');
    expect(conditionInWords('AI-210 <= 2 percent', signals)).toBe('Kettle oxygen content AI-210 at or below 2 percent');
  });
  it('joins and/or and reads elapsed time', () => {
    expect(conditionInWords('elapsed >= 60 min and TI-210 >= 225 degC', signals)).toBe('60 min in this step, and Kettle temperature TI-210 at or above 225 degC');
    expect(conditionInWords('(TI-210 < 20 degC or XV-2107 != closed) and agitator-on', signals))
      .toBe('(Kettle temperature TI-210 below 20 degC, or Charge chute valve XV-2107 not closed), and Agitator M-210 running');
  });
  it('gives no words rather than half a sentence when a signal has no text or the condition does not parse', () => {
    expect(conditionInWords('PI-999 > 3 bar', signals)).toBeUndefined();
    expect(conditionInWords('TI-210 >=', signals)).toBeUndefined();
  });
  it('never throws and always names every declared signal it reads', () => {
    const names = Object.keys(signals);
    const atom = fc.oneof(
      fc.constantFrom(...names).map((n) => `${n} == true`),
      fc.tuple(fc.constantFrom('TI-210', 'AI-210'), fc.constantFrom('<', '<=', '>', '>=', '==', '!='), fc.integer({ min: 0, max: 400 })).map(([n, op, v]) => `${n} ${op} ${v} ${n === 'TI-210' ? 'degC' : 'percent'}`),
    );
    fc.assert(fc.property(fc.array(atom, { minLength: 1, maxLength: 5 }), fc.constantFrom(' and ', ' or '), (atoms, join) => {
      const words = conditionInWords(atoms.join(join), signals);
      expect(words).toBeDefined();
      for (const a of atoms) expect(words!.toLowerCase()).toContain(signals[a.split(' ')[0] as keyof typeof signals].text.toLowerCase());
    }));
  });
});
