// Asks the English model (compromise) for the part-of-speech tags of one word in a short context, memoised.
// The model is loaded on first use (half a second): a run that reads no prose (every file found in the result
// cache) never loads it. It is the package's single-file build, the same version and code as its module entry.
import { dependencyRequire } from '../load-dependency.ts';
import { modelInfinitives } from './model-infinitives.ts';
import { answered, modelThreadRunning, postTagging, tagOnThread, takeTagged, type TermData, type Ticket } from './model-thread.ts';

type Term = { text: string; pre: string; post: string; tags: Set<string> };
type Tagged = { document: Term[][]; compute(steps: string[]): unknown };
type Nlp = ((text: string) => Tagged) & {
  tokenize(text: string): Tagged;
  world(): { hooks: string[] };
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
    if (sentences) return fromThread(sentences);
  }
  const model = nlp();
  taggingSteps ??= model.world().hooks.filter((step) => step !== 'chunks');
  const doc = model.tokenize(text);
  doc.compute(taggingSteps);
  return doc.document;
}

function fromThread(sentences: TermData[][]): Term[][] {
  return sentences.map((terms) => terms.map(([text, pre, post, tags]) => ({ text, pre, post, tags: new Set(tags) })));
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
/** How many guessed answers gathering has given, ever: a reading that gave none read the model's real answers. */
let guessCount = 0;

/** How many guessed answers have been given so far; unchanged across a reading, that reading's answers were real. */
export function guessesGiven(): number {
  return guessCount;
}

/** Tags of the term at `index` when `phrase` is read as one sentence. Calls cost milliseconds, so answers are kept. */
export function tagsAt(phrase: string, index: number): ReadonlySet<string> {
  let terms = memo.get(phrase);
  if (!terms) {
    if (gathering) {
      gathering.phrases.add(phrase);
      guessCount++;
      return gathering.answer;
    }
    // Sent to the thread ahead: its answer (and those sent before it) is taken rather than asked again.
    if (postedPhrases.has(phrase)) settlePosted((entry) => entry.batch.includes(phrase));
    terms = memo.get(phrase);
    if (terms) return terms[index] ?? none;
    // Reading the tagged document directly costs half of what .terms().json() does.
    remember(phrase, tag(phrase).flat());
    terms = memo.get(phrase)!;
  }
  return terms[index] ?? none;
}

/** The answers gathering gives in turn for a phrase it has no answer for. */
const guessedAnswers: ReadonlyArray<ReadonlySet<string>> = [none, new Set(['Verb', 'Noun', 'Adjective'])];

/**
 * Every phrase `ask` would ask `tagsAt` for and that has no answer yet. `ask` is run twice, once with every
 * answer "no tags" and once with every answer "verb, noun and adjective", so that the phrases asked after either
 * answer are gathered. When the first run met no phrase without an answer, no guess was given, so the second would
 * take the same path with the same answers and find nothing: it is not run.
 */
function gather(ask: () => void): Set<string> {
  const phrases = new Set<string>();
  for (const answer of guessedAnswers) {
    gathering = { phrases, answer };
    try {
      ask();
    } finally {
      gathering = undefined;
    }
    if (phrases.size === 0) break;
  }
  return phrases;
}

/** The phrases that can be read as sentences of one document (no full stop or question mark inside). */
function readable(phrases: Iterable<string>): string[] {
  return [...phrases].filter((p) => p.length > 0 && p.trim() === p && !/[.!?;:\n\r]/.test(p));
}

/** One sentence a line: a full stop and a space after "a" or "an" reads as an abbreviation, a line break never. */
function asDocument(batch: string[]): string {
  return batch.map((p) => `${p}.`).join('\n');
}

/**
 * Keeps the tags of each phrase of `batch` from the tagged document of asDocument(batch). Sentences and phrases are
 * matched in order; should the model join phrases into one sentence, those phrases are left to be tagged when asked,
 * and matching stops wherever the text stops lining up. Returns how many phrases were kept.
 */
function rememberDocument(batch: string[], sentences: Term[][]): number {
  let kept = 0;
  let next = 0;
  for (const terms of sentences) {
    const text = terms.map((t) => t.pre + t.text + t.post).join('').trimEnd();
    let joined = '';
    const first = next;
    while (next < batch.length && joined.length < text.length) joined += `${joined ? '\n' : ''}${batch[next++]}.`;
    if (joined !== text) return kept;
    if (next === first + 1) {
      remember(batch[first], terms);
      kept++;
    }
  }
  return kept;
}

/**
 * Tags ahead, in one reading, every phrase that `ask` would ask `tagsAt` for: the model reads one document of
 * many sentences several times faster than the same sentences one call each. A phrase missed here is tagged when
 * it is asked, as before; a phrase whose sentence the model does not read back exactly as written (a full stop or
 * question mark inside it) is left to that too. Answers are the same either way: each sentence is tagged on its own.
 * `key` names what `ask` reads (a procedure): when its phrases were sent to the thread by tagAheadLater, that answer
 * is taken first. Returns how many phrases were tagged ahead in this call.
 */
export function tagAhead(ask: () => void, key?: object): number {
  if (key && postedKeys.has(key)) settlePosted((entry) => entry.key === key);
  // Gathered ahead with nothing new to send: gathering again would find the same nothing (a phrase missed all the
  // same is tagged when it is asked), so the rules' own reading is spared a second gathering.
  else if (key && gatheredNothing.has(key)) return 0;
  let tagged = 0;
  // Answers found in one round open paths the guesses did not take: gather again until nothing new turns up.
  for (let round = 0; round < 3; round++) {
    const batch = readable(gather(ask));
    if (batch.length < 2) return tagged;
    const kept = rememberDocument(batch, tag(asDocument(batch)));
    tagged += kept;
  }
  return tagged;
}

/** Phrases sent to the thread and not yet taken back, in the order they were sent. */
const posted: Array<{ key: object; batch: string[]; ticket: Ticket }> = [];
const postedPhrases = new Set<string>();
const postedKeys = new Set<object>();
/** What was gathered ahead and had no phrase left to send (every one answered or sent for another key). */
const gatheredNothing = new WeakSet<object>();

/**
 * Sends the phrases `ask` would ask about (the first round of tagAhead) to the model's thread without waiting, so
 * that the thread tags them while the main thread goes on; tagAhead(ask, key) or tagsAt takes the answer. Does
 * nothing without a thread. Phrases already answered or already sent are not sent again.
 */
export function tagAheadLater(key: object, ask: () => void): void {
  if (!modelThreadRunning() || postedKeys.has(key)) return;
  if (gatheredNothing.has(key)) return;
  // Answers that have come in are taken first: a phrase they answer is followed as the model reads it, not guessed.
  settleArrived();
  const batch = readable(gather(ask)).filter((p) => !postedPhrases.has(p));
  if (batch.length < 2) {
    gatheredNothing.add(key);
    return;
  }
  const ticket = postTagging(asDocument(batch));
  if (ticket === undefined) return;
  posted.push({ key, batch, ticket });
  postedKeys.add(key);
  for (const phrase of batch) postedPhrases.add(phrase);
}

/**
 * Whether tagAhead(ask, key) would find the answer sent ahead for `key` without waiting for the thread: true when
 * it has come, or when nothing was sent for `key` (nothing to wait for). The thread answers in the order asked.
 */
export function taggedAheadReady(key: object): boolean {
  if (!postedKeys.has(key)) return true;
  const entry = posted.find((e) => e.key === key);
  return entry === undefined || answered(entry.ticket);
}

/** Takes, in order, the answers sent ahead that have come in already; never waits. */
function settleArrived(): void {
  while (posted.length && answered(posted[0].ticket)) {
    const first = posted[0];
    settlePosted((entry) => entry === first);
  }
}

/** Takes the answers sent ahead, in order, up to and including the first entry `until` accepts. */
function settlePosted(until: (entry: (typeof posted)[number]) => boolean): void {
  while (posted.length) {
    const entry = posted.shift()!;
    postedKeys.delete(entry.key);
    for (const phrase of entry.batch) postedPhrases.delete(phrase);
    const sentences = takeTagged(entry.ticket);
    if (!sentences) {
      // The thread has stopped: what was sent is tagged in the main thread when asked.
      posted.length = 0;
      postedKeys.clear();
      postedPhrases.clear();
      return;
    }
    rememberDocument(entry.batch, fromThread(sentences));
    if (until(entry)) return;
  }
}

let infinitives: ReadonlySet<string> | undefined;

/**
 * Whether the model's own word list enters a word (lower case) first as a base-form verb. Answered from the list
 * taken from the model (model-infinitives.ts, checked against it by a test), so that neither the model nor its
 * thread is waited for: the first instruction of a run is read while the model is still loading.
 */
export function isModelInfinitive(word: string): boolean {
  infinitives ??= new Set(modelInfinitives);
  return infinitives.has(word.toLowerCase());
}
