// Finds instructions in prose: does a sentence start with an action verb, and does it chain a second one?
import { isModelInfinitive, tagsAt } from './word-tags.ts';
import type { Sentence, Word } from './words.ts';
import { perSentence } from './per-sentence.ts';

/**
 * Plant verbs the English model (compromise 14) does not read as verbs at the head of an instruction, measured
 * with "<Verb> the valve", "<Verb> pump P-211", "<Verb> P-211", "<Verb> all drains", "<Verb> it" and
 * "<Verb> the line to the drum": each word here failed at least one of them (e.g. "Vent the kettle" → noun
 * "vent"). Open, close, start, stop, charge and sample were checked too and need no entry.
 * Re-measure when compromise is upgraded; keep the list to words that fail.
 */
export const plantVerbs = new Set([
  'vent', 'purge', 'flush', 'dose', 'steam', 'depressure', 'inert', 'blank', 'reset', 'strap', 'gauge', 'torque', 'earth',
  'spade', 'hose', 'sparge', 'pad', 'blanket', 'brief', 'radio', 'barricade', 'cordon', 'muster', 'throttle', 'ramp',
  'skim', 'decant', 'rinse', 'scrub', 'rig', 'backflush', 'compare', 'initial', 'zero', 'pig', 'swab',
]);

/** Words that open an object: what an imperative verb acts on. */
const determiners = new Set([
  'the', 'a', 'an', 'all', 'each', 'every', 'both', 'any', 'this', 'that', 'these', 'those', 'its', 'their', 'it', 'them', 'not', 'no',
]);
/** Particles of phrasal verbs ("top up", "lock out"). */
const particles = new Set(['up', 'down', 'out', 'off', 'on', 'in', 'over', 'back']);

const conditionOpeners = new Set(['if', 'when', 'whenever', 'once', 'after', 'before', 'while', 'as', 'where', 'unless', 'until']);
const finiteVerbs = new Set([
  'is', 'are', 'was', 'were', 'has', 'have', 'had', 'can', 'could', 'will', 'would', 'must', 'may', 'might', 'should', 'shall',
  'runs', 'trips', 'stops', 'starts', 'opens', 'closes', 'keeps', 'stays', 'holds', 'reads', 'shows', 'needs', 'takes',
]);
const modals = new Set(['must', 'should', 'shall', 'will', 'may', 'can', 'need', 'needs']);
const subjects = new Set(['you', 'operator', 'operators', 'the operator', 'personnel']);

/** The index of the first word of the main clause: skips a leading "If …, (then)" or "When …," clause and a leading adverb. */
export function mainClauseStart(sentence: Sentence): number {
  const words = sentence.words;
  let i = 0;
  if (words.length && conditionOpeners.has(words[0].lower)) {
    const thenAt = words.findIndex((w, k) => k > 0 && w.text === 'THEN');
    const thenLower = words.findIndex((w, k) => k > 0 && w.lower === 'then' && sentence.breaksBefore.has(k));
    const breakAt = [...sentence.breaksBefore].filter((k) => k > 0).sort((a, b) => a - b)[0];
    if (thenAt > 0) i = thenAt + 1;
    else if (thenLower > 0) i = thenLower + 1;
    else if (breakAt !== undefined) i = breakAt;
    else return words.length;
    if (words[i]?.lower === 'then') i++;
  }
  if (words[i] && /ly$/.test(words[i].lower) && words[i].kind === 'word' && words[i + 1]) i++;
  return i;
}

/** Whether the word at `index` reads as an imperative verb (base form) in its clause. */
export function isImperativeVerbAt(words: Word[], index: number): boolean {
  const word = words[index];
  if (!word || word.kind !== 'word') return false;
  // Compound verbs are read by their last part: "Re-inert", "Bump-start", "Double-check".
  const lower = word.lower.split('-').at(-1)!;
  if (lower === 'do' && words[index + 1]?.lower === 'not') return true;
  if (lower === 'never') return true;
  if (plantVerbs.has(lower)) return true;
  // Cheap answers first; parsing a phrase costs milliseconds. A base-form verb in the model's word list is a
  // verb in this position; a function word never is.
  if (isModelInfinitive(lower)) return true;
  if (determiners.has(lower) || prepositions.has(lower) || conditionOpeners.has(lower) || chainWords.has(lower) || modals.has(lower)) return false;
  // The model reads the clause as a sentence of its own, so the word stands where an imperative stands. Plant
  // objects often read as noun compounds ("Remove pump P-211"), so the clause is asked again with "the" before
  // the object. (Prefixing "You" was tried: the model then calls any unknown word a verb, "You xylene charge …".)
  const verb = lower[0].toUpperCase() + lower.slice(1);
  const object = words.slice(index + 1, index + 5).map((w) => (w.kind === 'tag' ? 'Tagx' : w.text));
  if (isBaseVerb(tagsAt([verb, ...object].join(' '), 0))) return true;
  const withThe = ['the', ...(determiners.has(object[0]?.toLowerCase() ?? '') ? object.slice(1) : object)];
  return isBaseVerb(tagsAt([verb, ...withThe].join(' '), 0));
}

