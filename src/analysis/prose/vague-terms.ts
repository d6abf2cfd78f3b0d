// Finds vague terms that leave the operator to guess a value ("as required", "sufficient", "approximately").
import type { Sentence } from './words.ts';

export interface VagueTerm {
  /** Word index of the term's first word. */
  at: number;
  /** Number of words the term spans. */
  length: number;
  term: string;
}

/**
 * Each term and when it is excused: `value-after` when a number follows it directly ("approximately 50 kg"),
 * `value-in-sentence` when the same sentence states a quantity ("add sufficient water to reach 40 percent").
 */
const terms: Array<{ words: string[]; excused: 'value-after' | 'value-in-sentence' | 'never' }> = [
  { words: ['as', 'required'], excused: 'value-in-sentence' },
  { words: ['as', 'needed'], excused: 'value-in-sentence' },
  { words: ['as', 'necessary'], excused: 'value-in-sentence' },
  { words: ['if', 'necessary'], excused: 'value-in-sentence' },
  { words: ['if', 'needed'], excused: 'value-in-sentence' },
  { words: ['if', 'required'], excused: 'value-in-sentence' },
  { words: ['as', 'appropriate'], excused: 'value-in-sentence' },
  { words: ['where', 'appropriate'], excused: 'value-in-sentence' },
  { words: ['appropriate'], excused: 'value-in-sentence' },
  { words: ['sufficient'], excused: 'value-in-sentence' },
  { words: ['sufficiently'], excused: 'value-in-sentence' },
  { words: ['adequate'], excused: 'value-in-sentence' },
  { words: ['adequately'], excused: 'value-in-sentence' },
  { words: ['enough'], excused: 'value-in-sentence' },
  { words: ['approximately'], excused: 'value-after' },
  { words: ['approx'], excused: 'value-after' },
  { words: ['roughly'], excused: 'value-after' },
  { words: ['several'], excused: 'never' },
  { words: ['a', 'few'], excused: 'never' },
  { words: ['a', 'little'], excused: 'never' },
  { words: ['briefly'], excused: 'value-in-sentence' },
  { words: ['shortly'], excused: 'value-in-sentence' },
  { words: ['periodically'], excused: 'value-in-sentence' },
  { words: ['regularly'], excused: 'value-in-sentence' },
  { words: ['frequently'], excused: 'value-in-sentence' },
  { words: ['occasionally'], excused: 'value-in-sentence' },
  { words: ['as', 'soon', 'as', 'possible'], excused: 'never' },
  { words: ['as', 'low', 'as', 'possible'], excused: 'never' },
  { words: ['for', 'a', 'while'], excused: 'never' },
];

/** The terms by their first word, in the order above, so that each word of a sentence is looked up once. */
const byFirstWord = new Map<string, typeof terms>();
for (const t of terms) {
  const list = byFirstWord.get(t.words[0]) ?? [];
  list.push(t);
  byFirstWord.set(t.words[0], list);
}

/**
 * The vague terms of a sentence, left to right; where two terms start at one word, the one listed first above.
 * `hasQuantity` (whether the sentence states a quantity) is asked only when a term that it excuses is found.
 */
export function vagueTerms(sentence: Sentence, hasQuantity: () => boolean): VagueTerm[] {
  const words = sentence.words;
  const out: VagueTerm[] = [];
  let quantity: boolean | undefined;
  for (let i = 0; i < words.length; i++) {
    const candidates = byFirstWord.get(words[i].lower);
    if (!candidates) continue;
    for (const t of candidates) {
      if (!t.words.every((w, k) => words[i + k]?.lower === w)) continue;
      const after = words[i + t.words.length];
      if (t.excused === 'value-after' && after?.kind === 'number') continue;
      if (t.excused === 'value-in-sentence' && (quantity ??= hasQuantity())) continue;
      out.push({ at: i, length: t.words.length, term: t.words.join(' ') });
      i += t.words.length - 1;
      break;
    }
  }
  return out;
}
