// The list of base-form verbs the check carries is the English model's own: taken from the installed model's word
// list, it must equal what that list says today (an upgraded model fails here until the list is written again).
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { modelInfinitives, modelVersion } from '../../../src/analysis/prose/model-infinitives.ts';
import { isModelInfinitive } from '../../../src/analysis/prose/word-tags.ts';

type Lexicon = Record<string, string | string[]>;
const nlp = createRequire(import.meta.url)('compromise') as { version: string; world(): { model: { one: { lexicon: Lexicon } } } };
const lexicon = nlp.world().model.one.lexicon;
const firstTag = (word: string) => (Object.hasOwn(lexicon, word) ? [lexicon[word]].flat()[0] : undefined);

describe('the base-form verbs of the English model', () => {
  it('were taken from the installed model (run scripts/write-model-infinitives.mjs after an upgrade)', () => {
    expect(modelVersion).toBe(nlp.version);
    const fromModel = Object.keys(lexicon).filter((word) => firstTag(word) === 'Infinitive');
    expect([...modelInfinitives]).toEqual(fromModel);
  });

  it('answers for any word as the model\'s word list does, in any letter case', () => {
    const words = ['close', 'Open', 'PURGE', 'isolate', 'vent', 'drum', 'charge', 'xylene', 'the', 'constructor', 'toString', '__proto__', 'hasOwnProperty', '', ...Object.keys(lexicon).filter((_, i) => i % 97 === 0)];
    for (const word of words) expect(isModelInfinitive(word), word).toBe(firstTag(word.toLowerCase()) === 'Infinitive');
    // Verbs of plant instructions the word list enters as base forms (others, such as "open" or "stop", it enters
    // first as another part of speech: the check then reads them in their clause).
    expect(['isolate', 'charge', 'drain', 'verify', 'inspect'].every((w) => isModelInfinitive(w))).toBe(true);
    expect(['open', 'stop', 'kettle'].some((w) => isModelInfinitive(w))).toBe(false);
  });
});
