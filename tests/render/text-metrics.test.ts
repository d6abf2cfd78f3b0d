// The chart's text measure: the quick measure (a table for ASCII, the line's width carried from word to word)
// must give exactly the lines of the plain measure that adds every character of every candidate line.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { charWidthEm, textWidth, wrapText } from '../../src/render/text-metrics.ts';

/** The plain greedy wrap: every candidate line measured from its first character. */
function plainWrap(text: string, maxWidth: number, fontSize: number): string[] {
  const width = (t: string) => Math.ceil([...t].reduce((em, ch) => em + charWidthEm(ch), 0) * fontSize);
  const words = text.replace(/\s+/g, ' ').trim().split(' ').filter(Boolean);
  const lines: string[] = [];
  let line = '';
  for (const word of words) {
    const candidate = line ? `${line} ${word}` : word;
    if (width(candidate) <= maxWidth) {
      line = candidate;
      continue;
    }
    if (line) lines.push(line);
    let rest = word;
    while (width(rest) > maxWidth) {
      let cut = Math.max(1, rest.length - 1);
      while (cut > 1 && width(rest.slice(0, cut)) > maxWidth) cut--;
      lines.push(rest.slice(0, cut));
      rest = rest.slice(cut);
    }
    line = rest;
  }
  if (line) lines.push(line);
  return lines.length ? lines : [''];
}

// Step texts as a plant writes them: tags, numbers, units, punctuation, a few non-ASCII signs.
const pieces = ['Open', 'XV-2101', 'to', '45 %', 'and', 'hold', 'TI-210', '≥', '120 °C', 'mW', 'il', 'WWMM', 'Confirm:', '(K-210)', 'µS/cm', 'ñ', '𝛥p', '  '];

describe('text measure', () => {
  it('wraps exactly as the plain measure does', () => {
    fc.assert(fc.property(
      fc.array(fc.oneof(fc.constantFrom(...pieces), fc.string({ maxLength: 12 })), { maxLength: 30 }).map((ws) => ws.join(' ')),
      fc.integer({ min: 8, max: 400 }),
      fc.constantFrom(11, 12, 13.5),
      (text, maxWidth, fontSize) => {
        expect(wrapText(text, maxWidth, fontSize)).toEqual(plainWrap(text, maxWidth, fontSize));
      },
    ), { numRuns: 500 });
  });

  it('measures every character as charWidthEm does', () => {
    fc.assert(fc.property(fc.string({ maxLength: 40, unit: 'binary' }), fc.constantFrom(11, 12), (text, size) => {
      expect(textWidth(text, size)).toBe(Math.ceil([...text].reduce((em, ch) => em + charWidthEm(ch), 0) * size));
    }));
  });

  it('gives the widths of a sans-serif face: narrow i, wide W, digits between', () => {
    // Source: common practice (proportional sans-serif faces: "i" about a third of an em, "W" near a full em).
    expect(textWidth('iiii', 10)).toBe(12);
    expect(textWidth('WWWW', 10)).toBe(36);
    expect(textWidth('2101', 10)).toBe(24);
    expect(wrapText('Open XV-2101 slowly', 70, 10)).toEqual(['Open XV-2101', 'slowly']);
    expect(wrapText('Open XV-2101 slowly', 60, 10)).toEqual(['Open', 'XV-2101', 'slowly']);
    // A character wider than the line gets a line of its own (it used to loop without end).
    expect(wrapText('W%W', 6, 10)).toEqual(['W', '%', 'W']);
  });
});
