// Writes src/analysis/unit-table.ts: what the unit library (mathjs, with the units Stepwright defines) says about
// each documented unit, and every word it reads as a unit without a number. With the table the check reads units
// without loading the library, which costs about a tenth of a second at every start. Run it with the project's own
// Node (it imports the TypeScript sources): `npm run unit-table`, after upgrading mathjs or changing the units;
// tests/analysis/unit-table.test.ts fails until then.
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { wrappedItems } from './generated-list.mjs';

/** The table's content, read from the library instance the units module makes. */
export async function unitTableOf() {
  const { documentedUnits, unitLibrary, normalizeUnit } = await import('../src/analysis/units.ts');
  const math = unitLibrary();
  const parts = {};
  for (const name of documentedUnits) {
    const parsed = math.unit(normalizeUnit(name));
    if (parsed.units.length !== 1 || parsed.units[0].power !== 1) throw new Error(`unit-table: '${name}' is not one unit to the first power`);
    const [{ unit, prefix }] = parsed.units;
    parts[name] = { dimensions: [...parsed.dimensions], value: Number(unit.value), prefix: Number(prefix.value), offset: Number(unit.offset) };
  }
  const words = new Set();
  const units = math.Unit.UNITS;
  for (const name of Object.keys(units)) {
    words.add(name);
    for (const prefix of Object.keys(units[name].prefixes)) words.add(prefix + name);
  }
  const plain = [...words].filter((w) => /^[A-Za-z][A-Za-z0-9]*$/.test(w)).sort();
  return { version: math.version, parts, words: plain };
}

export function moduleText({ version, parts, words }) {
  const entries = Object.entries(parts).map(([name, p]) => `  ${JSON.stringify(name)}: { dimensions: ${JSON.stringify(p.dimensions)}, value: ${JSON.stringify(p.value)}, prefix: ${JSON.stringify(p.prefix)}, offset: ${JSON.stringify(p.offset)} },`);
  return `// Written by scripts/write-unit-table.mjs from mathjs ${version} with the units Stepwright defines. Do not edit;
// run \`npm run unit-table\` again after upgrading mathjs or changing the units.
export const unitTableVersion = ${JSON.stringify(version)};

/** How the library reads each documented unit: its base dimensions, the unit's value, its prefix's value, its offset. */
export const documentedUnitParts: Readonly<Record<string, { dimensions: readonly number[]; value: number; prefix: number; offset: number }>> = {
${entries.join('\n')}
};

/** Every word of letters and digits the library reads as a unit without a number: a unit's name, with or without one of its prefixes. */
export const libraryUnitWords: readonly string[] = [
${wrappedItems(words.map((w) => `${JSON.stringify(w)},`))}
];
`;
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const table = await unitTableOf();
  writeFileSync(fileURLToPath(new URL('../src/analysis/unit-table.ts', import.meta.url)), moduleText(table));
  process.stderr.write(`unit-table: ${Object.keys(table.parts).length} documented units, ${table.words.length} unit words, mathjs ${table.version}.\n`);
}
