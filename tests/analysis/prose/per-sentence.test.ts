// An answer about a sentence is kept only when it was read from the English model's real tags: a guess made while
// phrases are gathered ahead is never kept, so that a kept answer is the one the question gives again.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { perSentence } from '../../../src/analysis/prose/per-sentence.ts';
import { tagAhead, tagsAt } from '../../../src/analysis/prose/word-tags.ts';
import { splitSentences } from '../../../src/analysis/prose/words.ts';
import { chainedImperatives, givesInstruction } from '../../../src/analysis/prose/imperatives.ts';

describe('perSentence', () => {
  it('keeps no answer made from a guess, and keeps the real one', () => {
    let asked = 0;
    // A phrase no other test asks, so that the model has not answered it yet.
    const isVerb = perSentence((s) => {
      asked++;
      return tagsAt(`Skim ${s.text} slowly`, 0).has('Verb');
    });
    const sentence = splitSentences('the decanter layer')[0];
    // Gathering guesses "no tags", then "verb, noun and adjective": neither guess is kept.
    tagAhead(() => isVerb(sentence));
    expect(asked).toBe(2);
    const real = isVerb(sentence);
    expect(asked).toBe(3);
    expect(real).toBe(tagsAt('Skim the decanter layer slowly', 0).has('Verb'));
    // Asked again, inside gathering or not: the real answer, kept.
    tagAhead(() => isVerb(sentence));
    expect(isVerb(sentence)).toBe(real);
    expect(asked).toBe(3);
  });

  it('gives the answers the questions give unkept, whether or not phrases were gathered first (property)', () => {
    const pieces = ['Open', 'XV-2101', 'and', 'start', 'P-211', 'the', 'pump', 'then', 'vent', 'drain', 'line', ',', 'slowly', 'check', 'it'];
    const fresh = (text: string) => splitSentences(text)[0];
    fc.assert(fc.property(fc.array(fc.constantFrom(...pieces), { minLength: 1, maxLength: 9 }), fc.boolean(), (words, gatherFirst) => {
      const text = words.join(' ');
      const sentence = fresh(text);
      if (!sentence) return;
      if (gatherFirst) tagAhead(() => {
        chainedImperatives(sentence);
        givesInstruction(sentence);
      });
      // The same questions on a sentence object of their own, never asked before: nothing kept applies to it.
      const other = fresh(text)!;
      expect(chainedImperatives(sentence)).toEqual(chainedImperatives(other));
      expect(givesInstruction(sentence)).toEqual(givesInstruction(other));
    }), { numRuns: 60 });
  });
});
