// The tagging shortcut (the English model's own steps without grouping words into chunks) gives the same tags as
// the model's full reading, word by word.
import nlp from 'compromise';
import { describe, expect, it } from 'vitest';
import { tagsAt } from '../../../src/analysis/prose/word-tags.ts';

const phrases = [
  'Close the nitrogen valve XV-2102', 'Open the hot-oil supply', 'Hot the resin', 'Severe burns from the line',
  'Check that P-211 runs', 'Xylene vapour can ignite', 'Start agitator M-210', 'Stopping circulation cokes the oil',
  'Vent the kettle to the scrubber', 'Charge totals are recorded', 'Record the time on form ARC-F-120',
  'Do not open the hatch', 'If the level is low, then stop the pump', 'Wait for the drum to cool',
];

describe('part-of-speech tags', () => {
  it('are those of the full reading for every word of each phrase', () => {
    for (const phrase of phrases) {
      const full = (nlp(phrase) as unknown as { document: Array<Array<{ tags: Set<string> }>> }).document.flat();
      full.forEach((term, index) => expect([...tagsAt(phrase, index)].sort(), `${phrase} #${index}`).toEqual([...term.tags].sort()));
    }
  });
});
