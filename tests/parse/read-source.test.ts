// Reading a procedure file: positions of YAML nodes and body, syntax errors, and robustness on any input.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readSource } from '../../src/parse/read-source.ts';
import { splitFrontMatter } from '../../src/parse/split-front-matter.ts';

const text = [
  '---',                                   // 1
  'id: U2-TEST-001',                       // 2
  'steps:',                                // 3
  '  - step: heat-up',                     // 4
  '    do: Heat K-210 to 180 degC.',       // 5
  '    until: TI-210 >= 180 degC',         // 6
  '  - step: hold',                        // 7
  '    do: Hold at 180 degC.',             // 8
  '    until: "elapsed >= 30 min"',        // 9
  '---',                                   // 10
  '## Purpose',                            // 11
  '',                                      // 12
  'Heat the kettle.',                      // 13
].join('\n');

describe('readSource', () => {
  const source = readSource('p.md', text);

  it('keeps the line and column of every value and key', () => {
    expect(source.diagnostics).toEqual([]);
    expect(source.rangeOf(['id'])).toMatchObject({ line: 2, column: 5, endLine: 2, endColumn: 16 });
    expect(source.rangeOf(['id'], 'key')).toMatchObject({ line: 2, column: 1 });
    expect(source.rangeOf(['steps', 1, 'step'])).toMatchObject({ line: 7, column: 11 });
    expect(source.rangeOf(['steps', 0, 'until'], 'key')).toMatchObject({ line: 6, column: 5 });
  });

  it('maps characters inside plain and quoted scalars to file columns', () => {
    // "TI-210" starts at column 12 of line 6; the quantity "180 degC" at column 22.
    expect(source.rangeInScalar(['steps', 0, 'until'], 0, 6)).toMatchObject({ line: 6, column: 12, endColumn: 18 });
    expect(source.rangeInScalar(['steps', 0, 'until'], 10, 18)).toMatchObject({ line: 6, column: 22, endColumn: 30 });
    // Inside double quotes the text starts one column after the quote.
    expect(source.rangeInScalar(['steps', 1, 'until'], 0, 7)).toMatchObject({ line: 9, column: 13, endColumn: 20 });
  });

  it('falls back to the nearest existing node for a path that is not there', () => {
    expect(source.rangeOf(['steps', 1, 'confirm']).line).toBe(7);
  });

  it('positions the markdown body in file lines', () => {
    expect(source.bodyStartLine).toBe(11);
    const heading = source.body.children[0];
    expect(heading.type).toBe('heading');
    expect(heading.position?.start.line).toBe(11);
    expect(source.body.children[1].position?.start.line).toBe(13);
  });

  it('reports a YAML syntax error at the place the YAML reader stopped, in file lines', () => {
    const broken = readSource('b.md', '---\nid: X\nsteps:\n  - step: a\n   do: b\n---\n');
    expect(broken.diagnostics).toHaveLength(1);
    expect(broken.diagnostics[0]).toMatchObject({ rule: 'yaml-syntax', line: 5 });
  });

  it('reports a missing front-matter', () => {
    expect(readSource('m.md', '# Title\n').diagnostics[0]).toMatchObject({ rule: 'missing-front-matter', line: 1 });
  });

  it('refuses alias bombs with a diagnostic instead of expanding them', () => {
    const bomb = ['---', 'a: &a [x, x, x, x, x, x, x, x, x, x]', 'b: &b [*a, *a, *a, *a, *a, *a, *a, *a, *a, *a]',
      'c: &c [*b, *b, *b, *b, *b, *b, *b, *b, *b, *b]', 'd: &d [*c, *c, *c, *c, *c, *c, *c, *c, *c, *c]', '---'].join('\n');
    const r = readSource('bomb.md', bomb);
    expect(r.diagnostics.some((d) => d.rule === 'yaml-syntax')).toBe(true);
  });
});

describe('parser robustness (property)', () => {
  it('never throws and always reports positions inside the file, whatever the text', () => {
    const fragments = fc.constantFrom('---\n', 'id: X\n', 'steps:\n', '  - step: a\n', '    do: b\n', '  - choose:\n',
      ': \n', '"', "'", '[', '{', '\t', '*a', '&a ', '#', '\n', '- ', '  ', '...\n', '\uFEFF', 'ü', '\r\n');
    fc.assert(
      fc.property(fc.array(fc.oneof(fragments, fc.string()), { maxLength: 40 }), (parts) => {
        const input = parts.join('');
        const r = readSource('x.md', input);
        const lines = input.split('\n').length;
        for (const d of r.diagnostics) {
          expect(d.line).toBeGreaterThanOrEqual(1);
          expect(d.line).toBeLessThanOrEqual(lines);
          expect(d.column).toBeGreaterThanOrEqual(1);
        }
      }),
      { numRuns: 500 },
    );
  });

  it('splits front-matter so that yaml + body reassemble the file with the fences', () => {
    fc.assert(
      fc.property(fc.string(), fc.string(), (yaml, body) => {
        const cleanYaml = yaml.split('\n').filter((l) => !/^(---|\.\.\.)/.test(l)).join('\n');
        const file = `---\n${cleanYaml}\n---\n${body}`;
        const s = splitFrontMatter(file);
        expect(s.yaml).toBe(`${cleanYaml}\n`);
        expect(s.body).toBe(body);
        expect(file.slice(s.bodyOffset)).toBe(body);
      }),
      { numRuns: 300 },
    );
  });
});
