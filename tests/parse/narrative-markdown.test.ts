// The narrative reader skips GitHub's additions for a body in which none of them can start: the tree must be exactly
// the one the full reader gives, positions included.
import fc from 'fast-check';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { mayHoldAdditions, parseNarrative, parseNarrativeInFull } from '../../src/parse/narrative-markdown.ts';
import { readProcedureFiles } from '../../src/cli/read-procedure-files.ts';

// Pieces of markdown, with characters near the additions' own ([, ], x, -, :, w, .) but none of their starts.
const pieces = [
  '# Purpose\n', '## Notes\n', 'Open valve XV-2101.', ' ', '\n', '\n\n', '- item\n', '* item\n', '1. first\n', '   ',
  '[link](#steps)', '[ref]', '[ref]: #x\n', '![pump](p.png)', '**bold**', '_em_', '`code`', '```\nblock\n```\n', '> quote\n',
  '<https://alder-reach.example>', '<div>', '</div>', '<!-- note -->', 'x', 'X', '[', ']', '[-]', '[xx]', '---\n', ':', 'w', 'ww.', '.',
  ':-', '-:', '\\', '&amp;', '25 %', '200 degC', 'TI-210 >= 80 degC', 'a_b_c', '1)', '+ plus\n', '\t', '    indented\n',
];
// And the additions themselves, so that a body with them is read in full.
const additions = ['| A | B |\n| --- | --- |\n| 1 | 2 |\n', '~~gone~~', '[^1]\n\n[^1]: Note.\n', '- [ ] open\n', '- [x] done\n', 'www.alder-reach.example', 'https://alder-reach.example', 'shift@alder-reach.example'];

describe('the narrative reader', () => {
  it('gives the full tree for bodies without any of GitHub\'s additions (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...pieces), { maxLength: 40 }), (parts) => {
        const body = parts.join('');
        expect(parseNarrative(body)).toEqual(parseNarrativeInFull(body));
      }),
      { numRuns: 1000 },
    );
  });

  it('reads a table of one column without pipes as GitHub does', () => {
    // A delimiter row with a colon under a line makes a table of one column (found by the property above).
    for (const body of ['.# Purpose\n:---\n', 'Valve\n:--\nXV-2101\n', 'Valve\n--:\n']) {
      expect(parseNarrative(body)).toEqual(parseNarrativeInFull(body));
      expect(JSON.stringify(parseNarrative(body))).toContain('"type":"table"');
    }
  });

  it('gives the full tree for every short text made of the characters the additions start with', () => {
    // A text in which an addition may start is read by the full reader itself; every other one is compared. '|',
    // '~' and '@' alone send a text to the full reader, so they are left out of the texts compared.
    expect(['|', '~', '@'].every((c) => mayHoldAdditions(`x\n${c}`))).toBe(true);
    const alphabet = ['x', '-', ':', ' ', '\n', '.', '[', ']', '^', '/', 'w'];
    let texts = [''];
    for (let n = 0; n < 4; n++) texts = texts.flatMap((t) => alphabet.map((c) => t + c));
    const compared = texts.map((t) => `x\n${t}`).filter((body) => !mayHoldAdditions(body));
    expect(compared.length).toBeGreaterThan(10_000);
    for (const body of compared) expect(parseNarrative(body), JSON.stringify(body)).toEqual(parseNarrativeInFull(body));
  });

  it('gives the full tree for bodies with them (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...pieces, ...additions), { maxLength: 30 }), (parts) => {
        const body = parts.join('');
        expect(parseNarrative(body)).toEqual(parseNarrativeInFull(body));
      }),
      { numRuns: 500 },
    );
  });

  it('reads a table, strikethrough, a task list, a footnote and a bare address as GitHub does', () => {
    // Source: GitHub Flavored Markdown Spec 0.29-gfm, sections 4.10 (tables), 6.5 (strikethrough), 5.3 (task list
    // items) and 6.9 (autolinks, extended).
    const types = (body: string) => JSON.stringify(parseNarrative(body)).match(/"type":"\w+"/g)?.map((t) => t.slice(8, -1)) ?? [];
    expect(types(additions[0])).toContain('table');
    expect(types(additions[1])).toContain('delete');
    expect(JSON.stringify(parseNarrative(additions[3]))).toContain('"checked":false');
    expect(types(additions[2])).toContain('footnoteDefinition');
    expect(types(additions[5])).toContain('link');
  });

  it('reads every demo body as the full reader does', () => {
    const demo = readProcedureFiles([join(import.meta.dirname, '..', '..', 'procedures')], process.cwd());
    expect(demo.length).toBeGreaterThan(10);
    for (const f of demo) {
      if (!('text' in f)) continue;
      const body = f.text.slice(f.text.indexOf('\n---\n', 4) + 5);
      expect(parseNarrative(body), f.file).toEqual(parseNarrativeInFull(body));
    }
  });
});
