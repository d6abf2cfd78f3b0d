// Warns about characters in a procedure file that a reader cannot see: bidirectional overrides, invisible
// characters and control characters. They can make the text shown differ from the text checked.
import { defineFileRule } from '../define-rule.ts';
import { describeCharacter, findHiddenCharacters } from '../../parse/suspicious-characters.ts';

/** More than this many in one file are summed up in one last warning. */
const maxReports = 20;

export default defineFileRule(
  {
    id: 'hidden-character',
    summary: 'The file holds an invisible, bidirectional-override or control character.',
    category: 'syntax',
    defaultSeverity: 'warning',
    docs: `Bidirectional overrides (U+202A–U+202E, U+2066–U+2069) reorder the letters a reader sees, so a step can
read differently on screen than in the file the checks read. Zero-width characters, soft hyphens and control
characters have no visible shape at all. Each one is reported with its code point and place; delete it (most
editors can show them). Names that hold such characters are errors under \`name-format\`.`,
    examples: { bad: 'do: Open valve XV-2101\u202E (override inside the text)', good: 'do: Open valve XV-2101' },
  },
  (ctx) => {
    const text = ctx.source.text;
    const found = findHiddenCharacters(text, maxReports + 1);
    if (found.length === 0) return;
    const lines = lineStarts(text);
    for (const f of found.slice(0, maxReports)) {
      const { line, column } = position(lines, f.index);
      ctx.report({
        range: { line, column, endLine: line, endColumn: column + 1 },
        message: `Line ${line}, column ${column} holds ${describeCharacter(String.fromCodePoint(f.codePoint))}.`,
        hint: f.kind === 'bidi'
          ? 'Delete it: it can make the text shown differ from the text checked. Write right-to-left text without override controls.'
          : 'Delete it; it has no visible shape, so nobody reviewing the procedure can see it.',
      });
    }
    if (found.length > maxReports) {
      const total = findHiddenCharacters(text).length;
      ctx.report({
        range: { line: 1, column: 1, endLine: 1, endColumn: 1 },
        message: `The file holds ${total} hidden characters; the first ${maxReports} are reported one by one.`,
        hint: 'The file may have been pasted from another program; retype the affected text.',
      });
    }
  },
);

function lineStarts(text: string): number[] {
  const starts = [0];
  for (let i = 0; i < text.length; i++) if (text.charCodeAt(i) === 10) starts.push(i + 1);
  return starts;
}

function position(starts: number[], offset: number): { line: number; column: number } {
  let lo = 0;
  let hi = starts.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (starts[mid] <= offset) lo = mid;
    else hi = mid - 1;
  }
  return { line: lo + 1, column: offset - starts[lo] + 1 };
}
