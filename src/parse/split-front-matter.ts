// Splits a procedure file into its YAML front-matter and its markdown body, keeping line offsets.

export interface FrontMatterSplit {
  /** The YAML text between the fences, or null when the file has no front-matter. */
  yaml: string | null;
  /** Offset in the file where the YAML text starts. */
  yamlOffset: number;
  /** The markdown body after the closing fence (the whole file when there is no front-matter). */
  body: string;
  /** Offset in the file where the body starts. */
  bodyOffset: number;
  /** True when an opening fence was found but no closing one. */
  unclosed: boolean;
}

const fence = /^---[ \t]*(#.*)?$/;
const closingFence = /^(---|\.\.\.)[ \t]*$/;

export function splitFrontMatter(text: string): FrontMatterSplit {
  const start = text.startsWith('\uFEFF') ? 1 : 0;
  const firstEnd = lineEnd(text, start);
  if (!fence.test(text.slice(start, firstEnd).replace(/\r$/, ''))) {
    return { yaml: null, yamlOffset: 0, body: text, bodyOffset: 0, unclosed: false };
  }
  const yamlOffset = nextLine(text, firstEnd);
  let pos = yamlOffset;
  while (pos < text.length) {
    const end = lineEnd(text, pos);
    if (closingFence.test(text.slice(pos, end).replace(/\r$/, ''))) {
      const bodyOffset = nextLine(text, end);
      return { yaml: text.slice(yamlOffset, pos), yamlOffset, body: text.slice(bodyOffset), bodyOffset, unclosed: false };
    }
    pos = nextLine(text, end);
  }
  return { yaml: text.slice(yamlOffset), yamlOffset, body: '', bodyOffset: text.length, unclosed: true };
}

function lineEnd(text: string, from: number): number {
  const i = text.indexOf('\n', from);
  return i === -1 ? text.length : i;
}

function nextLine(text: string, end: number): number {
  return Math.min(text.length, end + 1);
}
