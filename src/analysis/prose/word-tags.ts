// Asks the English model (compromise) for the part-of-speech tags of one word in a short context, memoised.
// The model is loaded on first use (half a second): a run that reads no prose (every file found in the result
// cache) never loads it. It is the package's single-file build, the same version and code as its module entry.
import { dependencyRequire } from '../load-dependency.ts';
import { lexiconOnThread, modelThreadRunning, tagOnThread } from './model-thread.ts';

type Term = { text: string; pre: string; post: string; tags: Set<string> };
type Tagged = { document: Term[][]; compute(steps: string[]): unknown };
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
function tag(text: string): Term[][] {
  // The model on its own thread, when the command line started one (see model-thread.ts): the same tags.
  if (modelThreadRunning()) {
    const sentences = tagOnThread(text);
    if (sentences) return sentences.map((terms) => terms.map(([text, pre, post, tags]) => ({ text, pre, post, tags: new Set(tags) })));
  }
  const model = nlp();
  taggingSteps ??= model.world().hooks.filter((step) => step !== 'chunks');
  const doc = model.tokenize(text);
  doc.compute(taggingSteps);
  return doc.document;
}

/** Each phrase's terms' tags, by phrase. */
const memo = new Map<string, Array<Set<string>>>();
const none: ReadonlySet<string> = new Set();

function remember(phrase: string, terms: Term[]): void {
  if (memo.size > 50_000) memo.clear();
  memo.set(phrase, terms.map((t) => t.tags));
}

/** While phrases are being gathered ahead: every phrase asked for, and the answer given in the meantime. */
let gathering: { phrases: Set<string>; answer: ReadonlySet<string> } | undefined;

/** Tags of the term at `index` when `phrase` is read as one sentence. Calls cost milliseconds, so answers are kept. */
export function tagsAt(phrase: string, index: number): ReadonlySet<string> {
  let terms = memo.get(phrase);
  if (!terms) {
    if (gathering) {
      gathering.phrases.add(phrase);
      return gathering.answer;
    }
    // Reading the tagged document directly costs half of what .terms().json() does.
    remember(phrase, tag(phrase).flat());
    terms = memo.get(phrase)!;
  }
  return terms[index] ?? none;
}

/**
 * Tags ahead, in one reading, every phrase that `ask` would ask `tagsAt` for: the model reads one document of
 * many sentences several times faster than the same sentences one call each. `ask` is run twice while phrases
 * are gathered, once with every answer "no tags" and once with every answer "verb, noun and adjective", so that
 * the phrases asked after either answer are gathered. A phrase missed here is tagged when it is asked, as
 * before; a phrase whose sentence the model does not read back exactly as written (a full stop or question mark
 * inside it) is left to that too. Answers are the same either way: each sentence is tagged on its own.
 * Returns how many phrases were tagged ahead.
 */
export function tagAhead(ask: () => void): number {
  let tagged = 0;
  // Answers found in one round open paths the guesses did not take: gather again until nothing new turns up.
  for (let round = 0; round < 3; round++) {
    const phrases = new Set<string>();
    for (const answer of [none, new Set(['Verb', 'Noun', 'Adjective'])]) {
      gathering = { phrases, answer };
      try {
        ask();
      } finally {
        gathering = undefined;
      }
    }
    const batch = [...phrases].filter((p) => p.length > 0 && p.trim() === p && !/[.!?;:\n\r]/.test(p));
    if (batch.length < 2) return tagged;
    // One sentence a line: a full stop and a space after "a" or "an" reads as an abbreviation, a line break never.
    const sentences = tag(batch.map((p) => `${p}.`).join('\n'));
    // Sentences and phrases are matched in order; should the model join phrases into one sentence, those phrases
    // are left to be tagged when asked, and matching stops wherever the text stops lining up.
    let next = 0;
    for (const terms of sentences) {
      const text = terms.map((t) => t.pre + t.text + t.post).join('').trimEnd();
      let joined = '';
      const first = next;
      while (next < batch.length && joined.length < text.length) joined += `${joined ? '\n' : ''}${batch[next++]}.`;
      if (joined !== text) return tagged;
      if (next === first + 1) {
        remember(batch[first], terms);
        tagged++;
      }
    }
  }
  return tagged;
}

let lexicon: Record<string, string | string[]> | undefined;
/** The thread's answers, by word. */
const lexiconAnswers = new Map<string, string | string[] | undefined>();

/** The tag the model's own word list gives a word, without parsing (undefined for words it derives by rule). */
export function lexiconTag(word: string): string | undefined {
  const key = word.toLowerCase();
  let entry: string | string[] | undefined;
  if (!lexicon && lexiconAnswers.has(key)) entry = lexiconAnswers.get(key);
  else {
    const answer = !lexicon && modelThreadRunning() ? lexiconOnThread(key) : { found: false as const };
    if (answer.found) lexiconAnswers.set(key, (entry = answer.value));
    else {
      lexicon ??= nlp().world().model.one.lexicon;
      // Only the word list's own entries (not what every object inherits, such as 'constructor').
      entry = Object.hasOwn(lexicon, key) ? lexicon[key] : undefined;
    }
  }
  return Array.isArray(entry) ? entry[0] : entry;
}