function isBaseVerb(tags: ReadonlySet<string>): boolean {
  return tags.has('Verb') && !['Gerund', 'PastTense', 'Copula', 'Modal', 'Auxiliary', 'Participle', 'PerfectTense'].some((t) => tags.has(t));
}

/** A sentence that starts its main clause with an imperative verb. */
export const startsWithActionVerb = perSentence((sentence: Sentence): boolean => {
  const i = mainClauseStart(sentence);
  return isImperativeVerbAt(sentence.words, i);
});

/**
 * Whether a sentence gives an instruction. Stricter than `startsWithActionVerb`, because notes and hazard
 * texts often begin with a noun that can be a verb ("Charge totals are recorded"): the verb must be followed
 * by the start of an object, or be an explicit obligation ("Do not", "Ensure", "You must").
 */
export const givesInstruction = perSentence((sentence: Sentence): Readonly<{ at: number }> | null => {
  const words = sentence.words;
  const i = mainClauseStart(sentence);
  const w = words[i];
  if (!w) return null;
  if ((w.lower === 'do' && words[i + 1]?.lower === 'not') || w.lower === 'never' || w.lower === 'ensure') return { at: i };
  if (w.lower === 'make' && words[i + 1]?.lower === 'sure') return { at: i };
  for (let k = 0; k + 1 < words.length; k++) {
    const two = `${words[k].lower} ${words[k + 1]?.lower}`;
    if ((subjects.has(words[k].lower) || subjects.has(two)) && modals.has(words[k + (subjects.has(two) ? 2 : 1)]?.lower ?? '')) return { at: k };
  }
  if (!isImperativeVerbAt(words, i) || !opensObject(words, i + 1, true)) return null;
  // "Pump P-251 running dry", "Agitator M-210 is stopped": a tag followed by a verb of its own is a subject, not an object.
  const afterTag = words[i + 1]?.kind === 'tag' ? words[i + 2] : undefined;
  if (afterTag && (/ing$/.test(afterTag.lower) || finiteVerbs.has(afterTag.lower))) return null;
  return { at: i };
});

/**
 * An object starts with a determiner, pronoun, number or tag, or a particle and then one of those ("up the tank").
 * Unless `strict`, a short noun phrase naming a tag counts too ("start pump P-211").
 */
function opensObject(words: Word[], at: number, strict = false): boolean {
  const next = words[at];
  if (!next) return false;
  if (next.kind === 'tag' || next.kind === 'number' || determiners.has(next.lower)) return true;
  if (particles.has(next.lower)) {
    const after = words[at + 1];
    return !after || after.kind === 'tag' || after.kind === 'number' || determiners.has(after.lower);
  }
  if (strict) return false;
  for (let k = at; k < Math.min(words.length, at + 3); k++) {
    if (words[k].kind === 'tag') return true;
    if (words[k].kind !== 'word' || chainWords.has(words[k].lower) || prepositions.has(words[k].lower)) return false;
    if (/ing$/.test(words[k].lower) || finiteVerbs.has(words[k].lower)) return false;
  }
  return false;
}

const prepositions = new Set(['to', 'from', 'with', 'for', 'at', 'by', 'into', 'of', 'under', 'on', 'in', 'through', 'until', 'below', 'above']);

const chainWords = new Set(['and', 'then', 'also']);

/**
 * Imperative verbs after the first one in a clause chain: "Open XV-1 and start P-1", "Drain the line, then flush it".
 * Returns the word indices of the extra verbs. A verb must start an object to count, so that
 * "Check the vent and drain valves" (a noun list) is not read as two actions.
 */
export const chainedImperatives = perSentence((sentence: Sentence): readonly number[] => {
  const words = sentence.words;
  const start = mainClauseStart(sentence);
  if (!isImperativeVerbAt(words, start)) return [];
  const out: number[] = [];
  let subordinate = false;
  for (let k = start + 1; k < words.length; k++) {
    const w = words[k];
    // Inside "until …", "so that …", "while …" the verbs describe the plant, not the operator.
    if (conditionOpeners.has(w.lower) || w.lower === 'that' || w.lower === 'which') subordinate = true;
    const broken = sentence.breaksBefore.has(k);
    if (broken && !chainWords.has(w.lower)) subordinate = false;
    let candidate = -1;
    if (chainWords.has(w.lower)) {
      candidate = words[k + 1]?.lower === 'then' ? k + 2 : k + 1;
      if (w.lower === 'and' && subordinate) continue;
      if (w.lower !== 'and') subordinate = false;
    } else if (broken) candidate = k;
    if (candidate < 0 || candidate >= words.length) continue;
    if (isImperativeVerbAt(words, candidate) && opensObject(words, candidate + 1)) {
      out.push(candidate);
      k = candidate;
    }
  }
  return out;
});
