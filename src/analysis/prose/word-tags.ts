// Asks the English model (compromise) for the part-of-speech tags of one word in a short context, memoised.
// The model is loaded on first use (half a second): a run that reads no prose (every file found in the result
// cache) never loads it. It is the package's single-file build, the same version and code as its module entry.
import { dependencyRequire } from '../load-dependency.ts';

type Tagged = { document: Array<Array<{ tags: Set<string> }>>; compute(steps: string[]): unknown };
type Nlp = ((text: string) => Tagged) & {
  tokenize(text: string): Tagged;
  world(): { hooks: string[]; model: { one: { lexicon: Record<string, string | string[]> } } };
};

let model: Nlp | undefined;
function nlp(): Nlp {
  if (!model) {
    const { require, entry } = dependencyRequire('compromise');
    model = require(entry) as Nlp;
  }
  return model;
}

/**
 * The model's own steps for a text, without the last one (grouping words into chunks, which adds no tags): the
 * same tags in about half the time.
 */
let taggingSteps: string[] | undefined;
function tag(phrase: string): Tagged {
  const model = nlp();
  taggingSteps ??= model.world().hooks.filter((step) => step !== 'chunks');
  const doc = model.tokenize(phrase);
  doc.compute(taggingSteps);
  return doc;
}

const memo = new Map<string, Set<string>>();

/** Tags of the term at `index` when `phrase` is read as one sentence. Calls cost milliseconds, so answers are kept. */
export function tagsAt(phrase: string, index: number): Set<string> {
  const key = `${index}\u0000${phrase}`;
  let tags = memo.get(key);
  if (!tags) {
    // Reading the tagged document directly costs half of what .terms().json() does.
    const terms = tag(phrase).document.flat();
    tags = new Set(terms[index]?.tags ?? []);
    if (memo.size > 50_000) memo.clear();
    memo.set(key, tags);
  }
  return tags;
}

let lexicon: Record<string, string | string[]> | undefined;

/** The tag the model's own word list gives a word, without parsing (undefined for words it derives by rule). */
export function lexiconTag(word: string): string | undefined {
  lexicon ??= nlp().world().model.one.lexicon;
  const tag = lexicon[word.toLowerCase()];
  return Array.isArray(tag) ? tag[0] : tag;
}
