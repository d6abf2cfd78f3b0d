// Numbers without units: measures are reported, counts, labels, ranges and pH values are not.
import { describe, expect, it } from 'vitest';
import { bareNumbers, statesQuantity } from '../../../src/analysis/prose/bare-numbers.ts';
import { splitSentences } from '../../../src/analysis/prose/words.ts';

const bare = (text: string) => {
  const s = splitSentences(text)[0];
  return bareNumbers(s).map((i) => s.words[i].text);
};

describe('bareNumbers', () => {
  it.each([
    ['Set TIC-210 to 45', ['45']],
    ['Hold for 30 before sampling', ['30']],
    ['Hold 10 at the top', ['10']],
    ['Charge 420 kg of xylene', []],
    ['Keep the level above 20%', []],
    ['Hold between 40 and 50 degC', []],
    ['Fit 2 gaskets', []],
    ['Announce on radio channel 2', []],
    ['Tell Unit 2 control', []],
    ['Bring the pH to 7', []],
    ['Pump at 5 m3/h', []],
    ['Free volume exceeds the delivery by 5 m3 or more', []],
  ])('"%s" → %j', (text, expected) => expect(bare(text)).toEqual(expected));

  it('statesQuantity needs a number with its unit', () => {
    expect(statesQuantity(splitSentences('Add water to reach 40 percent')[0])).toBe(true);
    expect(statesQuantity(splitSentences('Add water to step 4')[0])).toBe(false);
  });
});
