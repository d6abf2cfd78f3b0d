// Splits plant prose into sentences and words, keeping each word's offset so reports can point at it.

export type WordKind = 'word' | 'tag' | 'number' | 'time' | 'symbol';

export interface Word {
  text: string;
  /** Lower-case text, for list look-ups. */
  lower: string;
  kind: WordKind;
  from: number;
  to: number;
}

export interface Sentence {
  text: string;
  from: number;
  to: number;
  words: Word[];
  /** Offsets of clause breaks (, ; :) inside the sentence, as word indices: the word after the break. */
  breaksBefore: Set<number>;
}

// A tag names plant equipment or a document: it holds a digit and is not a plain number (K-210, XV-2101, FFP3, E-222, 2026-04-20).
const tagPattern = /^(?=.*\d)(?=.*[A-Za-z-])[A-Za-z0-9]+(?:[-/.][A-Za-z0-9]+)*$/;
const numberPattern = /^[-+]?\d+(?:[.,]\d+)*(?:\.\.\d+(?:[.,]\d+)*)?$/;
const timePattern = /^\d{1,2}:\d{2}$/;
const tokenPattern = /[A-Za-z0-9°][A-Za-z0-9°'’./:+-]*[A-Za-z0-9°]|[A-Za-z0-9°]|[^\sA-Za-z0-9]/g;
/** Abbreviations whose full stop does not end a sentence. */
const abbreviations = new Set(['e.g', 'i.e', 'approx', 'no', 'nos', 'fig', 'ref', 'vs', 'etc', 'min']);

export function splitWords(text: string, offset = 0): Word[] {
  const out: Word[] = [];
  for (const m of text.matchAll(tokenPattern)) {
    let token = m[0];
    let from = m.index;
    // A trailing full stop or colon belongs to the sentence, not the word ("… to 50 degC.").
    const last = token.charCodeAt(token.length - 1);
    const trail = token.length > 1 && (last === 46 || last === 58) ? /[.:]+$/.exec(token) : null;
    if (trail && !numberPattern.test(token)) token = token.slice(0, trail.index);
    out.push({ text: token, lower: token.toLowerCase(), kind: kindOf(token), from: offset + from, to: offset + from + token.length });
    if (trail && token.length < m[0].length) {
      from += token.length;
      out.push({ text: m[0].slice(token.length), lower: '.', kind: 'symbol', from: offset + from, to: offset + from + m[0].length - token.length });
    }
  }
  return out;
}

const digit = /\d/;

function kindOf(token: string): WordKind {
  // A time, a number and a tag each hold a digit: without one, a token is a word or a symbol.
  if (!digit.test(token)) return /^[^A-Za-z0-9°%]+$/.test(token) ? 'symbol' : 'word';
  if (timePattern.test(token)) return 'time';
  if (numberPattern.test(token)) return 'number';
  if (/^[^A-Za-z0-9°%]+$/.test(token)) return 'symbol';
  if (tagPattern.test(token) && /\d/.test(token) && !/^\d+(?:st|nd|rd|th)$/i.test(token)) return 'tag';
  return 'word';
}

/**
 * Sentences end at . ! ? or a blank line, and a list item on a new line starts one; decimals and tags with dots stay
 * whole because words come first.
 */
export function splitSentences(text: string): Sentence[] {
  const words = splitWords(text);
  const sentences: Sentence[] = [];
  let start = 0;
  const flush = (end: number) => {
    const slice = words.slice(start, end).filter((w, i, all) => !(w.kind === 'symbol' && i === all.length - 1 && /^[.!?]+$/.test(w.text)));
    if (slice.some((w) => w.kind !== 'symbol')) {
      const from = slice[0].from;
      const to = slice.at(-1)!.to;
      const breaksBefore = new Set<number>();
      const kept: Word[] = [];
      for (const w of slice) {
        if (w.kind === 'symbol' && /^[,;:]$/.test(w.text)) breaksBefore.add(kept.length);
        else if (w.kind !== 'symbol' || w.text === '%' || w.text === '°') kept.push(w);
      }
      sentences.push({ text: text.slice(from, to), from, to, words: kept, breaksBefore });
    }
    start = end;
  };
  // A list that starts the text: its first marker belongs to no sentence either.
  if (words.length > 1 && isListMarker(text, words[0]) && text.slice(0, words[0].from).trim() === '') start = 1;
  let newline = text.indexOf('\n');
  for (let i = 0; i < words.length; i++) {
    const w = words[i];
    const next = words[i + 1];
    const abbreviation = w.text === '.' && i > 0 && abbreviations.has(words[i - 1].lower) && words[i - 1].to === w.from
      && !(next && /^[A-Z]/.test(next.text) && words[i - 1].lower === 'min');
    const endsSentence = w.kind === 'symbol' && /^[.!?]+$/.test(w.text) && !abbreviation;
    // Words are mostly a space apart: only a gap with a line break in it can break the sentence. The next line
    // break is found once for all the words before it.
    if (newline !== -1 && newline < w.to) newline = text.indexOf('\n', w.to);
    const lineBreak = i + 1 < words.length && newline !== -1 && newline < words[i + 1].from;
    // A list item on a new line ("- open XV-2101", "* start P-211") starts a sentence of its own; its marker is
    // a word of its own (a symbol), and belongs to neither sentence.
    const listItem = lineBreak && isListMarker(text, words[i + 1]);
    if (endsSentence || (lineBreak && /\n\s*\n/.test(text.slice(w.to, words[i + 1].from))) || listItem) flush(i + 1);
    if (listItem) start = i + 2;
  }
  flush(words.length);
  return sentences;
}

/** A '-', '*' or '+' that a space follows: the marker of a list item, when it starts a line. */
function isListMarker(text: string, word: Word): boolean {
  return word.kind === 'symbol' && (word.text === '-' || word.text === '*' || word.text === '+') && /\s/.test(text[word.to] ?? '');
}

/** Words that count for sentence length: everything but punctuation. */
export function countWords(sentence: Sentence): number {
  return sentence.words.filter((w) => w.kind !== 'symbol').length;
}
