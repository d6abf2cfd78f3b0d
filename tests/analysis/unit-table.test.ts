// The unit table the check reads units from is the unit library's own reading: written from it, and giving the same
// dimension, scale and offset for every documented unit and every compound of two, and the same answer to "is this
// word a unit" for every word, as the library does.
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { documentedUnitParts, libraryUnitWords, unitTableVersion } from '../../src/analysis/unit-table.ts';
import { commonUnits, documentedUnits, isUnitWord, normalizeUnit, readUnit, readWithLibrary, unitDimension, unitLibrary } from '../../src/analysis/units.ts';
// @ts-expect-error: the script is plain JavaScript without type declarations.
import { unitTableOf } from '../../scripts/write-unit-table.mjs';

/** The library's own answer: the word parses as a unit with no number. */
function libraryReadsAsUnit(word: string): boolean {
  try {
    return unitLibrary().unit(normalizeUnit(word)).value === null;
  } catch {
    return false;
  }
}

function wordsOf(folder: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(folder)) {
    const path = join(folder, name);
    if (statSync(path).isDirectory()) out.push(...wordsOf(path));
    else if (name.endsWith('.md')) out.push(...(readFileSync(path, 'utf8').match(/[A-Za-z][A-Za-z0-9]*/g) ?? []));
  }
  return out;
}

describe('the unit table', () => {
  it('was written from the installed library and the units Stepwright defines (npm run unit-table after a change)', async () => {
    const table = await unitTableOf();
    expect(unitTableVersion).toBe(table.version);
    expect(documentedUnitParts).toEqual(table.parts);
    expect([...libraryUnitWords]).toEqual(table.words);
  });

  it('reads every documented unit and every compound of two as the library does', () => {
    const units = [...documentedUnits];
    const compounds = units.flatMap((a) => units.map((b) => `${a}/${b}`));
    for (const unit of [...units, ...compounds]) expect(readUnit(unit), unit).toEqual(readWithLibrary(unit));
    // Source: NIST SP 811, Appendix B.8: 1 psi = 6.894 757 E+03 Pa; a degC difference is a kelvin.
    const psi = readUnit('psi');
    expect('ok' in psi ? undefined : psi.scale).toBeCloseTo(6894.757, 3);
    expect(readUnit('degC/min')).toMatchObject({ dimension: 'temperature rate', offset: 0 });
  });

  it('names the dimension of every documented unit and of the compounds plants write, in words', () => {
    const unnamed = [...commonUnits].filter((u) => /[·^]/.test(unitDimension(u) ?? '·'));
    expect(unnamed).toEqual([]);
    // Source: NIST SP 811, Table 3: the volt is the unit of electric potential difference; the hertz of frequency.
    expect([unitDimension('V'), unitDimension('rpm'), unitDimension('degC/h')]).toEqual(['electric potential', 'frequency', 'temperature rate']);
  });

  it('answers whether a word is a unit as the library does, for its own unit words and for the words of procedures', () => {
    const corpus = [...new Set([...libraryUnitWords, ...wordsOf('procedures'), ...wordsOf('tests/fixtures')])];
    expect(corpus.length).toBeGreaterThan(libraryUnitWords.length);
    const differ = corpus.filter((w) => isUnitWord(w) !== libraryReadsAsUnit(w));
    expect(differ).toEqual([]);
  });

  it('answers as the library does for any word of letters and digits (property)', () => {
    const letter = fc.constantFrom(...'abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ');
    const rest = fc.constantFrom(...'abcdegghklmnoprstuvxyzAKLMNPSTV0123456789');
    fc.assert(fc.property(letter, fc.array(rest, { maxLength: 6 }), (first, more) => {
      const word = first + more.join('');
      expect(isUnitWord(word)).toBe(libraryReadsAsUnit(word));
    }), { numRuns: 3000, seed: 1204 });
  });
});
