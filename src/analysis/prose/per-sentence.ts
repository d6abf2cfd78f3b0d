// What the writing rules ask of one sentence (does it give an instruction, which numbers lack a unit), answered once:
// the same question is asked while its phrases are gathered for the English model, and again by one rule or more.
// An answer is kept only when it was read from the model's real tags, never from a guess made while gathering, so
// that a kept answer is exactly the one the question would give again. Sentences are the keys: an answer goes
// with the prose it was asked of (prose-sites.ts keeps a procedure's prose until its rules are done).
import { guessesGiven } from './word-tags.ts';
import type { Sentence } from './words.ts';

/** `question` answers never undefined (a kept answer is found with one look-up). */
export function perSentence<R extends NonNullable<unknown> | null>(question: (sentence: Sentence) => R): (sentence: Sentence) => R {
  const answers = new WeakMap<Sentence, R>();
  return (sentence) => {
    const kept = answers.get(sentence);
    if (kept !== undefined) return kept;
    const before = guessesGiven();
    const answer = question(sentence);
    if (guessesGiven() === before) answers.set(sentence, answer);
    return answer;
  };
}
