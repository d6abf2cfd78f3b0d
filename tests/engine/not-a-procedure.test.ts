// Which markdown in the procedures folder is skipped as "not a procedure": a file whose first non-blank line is no
// front-matter fence and that has no line starting with a procedure key. The first line is found without
// splitting the whole text; it must be the line splitting would find, for any text.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isNotAProcedure } from '../../src/engine/not-a-procedure.ts';
import { procedureSchema } from '../../src/model/schema.ts';

/** The rule as first written: split every line, take the first with more than white space. */
function byEveryLine(text: string): boolean {
  const body = text.startsWith('\uFEFF') ? text.slice(1) : text;
  const firstLine = body.split(/\r?\n/).find((line) => line.trim() !== '');
  if (firstLine !== undefined && /^---[ \t]*(#.*)?$/.test(firstLine.trimEnd())) return false;
  const keys = Object.keys(procedureSchema.shape).join('|');
  return !new RegExp(`^(?:${keys})[ \\t]*:`, 'm').test(body);
}

describe('markdown that is not a procedure', () => {
  it('is told the same way as by splitting every line, for any text of fences, keys, blanks and line ends', () => {
    const piece = fc.constantFrom('---', '--- # front', '---x', 'id: U2-A-001', 'steps:', '# Notes', 'text', '', ' ', '\t', '\u00a0', '\uFEFF', '\r', '\n', '\r\n', '\n\n', '\v');
    fc.assert(fc.property(fc.array(piece, { maxLength: 12 }), (parts) => {
      const text = parts.join('');
      expect(isNotAProcedure(text)).toBe(byEveryLine(text));
    }), { numRuns: 3000 });
  });

  it('skips a README and notes, never a file with front-matter or procedure keys', () => {
    // Source: common practice (a README beside the files it describes).
    expect(isNotAProcedure('# Unit 2 procedures\n\nOne file per procedure.\n')).toBe(true);
    expect(isNotAProcedure('\n\n  \r\n---\nid: U2-A-001\n---\n')).toBe(false);
    expect(isNotAProcedure('Notes first\nsteps:\n  - do: Open the valve.\n')).toBe(false);
    expect(isNotAProcedure('')).toBe(true);
  });
});
