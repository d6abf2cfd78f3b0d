// Decides whether a markdown file found in the procedures folder is meant to be a procedure at all.
//
// A file is NOT a procedure (and is skipped with an info line) only when BOTH hold:
//   1. its first non-blank line is not a front-matter fence (a line `---`), and
//   2. no line starts with a procedure key followed by a colon (`id:`, `steps:`, `revision:` …).
// Everything else is read as a procedure, so a file that looks like one but yields none (an empty, list or
// scalar front-matter, a stray `---` on top, keys without fences) stays an error the check reports.
// Files named explicitly on the command line are always checked as procedures.
import { procedureSchema } from '../model/schema.ts';

const procedureKeys = Object.keys(procedureSchema.shape);

const fenceLine = /^---[ \t]*(#.*)?$/;
const keyLine = new RegExp(`^(?:${procedureKeys.map((k) => k.replace(/[.*+?^${}()|[\]\\-]/g, '\\$&')).join('|')})[ \\t]*:`, 'm');

export function isNotAProcedure(text: string): boolean {
  const body = text.startsWith('\uFEFF') ? text.slice(1) : text;
  const firstLine = firstNonBlankLine(body);
  if (firstLine !== undefined && fenceLine.test(firstLine.trimEnd())) return false;
  return !keyLine.test(body);
}

/**
 * The first line (split at \n; a \r before it is white space to `trim`) with more than white space on it, found
 * without splitting the whole text.
 */
function firstNonBlankLine(text: string): string | undefined {
  for (let start = 0; start <= text.length;) {
    const newline = text.indexOf('\n', start);
    const end = newline === -1 ? text.length : newline;
    const line = text.slice(start, end);
    if (line.trim() !== '') return line;
    start = end + 1;
  }
  return undefined;
}

export const notAProcedureReason = 'it has no front-matter and no procedure keys';
