// The rule fixtures: one folder per rule under tests/fixtures/rules/, read as the check reads them, with the previous
// version of a file (`x.previous.md`) and the plant register (`register/`) a folder may hold.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { readRegisterFolder } from '../../src/cli/load-register.ts';
import type { SourceInput } from '../../src/check/run-checks.ts';
import type { PlantRegister } from '../../src/model/register.ts';

export const fixturesRoot = join(import.meta.dirname, '../fixtures/rules');

/** One folder per rule; a hidden folder (a result cache a check run left there) is no rule's. */
export function fixtureFolders(): string[] {
  return existsSync(fixturesRoot) ? readdirSync(fixturesRoot).filter((name) => !name.startsWith('.')).sort() : [];
}

export function loadFolder(ruleId: string) {
  const dir = join(fixturesRoot, ruleId);
  return readdirSync(dir).filter((f) => f.endsWith('.md') && !f.endsWith(previousSuffix)).sort().map((name) => {
    const bytes = readFileSync(join(dir, name));
    let error: string | undefined;
    try {
      new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    } catch {
      error = 'it is not valid UTF-8 text';
    }
    return { name, file: `${ruleId}/${name}`, text: bytes.toString('utf8'), error };
  });
}

/** A folder's files as the check takes them. */
export function inputsOf(files: ReturnType<typeof loadFolder>): SourceInput[] {
  return files.map(({ file, text, error }) => (error ? { file, error } : { file, text }));
}

// History rules compare with the previous committed version: `x.previous.md` next to `x.md` plays that part.
const previousSuffix = '.previous.md';
export function previousOf(ruleId: string) {
  return (file: string) => {
    const path = join(fixturesRoot, ruleId, file.slice(ruleId.length + 1).replace(/\.md$/, previousSuffix));
    return existsSync(path) ? { text: readFileSync(path, 'utf8'), commit: 'fixture' } : undefined;
  };
}

// A rule folder with a `register/` sub-folder is checked against that plant register; its YAML files carry markers too.
export function registerOf(ruleId: string): PlantRegister | undefined {
  const dir = join(fixturesRoot, ruleId, 'register');
  return existsSync(dir) ? readRegisterFolder({ absolute: dir, named: true }, fixturesRoot) : undefined;
}
