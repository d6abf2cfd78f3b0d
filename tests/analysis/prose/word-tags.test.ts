// The tagging shortcut (the English model's own steps without grouping words into chunks) gives the same tags as
// the model's full reading, word by word.
import nlp from 'compromise';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { tagAhead, tagsAt } from '../../../src/analysis/prose/word-tags.ts';

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

// Tagging ahead reads many phrases as one document; each phrase must keep the tags it has when read alone.
describe('tagging ahead', () => {
  const fullReading = (phrase: string) => (nlp(phrase) as unknown as { document: Array<Array<{ tags: Set<string> }>> }).document.flat();
  const sameAsAlone = (asked: string[]): number => {
    const tagged = tagAhead(() => asked.forEach((p) => tagsAt(p, 0)));
    for (const phrase of asked) {
      fullReading(phrase).forEach((term, index) => expect([...tagsAt(phrase, index)].sort(), `${phrase} #${index}`).toEqual([...term.tags].sort()));
    }
    return tagged;
  };

  it('gives each phrase the tags of reading it alone, phrases ending in "a", "an" or "the" included', () => {
    // Phrases cut after four words end in an article often; a full stop after "a" reads as an abbreviation.
    const asked = [
      'Close the manway Tagx with a', 'Close nitrogen valve Tagx for', 'Refuse the load on the', 'Fit an', 'Take 2 bags',
      'Take one 100 g sample', 'Vent the kettle to the', 'Cold the drum', 'Nitrogen in Tagx after the', 'Check that the pre-start-up safety',
      'Severe burns from the hose', 'Xylene vapour ignited by a', 'Stop unloading pump Tagx',
    ];
    // All of them in the one reading, none left to be tagged one by one.
    expect(sameAsAlone(asked)).toBe(asked.length);
  });

  it('gives the tags of reading alone for any phrases of plant words', () => {
    const words = ['open', 'Close', 'the', 'a', 'an', 'valve', 'Tagx', 'pump', 'vent', 'drain', 'and', 'then', 'to', 'with', '2', '45', 'hot', 'oil', 'level', 'is', 'low', 'running', 'stopped', 'charge', 'Xylene', 'check', 'that', 'it', 'slowly', 'kg'];
    const phrase = fc.array(fc.constantFrom(...words), { minLength: 1, maxLength: 6 }).map((w) => w.join(' '));
    // Source: common practice (a part-of-speech tagger reads each sentence on its own).
    fc.assert(fc.property(fc.uniqueArray(phrase, { minLength: 2, maxLength: 12 }), (asked) => {
      sameAsAlone(asked);
    }), { numRuns: 40 });
  });
});
