// Runs every rule's fixtures: each `# expect: rule` marker must be reported on its line, and nothing else for that rule.
import { readdirSync, readFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';
import { expectationsIn } from './fixture-expectations.ts';
import { readRegisterFolder } from '../../src/cli/load-register.ts';
import type { PlantRegister } from '../../src/model/register.ts';

const root = join(import.meta.dirname, '../fixtures/rules');
const today = '2026-12-01';

function loadFolder(ruleId: string) {
  const dir = join(root, ruleId);
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

// History rules compare with the previous committed version: `x.previous.md` next to `x.md` plays that part.
const previousSuffix = '.previous.md';
function previousOf(ruleId: string) {
  return (file: string) => {
    const path = join(root, ruleId, file.slice(ruleId.length + 1).replace(/\.md$/, previousSuffix));
    return existsSync(path) ? { text: readFileSync(path, 'utf8'), commit: 'fixture' } : undefined;
  };
}

// A rule folder with a `register/` sub-folder is checked against that plant register; its YAML files carry markers too.
function registerOf(ruleId: string): PlantRegister | undefined {
  const dir = join(root, ruleId, 'register');
  return existsSync(dir) ? readRegisterFolder({ absolute: dir, named: true }, root) : undefined;
}

describe('rule fixtures', () => {
  // One folder per rule; a hidden folder (a result cache a check run left there) is no rule's.
  const folders = existsSync(root) ? readdirSync(root).filter((name) => !name.startsWith('.')).sort() : [];
  for (const ruleId of folders) {
    it(`${ruleId}: reports exactly the marked lines`, () => {
      const files = loadFolder(ruleId);
      const register = registerOf(ruleId);
      const result = checkSources(files.map(({ file, text, error }) => (error ? { file, error } : { file, text })), { today, previous: previousOf(ruleId), register });
      const reported = result.diagnostics.filter((d) => d.rule === ruleId).map((d) => `${d.file}:${d.line}`).sort();
      const registerFiles = (register?.sources ?? []).map((s) => ({ file: s.file, text: s.source.text }));
      const expected = [...files, ...registerFiles].flatMap((f) => expectationsIn(f.text).filter((e) => e.rule === ruleId).map((e) => `${f.file}:${e.line}`)).sort();
      expect(reported).toEqual(expected);
    });
  }
});

describe('every rule is documented and tested', () => {
  for (const [id, rule] of Object.entries(rules)) {
    it(`${id} has docs, a summary and fixtures that fire`, () => {
      expect(rule.meta.id).toBe(id);
      expect(rule.meta.summary.length).toBeGreaterThan(10);
      expect(rule.meta.docs.length).toBeGreaterThan(40);
      const dir = join(root, id);
      expect(existsSync(dir), `tests/fixtures/rules/${id}/ is missing`).toBe(true);
      const files = loadFolder(id);
      expect(files.some((f) => f.name.startsWith('valid')), 'needs a valid-*.md fixture').toBe(true);
      const registerFiles = (registerOf(id)?.sources ?? []).map((s) => ({ name: `invalid-register ${s.file}`, text: s.source.text }));
      const marked = [...files, ...registerFiles].filter((f) => f.name.startsWith('invalid') && expectationsIn(f.text).some((e) => e.rule === id));
      expect(marked.length, 'needs an invalid-*.md fixture with an expect marker').toBeGreaterThan(0);
    });
  }
});
