// The demo procedures' front-matters, and copies of them altered by small edits, for the tests that compare a quick
// reading of YAML with the `yaml` library's own (fast-yaml.test.ts, quick-positions.test.ts).
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { splitFrontMatter } from '../../src/parse/split-front-matter.ts';

function markdownFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const path = join(dir, e.name);
    if (e.isDirectory()) return markdownFiles(path);
    return e.name.endsWith('.md') ? [path] : [];
  });
}

export const demoFiles = markdownFiles(join(import.meta.dirname, '../../procedures'));
export const frontMatters = demoFiles.map((f) => splitFrontMatter(readFileSync(f, 'utf8')).yaml).filter((y): y is string => y !== null);

/**
 * A demo front-matter altered one to four times: each alteration puts one of `pieces` in, cuts a few characters out,
 * or puts a piece in place of the rest of a line.
 */
export function alteredFrontMatter(pieces: readonly string[]): fc.Arbitrary<string> {
  const alteration = fc.tuple(fc.nat(), fc.integer({ min: 0, max: 2 }), fc.nat({ max: pieces.length - 1 }), fc.integer({ min: 1, max: 5 }));
  const alter = (text: string, [where, how, piece, cut]: [number, number, number, number]): string => {
    const at = where % (text.length + 1);
    if (how === 0) return text.slice(0, at) + pieces[piece] + text.slice(at);
    if (how === 1) return text.slice(0, at) + text.slice(at + cut);
    const lineEnd = text.indexOf('\n', at);
    return text.slice(0, at) + pieces[piece] + (lineEnd < 0 ? '' : text.slice(lineEnd));
  };
  return fc.tuple(fc.nat({ max: frontMatters.length - 1 }), fc.array(alteration, { minLength: 1, maxLength: 4 }))
    .map(([which, alterations]) => alterations.reduce(alter, frontMatters[which]));
}
