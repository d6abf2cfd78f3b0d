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

export function textWidth(text: string, fontSize: number): number {
  let em = 0;
  for (const ch of text) em += charWidthEm(ch);
  return Math.ceil(em * fontSize);
}

/** Greedy word wrap by estimated width; a word longer than the line is broken where it must be. */
export function wrapText(text: string, maxWidth: number, fontSize: number): string[] {
  const words = text.replace(/\s+/g, ' ').trim().split(' ').filter(Boolean);
  const lines: string[] = [];
  let line = '';
  const push = (word: string) => {
    const candidate = line ? `${line} ${word}` : word;
    if (textWidth(candidate, fontSize) <= maxWidth) {
      line = candidate;
      return;
    }
    if (line) lines.push(line);
    line = '';
    // Break an over-long token (a long tag or formula) into pieces that fit.
    let rest = word;
    while (textWidth(rest, fontSize) > maxWidth) {
      let cut = rest.length - 1;
      while (cut > 1 && textWidth(rest.slice(0, cut), fontSize) > maxWidth) cut--;
      lines.push(rest.slice(0, cut));
      rest = rest.slice(cut);
    }
    line = rest;
  };
  for (const word of words) push(word);
  if (line) lines.push(line);
  return lines.length ? lines : [''];
}
