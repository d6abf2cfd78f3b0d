// Runs every rule's fixtures: each `# expect: rule` marker must be reported on its line, and nothing else for that rule.
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';
import { expectationsIn } from './fixture-expectations.ts';
import { fixtureFolders, fixturesRoot as root, inputsOf, loadFolder, previousOf, registerOf } from './rule-fixture-folders.ts';

const today = '2026-12-01';

describe('rule fixtures', () => {
  for (const ruleId of fixtureFolders()) {
    it(`${ruleId}: reports exactly the marked lines`, () => {
      const files = loadFolder(ruleId);
      const register = registerOf(ruleId);
      const result = checkSources(inputsOf(files), { today, previous: previousOf(ruleId), register });
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
