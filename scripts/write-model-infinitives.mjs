// Writes src/analysis/prose/model-infinitives.ts: the words the English model's own word list enters first as a
// base-form verb (its tag "Infinitive"). The check asks this of the first word of every instruction; with the list
// in the program it needs neither the model nor its thread for that answer. Run again after upgrading compromise
// (tests/analysis/prose/model-infinitives.test.ts fails until then).
import { writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import { wrappedItems } from './generated-list.mjs';

const require = createRequire(import.meta.url);

/** The model's base-form verbs, in the word list's own order. */
export function infinitivesOfModel() {
  const nlp = require('compromise');
  const lexicon = nlp.world().model.one.lexicon;
  return Object.keys(lexicon).filter((word) => (Array.isArray(lexicon[word]) ? lexicon[word][0] : lexicon[word]) === 'Infinitive');
}

export function moduleText(words, version) {
  return `// Written by scripts/write-model-infinitives.mjs from the word list of compromise ${version}: every word whose entry's first
// tag is "Infinitive" (a base-form verb). Do not edit; run the script again after upgrading the model.
export const modelVersion = ${JSON.stringify(version)};

export const modelInfinitives: readonly string[] = [
${wrappedItems(words.map((word) => `${JSON.stringify(word)},`))}
];
`;
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const version = require('compromise').version;
  const target = fileURLToPath(new URL('../src/analysis/prose/model-infinitives.ts', import.meta.url));
  const words = infinitivesOfModel();
  writeFileSync(target, moduleText(words, version));
  process.stderr.write(`model-infinitives: ${words.length} words from compromise ${version}.\n`);
}
