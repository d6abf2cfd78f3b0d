// Splitting plant prose into sentences and words, with offsets that point back into the text.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { countWords, splitSentences, splitWords } from '../../../src/analysis/prose/words.ts';

describe('splitWords', () => {
  it('keeps tags, decimals, ranges and times whole and tells them apart', () => {
    const kinds = splitWords('Open XV-2101 at 2.5 bar for 30..50 min at 14:00 on U2-K210-INERT-001').map((w) => `${w.text}:${w.kind}`);
    expect(kinds).toEqual(['Open:word', 'XV-2101:tag', 'at:word', '2.5:number', 'bar:word', 'for:word', '30..50:number', 'min:word',
      'at:word', '14:00:time', 'on:word', 'U2-K210-INERT-001:tag']);
  });

  it('every word is the exact slice of the text at its offsets (property)', () => {
    fc.assert(fc.property(fc.string({ maxLength: 80 }), (text) =>
      splitWords(text).every((w) => text.slice(w.from, w.to) === w.text && w.from < w.to)));
  });
});

describe('splitSentences', () => {
  it('ends sentences at full stops but not inside decimals, tags or e.g.', () => {
    const s = splitSentences('Set PIC-210 to 1.1 bar, e.g. for the cook. Record the time.');
    expect(s.map((x) => x.text)).toEqual(['Set PIC-210 to 1.1 bar, e.g. for the cook', 'Record the time']);
    expect(countWords(s[0])).toBe(9);
  });

  it('a list item on a new line is a sentence of its own, without its marker', () => {
    const texts = (text: string) => splitSentences(text).map((x) => x.text);
    expect(texts('Check the line-up:\n- XV-2101 open\n  * P-211 stopped\n+ PI-210 below 1.2 bar')).toEqual(['Check the line-up:', 'XV-2101 open', 'P-211 stopped', 'PI-210 below 1.2 bar']);
    expect(texts('- Open XV-2101\n- Start P-211')).toEqual(['Open XV-2101', 'Start P-211']);
    // A dash inside a line, or one that a word follows at once, marks no list item.
    expect(texts('Keep TI-210 at 80 - 90 degC\n-5 degC is the low trip')).toEqual(['Keep TI-210 at 80 - 90 degC\n-5 degC is the low trip']);
  });

  it('a blank line ends a sentence; a line break alone does not', () => {
    const texts = (text: string) => splitSentences(text).map((x) => x.text);
    expect(texts('Open XV-2101\nand wait for 5 min')).toEqual(['Open XV-2101\nand wait for 5 min']);
    expect(texts('Open XV-2101\n\nWait for 5 min')).toEqual(['Open XV-2101', 'Wait for 5 min']);
    // A line break far behind the words, or none at all, breaks nothing in between.
    expect(texts(`${'Stir the batch '.repeat(40)}now\n\nSample it`)).toHaveLength(2);
    expect(texts('Stir the batch '.repeat(40))).toHaveLength(1);
  });

  it('sentence offsets slice the text (property)', () => {
    fc.assert(fc.property(fc.string({ maxLength: 80 }), (text) =>
      splitSentences(text).every((s) => text.slice(s.from, s.to) === s.text && s.words.every((w) => w.from >= s.from && w.to <= s.to))));
  });
});
