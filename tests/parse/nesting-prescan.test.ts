// Absurd nesting and alias bombs are refused with a clear diagnostic before a library recurses into them.
import fc from 'fast-check';
import { stringify } from 'yaml';
import { describe, expect, it } from 'vitest';
import { prescanBodyNesting, prescanYamlNesting, yamlPrescanLimit } from '../../src/parse/nesting-prescan.ts';
import { readSource } from '../../src/parse/read-source.ts';

const n = 10_000;
const lines = (count: number, line: (i: number) => string) => Array.from({ length: count }, (_, i) => line(i)).join('\n');

const deepFrontMatter: Record<string, string> = {
  'flow sequences': 'steps: ' + '['.repeat(n) + ']'.repeat(n),
  'flow mappings': 'steps: ' + '{a: '.repeat(n) + '1' + '}'.repeat(n),
  'block mappings': lines(n, (i) => ' '.repeat(i) + 'a:') + ' 1',
  'block sequences': 'steps:\n' + lines(n, (i) => ' '.repeat(i + 1) + '-') + ' x',
  'compact sequences': 'steps:\n  ' + '- '.repeat(n) + 'x',
};

describe('front-matter nesting', () => {
  for (const [name, yaml] of Object.entries(deepFrontMatter)) {
    it(`refuses ${n.toLocaleString('en')}-deep ${name} with a yaml-syntax diagnostic, not a stack overflow`, () => {
      const source = readSource('deep.md', `---\n${yaml}\n---\n## Purpose\n`);
      expect(source.data).toBeNull();
      expect(source.diagnostics).toHaveLength(1);
      expect(source.diagnostics[0]).toMatchObject({ rule: 'yaml-syntax', severity: 'error', file: 'deep.md' });
      expect(source.diagnostics[0].message).toMatch(/nests deeper than 200 levels/);
      expect(source.diagnostics[0].message).not.toMatch(/call stack|\n\s+at /);
    });
  }

  it('refuses an alias bomb (billion laughs) with a clear diagnostic', () => {
    const names = 'abcdefghi';
    const yaml = ['a: &a ["lol","lol","lol","lol","lol","lol","lol","lol","lol"]',
      ...[...names.slice(1)].map((k, i) => `${k}: &${k} [${Array(9).fill('*' + names[i]).join(',')}]`)].join('\n');
    const source = readSource('bomb.md', `---\n${yaml}\n---\n`);
    expect(source.data).toBeNull();
    expect(source.diagnostics.map((d) => d.rule)).toEqual(['yaml-syntax']);
    expect(source.diagnostics[0].message).toMatch(/could not be expanded/);
    expect(source.diagnostics[0].line).toBe(2);
  });

  it('points at the line where the nesting passes the limit', () => {
    const source = readSource('deep.md', `---\nid: X\ntitle: T\n${lines(400, (i) => ' '.repeat(i) + 'a:')} 1\n---\n`);
    // Line 1 is the fence, lines 2-3 hold id and title; the chain starts on line 4, so level limit + 1 is on 4 + limit.
    expect(source.diagnostics[0]).toMatchObject({ rule: 'yaml-syntax', line: 4 + yamlPrescanLimit });
  });

  it('never refuses front-matter the YAML library writes for ordinary nesting (property)', () => {
    const leaf = fc.oneof(fc.string({ maxLength: 12 }), fc.integer(), fc.boolean(), fc.constant(null));
    const tree = fc.letrec((tie) => ({
      node: fc.oneof({ depthSize: 'small', withCrossShrink: true }, leaf, fc.array(tie('node'), { maxLength: 3 }),
        fc.dictionary(fc.string({ minLength: 1, maxLength: 6 }), tie('node'), { maxKeys: 3 })),
    })).node;
    const deepChain = fc.integer({ min: 1, max: 150 }).chain((depth) => fc.tuple(fc.constant(depth), fc.boolean(), leaf));
    fc.assert(fc.property(tree, deepChain, fc.boolean(), (value, [depth, useSeq, inner], flow) => {
      let nested: unknown = inner;
      for (let i = 0; i < depth; i++) nested = useSeq ? [nested] : { k: nested };
      const yaml = stringify({ value, nested }, { collectionStyle: flow ? 'flow' : 'block' });
      expect(prescanYamlNesting(yaml)).toBeNull();
    }), { numRuns: 300 });
  });

  it('does not count brackets, quotes or block scalars inside text as nesting', () => {
    const text = lines(400, (i) => `k${i}: "[{ [ {" # [[[`) + '\nnote: |\n' + lines(400, (i) => '  ' + ' '.repeat(i) + 'x') + '\nplain: see [1 and {2\n';
    expect(prescanYamlNesting(text)).toBeNull();
  });
});

describe('body nesting', () => {
  it('refuses 10,000 nested block quotes with a body-too-deep diagnostic at the line', () => {
    const source = readSource('quote.md', `---\nid: X\n---\n## Notes\n${'> '.repeat(n)}x\n`);
    expect(source.diagnostics).toEqual([expect.objectContaining({ rule: 'body-too-deep', line: 5, severity: 'error' })]);
    expect(source.body.children).toEqual([]);
    // The front-matter is still read, so the other rules run.
    expect(source.data).toEqual({ id: 'X' });
  });

  it('refuses lists nested hundreds of levels deep (the markdown reader slows steeply with list depth)', () => {
    const body = lines(500, (i) => ' '.repeat(i * 2) + '- a');
    expect(prescanBodyNesting(body)).not.toBeNull();
    expect(readSource('list.md', `---\nid: X\n---\n${body}\n`).diagnostics.map((d) => d.rule)).toEqual(['body-too-deep']);
  });

  it('reads ordinary nested lists, quotes and indented code', () => {
    const body = ['- one', '  - two', '    - three', '      1. four', '> quote', '> > nested quote', '', '        indented code', ' '.repeat(300) + 'wide text'].join('\n');
    expect(prescanBodyNesting(body)).toBeNull();
    expect(readSource('ok.md', `---\nid: X\n---\n${body}\n`).diagnostics).toEqual([]);
  });
});
