// Asks the English model (compromise) for the part-of-speech tags of one word in a short context, memoised.
import nlp from 'compromise';

const memo = new Map<string, Set<string>>();

/** Tags of the term at `index` when `phrase` is read as one sentence. Calls cost milliseconds, so answers are kept. */
export function tagsAt(phrase: string, index: number): Set<string> {
  const key = `${index}\u0000${phrase}`;
  let tags = memo.get(key);
  if (!tags) {
    const term = nlp(phrase).terms().json()[index] as { terms: Array<{ tags: string[] }> } | undefined;
    tags = new Set(term?.terms[0]?.tags ?? []);
    if (memo.size > 50_000) memo.clear();
    memo.set(key, tags);
  }
  return tags;
}
