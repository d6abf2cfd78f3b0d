// Finds numbers in prose that carry no unit ("Set TIC-210 to 45"), leaving counts, labels and ranges alone.
import { tagsAt } from './word-tags.ts';
import { isUnitWord } from '../units.ts';
import type { Sentence, Word } from './words.ts';
import { perSentence } from './per-sentence.ts';

/** Unit words people write in full or as symbols that the unit library does not parse on their own. */
const unitWords = new Set([
  '%', '°c', '°f', 'degc', 'degf', 'deg', 'degrees', 'degree', 'percent', 'per', 'ppm', 'ppb', 'rpm', 'turns', 'turn',
  'hours', 'hour', 'hrs', 'hr', 'minutes', 'minute', 'mins', 'seconds', 'second', 'secs', 'days', 'day', 'weeks',
  'barg', 'bara', 'kpag', 'kpaa', 'psig', 'psia', 'litres', 'liters', 'litre', 'liter', 'tonnes', 'tonne', 'kg/h', 'm3/h',
  'times', 'mg/g', 'wt%', 'vol%', 'ph',
]);

/** Words after which a number is a label, not a measure ("step 4", "pump 2", "channel 2"). */
const labelWords = new Set([
  'step', 'steps', 'section', 'sections', 'page', 'item', 'items', 'line', 'bay', 'stage', 'phase', 'pump', 'tank',
  'rev', 'revision', 'no', 'number', 'batch', 'shift', 'table', 'figure', 'appendix', 'part', 'unit', 'train', 'zone',
  'valve', 'filter', 'position', 'chapter', 'form', 'issue', 'version', 'group', 'lane', 'room', 'door', 'gate',
  'hatch', 'platform', 'floor', 'channel', 'priority', 'class', 'category', 'grade', 'type', 'schedule', 'mode',
  'option', 'case', 'point', 'node', 'nodes', 'loop', 'level', 'division', 'area', 'building', 'cell', 'reactor',
  'tier', 'slot', 'port', 'bank', 'rack', 'panel', 'column', 'row', 'sheet', 'entry', 'list', 'cabinet', 'box',
  // pH and similar indices have no unit by definition.
  'ph', 'index',
  // Telephone and radio numbers.
  'extension', 'ext', 'tel', 'phone', 'telephone', 'code', 'id',
]);

/** English words the unit library also reads as units (at = technical atmosphere, in = inch, a = year). */
const englishWords = new Set(['at', 'in', 'a', 'are', 'am', 'or', 'on', 'it', 'as', 'by', 'an', 'do', 'be', 'he', 'me', 'we', 'us', 'ton', 'cup', 'cc']);

const rangeJoiners = new Set(['and', 'to', 'or', '-', '–', 'and/or']);

/** The word indices of the numbers in a sentence that carry no unit. */
export const bareNumbers = perSentence((sentence: Sentence): readonly number[] => {
  const words = sentence.words;
  const out: number[] = [];
  for (let i = 0; i < words.length; i++) {
    if (words[i].kind !== 'number') continue;
    if (hasUnit(words, i + 1)) continue;
    if (isLabel(words[i - 1])) continue;
    if (words.slice(Math.max(0, i - 3), i).some((w) => w.lower === 'ph')) continue;
    // "between 40 and 50 degC", "40 to 50 degC": the first number shares the second one's unit.
    if (rangeJoiners.has(words[i + 1]?.lower ?? '') && words[i + 2]?.kind === 'number' && hasUnit(words, i + 3)) continue;
    if (isCountedNoun(words, i)) continue;
    out.push(i);
  }
  return out;
});

function hasUnit(words: Word[], at: number): boolean {
  const w = words[at];
  if (!w) return false;
  if (unitWords.has(w.lower)) return true;
  if (englishWords.has(w.lower)) return false;
  return (w.kind === 'word' || (w.kind === 'tag' && !w.text.includes('-'))) && /^[A-Za-z°%][A-Za-z0-9/°%·^.-]*$/.test(w.text) && w.text.length <= 8 && knownUnit(w.text);
}

const unitMemo = new Map<string, boolean>();
/** The unit library parses on every question; plant text repeats the same few units. */
function knownUnit(text: string): boolean {
  let known = unitMemo.get(text);
  if (known === undefined) unitMemo.set(text, (known = isUnitWord(text)));
  return known;
}

function isLabel(previous: Word | undefined): boolean {
  if (!previous) return false;
  if (labelWords.has(previous.lower)) return true;
  // "Unit 2", "Bay 3", "Appendix 4": a capitalised name followed by a number is a label.
  return previous.kind === 'word' && /^[A-Z][a-z]+$/.test(previous.text) && !/^(Set|Add|Hold|Charge|Wait|Raise|Lower|Heat|Cool|Keep|Run|Take|Draw|Tip)$/.test(previous.text);
}

/** A number followed by the noun it counts: "2 bags", "one 100 g sample" (the noun read by the English model). */
function isCountedNoun(words: Word[], at: number): boolean {
  const next = words[at + 1];
  if (!next || next.kind !== 'word') return false;
  const phrase = words.slice(at, at + 2).map((w) => (w.kind === 'tag' ? 'Tagx' : w.text)).join(' ');
  const tags = tagsAt(`Take ${phrase}`, 2);
  return tags.has('Noun') || tags.has('Adjective');
}

/** Whether the sentence states a quantity: a number with its unit. */
export function statesQuantity(sentence: Sentence): boolean {
  return sentence.words.some((w, i) => w.kind === 'number' && hasUnit(sentence.words, i + 1));
}
