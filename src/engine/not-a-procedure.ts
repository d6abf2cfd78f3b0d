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
  const firstLine = body.split(/\r?\n/).find((line) => line.trim() !== '');
  if (firstLine !== undefined && fenceLine.test(firstLine.trimEnd())) return false;
  return !keyLine.test(body);
}

export const notAProcedureReason = 'it has no front-matter and no procedure keys';
