// Estimates how wide text is in the chart's sans-serif font, so the layout can size boxes without a browser.

/** Widths in em for a typical humanist/neo-grotesque sans (measured once, rounded up so text never spills). */
const narrow = new Set([...`il.,:;'|!I[]()fjt `]);
const wide = new Set([...'mwMW@%']);

export function charWidthEm(ch: string): number {
  if (narrow.has(ch)) return 0.3;
  if (wide.has(ch)) return 0.9;
  if (/[A-Z]/.test(ch)) return 0.7;
  if (/[0-9]/.test(ch)) return 0.58;
  if (/[a-z]/.test(ch)) return 0.56;
  if (ch === '-' || ch === '_') return 0.36;
  return 0.62;
}

/** charWidthEm of every ASCII character, looked up by code (the chart measures every character of every line). */
const asciiWidths = Array.from({ length: 128 }, (_, code) => charWidthEm(String.fromCharCode(code)));

function widthEm(ch: string): number {
  const code = ch.charCodeAt(0);
  return ch.length === 1 && code < 128 ? asciiWidths[code] : charWidthEm(ch);
}

/** The width in em of a text, adding from `em` (the width of the text before it) in reading order. */
function addEm(em: number, text: string): number {
  for (const ch of text) em += widthEm(ch);
  return em;
}

export function textWidth(text: string, fontSize: number): number {
  return Math.ceil(addEm(0, text) * fontSize);
}

/** Greedy word wrap by estimated width; a word longer than the line is broken where it must be. */
export function wrapText(text: string, maxWidth: number, fontSize: number): string[] {
  const words = text.replace(/\s+/g, ' ').trim().split(' ').filter(Boolean);
  const lines: string[] = [];
  let line = '';
  // The line's width so far, added character by character as textWidth would (the same sums, to the last bit).
  let lineEm = 0;
  const push = (word: string) => {
    const candidateEm = addEm(line ? addEm(lineEm, ' ') : 0, word);
    if (Math.ceil(candidateEm * fontSize) <= maxWidth) {
      line = line ? `${line} ${word}` : word;
      lineEm = candidateEm;
      return;
    }
    if (line) lines.push(line);
    line = '';
    // Break an over-long token (a long tag or formula) into pieces that fit.
    let rest = word;
    while (textWidth(rest, fontSize) > maxWidth) {
      // At least one character per line: a character wider than the line still moves the wrap on.
      let cut = Math.max(1, rest.length - 1);
      while (cut > 1 && textWidth(rest.slice(0, cut), fontSize) > maxWidth) cut--;
      lines.push(rest.slice(0, cut));
      rest = rest.slice(cut);
    }
    line = rest;
    lineEm = addEm(0, rest);
  };
  for (const word of words) push(word);
  if (line) lines.push(line);
  return lines.length ? lines : [''];
}
