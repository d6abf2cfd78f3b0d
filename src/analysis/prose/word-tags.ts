// Asks the English model (compromise) for the part-of-speech tags of one word in a short context, memoised.
import nlp from 'compromise';

const memo = new Map<string, Set<string>>();

/** Tags of the term at `index` when `phrase` is read as one sentence. Calls cost milliseconds, so answers are kept. */
export function tagsAt(phrase: string, index: number): Set<string> {
  const key = `${index}\u0000${phrase}`;
  let tags = memo.get(key);
  if (!tags) {
    // Reading the tagged document directly costs half of what .terms().json() does.
    const doc = nlp(phrase) as unknown as { document: Array<Array<{ tags: Set<string> }>> };
    const terms = doc.document.flat();
    tags = new Set(terms[index]?.tags ?? []);
    if (memo.size > 50_000) memo.clear();
    memo.set(key, tags);
  }
  return tags;
}

const lexicon = (nlp as unknown as { world(): { model: { one: { lexicon: Record<string, string | string[]> } } } }).world().model.one.lexicon;

/** The tag the model's own word list gives a word, without parsing (undefined for words it derives by rule). */
export function lexiconTag(word: string): string | undefined {
  const tag = lexicon[word.toLowerCase()];
  return Array.isArray(tag) ? tag[0] : tag;
}
