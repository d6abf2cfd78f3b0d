// The installed package loads only the part of mathjs the units use (scripts/mathjs-units.mjs writes it at packing);
// a development checkout loads the library's single-file build. Both must read every unit the same way: the same
// units, prefixes, powers, values, offsets and dimensions, and the same refusals.
import { mkdtempSync, readFileSync, realpathSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import type { MathJsInstance } from 'mathjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defineUnits, documentedUnits } from '../../src/analysis/units.ts';
import { writeMathjsUnits } from '../../scripts/mathjs-units.mjs';

const root = join(import.meta.dirname, '..', '..');
const require = createRequire(join(root, 'package.json'));
let folder: string;
let part: MathJsInstance;
let whole: MathJsInstance;
let packages: string[];

beforeAll(async () => {
  folder = mkdtempSync(join(tmpdir(), 'stepwright-mathjs-units-'));
  const file = join(folder, 'mathjs-units.cjs');
  packages = await writeMathjsUnits(file);
  const { create, unitDependencies, createUnitDependencies } = require(file);
  part = defineUnits(create({ unitDependencies, createUnitDependencies }, {}));
  // A fresh copy of the single-file build, so that this test's units are its own; the module cache is put back as
  // it was, so that units.ts, in tests sharing this process, never meets units defined here.
  // By its real path, the key of the module cache (node_modules may be reached through a symbolic link).
  const browser = realpathSync(join(root, 'node_modules', 'mathjs', 'lib', 'browser', 'math.js'));
  const cached = require.cache[browser];
  delete require.cache[browser];
  whole = defineUnits(require(browser) as MathJsInstance);
  if (cached) require.cache[browser] = cached;
  else delete require.cache[browser];
}, 60_000);

afterAll(() => rmSync(folder, { recursive: true, force: true }));

type Part = { unit: { name: string; value: number; offset: number; dimensions: number[] }; prefix: { name: string; value: number }; power: number };
function reading(math: MathJsInstance, text: string): unknown {
  try {
    const u = math.unit(text);
    return {
      value: u.value,
      parts: (u.units as unknown as Part[]).map((p) => [p.unit.name, p.unit.value, p.unit.offset, p.unit.dimensions, p.prefix.name, p.prefix.value, p.power]),
      dimensions: u.dimensions,
    };
  } catch (error) {
    return { refused: (error as Error).message };
  }
}

describe('the units part of mathjs', () => {
  it('holds mathjs and the packages it imports, with their licences', () => {
    expect(packages).toContain('mathjs');
    expect(packages).toContain('typed-function');
    const licences = readFileSync(join(folder, 'mathjs-units.LICENSES.txt'), 'utf8');
    for (const name of packages) expect(licences).toContain(`\n${name} `);
    expect(licences).toContain('Apache License');
  });

  it('reads every documented unit, prefixed and combined ones, quantities and non-units as the whole library does', () => {
    const texts = [
      ...documentedUnits, 'm3/h', 'kg/h', 'L/min', 'degC/min', 'kPa/min', 'kdegC', 'kPag', 'torr', 'mmHg', 'inHg', 'USgal',
      'bbl', 'gpm', 'rpm', 'ppm', 'percent', 'cm', 'km', 'ms', 'mbar', 'GW', 'kJ', 'N', 'lbf', 'ft', 'in', 'gal', 'day',
      '5 kPa', '238 degC', '3.5 m^3/h', '0.2 bar', 'x', 'kg/', 'foo', 'degC degC', '', '/', 'm^2', 'kg*m/s^2', 'Hz',
    ];
    for (const text of texts) expect(reading(part, text), text).toEqual(reading(whole, text));
  });

  it('reads any text made of unit-like pieces as the whole library does (property)', () => {
    const piece = fc.constantFrom(...documentedUnits, 'k', 'M', 'm', 'c', '/', '^', '2', '3', ' ', '*', '.', '5', 'h', 'deg', 'C', 'Pa', 'g', 'a', '-', 'e');
    fc.assert(
      fc.property(fc.array(piece, { maxLength: 6 }).map((p) => p.join('')), (text) => {
        expect(reading(part, text)).toEqual(reading(whole, text));
      }),
      { numRuns: 2000, seed: 1203 },
    );
  });
});
