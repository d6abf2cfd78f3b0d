// The configuration file: severities per rule, folder and glob overrides, and diagnostics for bad configuration.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fileMatcher, parseConfig, severityPolicy } from '../../src/check/config.ts';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

const known = Object.keys(rules);
const fixture = readFileSync(join(import.meta.dirname, '../fixtures/rules/vague-term/invalid-as-required.md'), 'utf8');

describe('parseConfig', () => {
  it('reads rule levels and overrides', () => {
    const { config, diagnostics } = parseConfig('stepwright.config.yaml', `rules:
  vague-term: error
overrides:
  - files: procedures/utilities
    rules: { vague-term: off }
  - files: ["**/*-tmp-*.md"]
    rules: { sentence-too-long: info }
`, known);
    expect(diagnostics).toEqual([]);
    const policy = severityPolicy(config);
    expect(policy('vague-term', 'procedures/k-210-resin/a.md')).toBe('error');
    expect(policy('vague-term', 'procedures/utilities/n2.md')).toBe('off');
    expect(policy('sentence-too-long', 'procedures/t-230/u2-t230-tmp-001.md')).toBe('info');
    expect(policy('sentence-too-long', 'procedures/t-230/u2-t230-cip-001.md')).toBeUndefined();
  });

  it('reports an unknown rule id at its key, with a suggestion, and keeps the rest', () => {
    const { config, diagnostics } = parseConfig('c.yaml', 'rules:\n  vague-term: error\n  vauge-term: off\n', known);
    expect(diagnostics.map((d) => [d.rule, d.line, d.column, d.severity])).toEqual([['bad-config', 3, 3, 'error']]);
    expect(diagnostics[0].hint).toContain('vague-term');
    expect(config.rules['vague-term']).toBe('error');
  });

  it('reports a bad level, an unknown key and broken YAML as diagnostics, never throwing', () => {
    const bad = parseConfig('c.yaml', 'rules:\n  vague-term: loud\nextra: 1\n', known);
    expect(bad.diagnostics.map((d) => [d.line, d.column])).toEqual([[2, 15], [3, 1]]);
    const broken = parseConfig('c.yaml', 'rules: [\n', known);
    expect(broken.diagnostics.length).toBeGreaterThan(0);
    expect(broken.diagnostics.every((d) => d.rule === 'bad-config')).toBe(true);
    fc.assert(fc.property(fc.string(), (text) => {
      const r = parseConfig('c.yaml', text, known);
      return Array.isArray(r.diagnostics) && r.diagnostics.every((d) => d.line >= 1 && d.column >= 1);
    }));
  });

  it('drives checkSources through the severity policy', () => {
    const input = [{ file: 'procedures/utilities/x.md', text: fixture }, { file: 'procedures/k-210/y.md', text: fixture.replace('FX-SW-', 'FX-SY-') }];
    const { config } = parseConfig('c.yaml', 'rules: { vague-term: error }\noverrides:\n  - { files: procedures/utilities/, rules: { vague-term: off } }\n', known);
    const result = checkSources(input, { today: '2026-12-01', severity: severityPolicy(config) });
    const vague = result.diagnostics.filter((d) => d.rule === 'vague-term');
    expect(vague.map((d) => [d.file, d.severity])).toEqual([['procedures/k-210/y.md', 'error']]);
  });
});

describe('fileMatcher', () => {
  it('matches folder prefixes on whole folder names only', () => {
    expect(fileMatcher('procedures/unit')('procedures/unit/a.md')).toBe(true);
    expect(fileMatcher('procedures/unit')('procedures/unit-2/a.md')).toBe(false);
  });
  it('matches globs: * within a folder, ** across folders, ? one character', () => {
    expect(fileMatcher('procedures/*.md')('procedures/a.md')).toBe(true);
    expect(fileMatcher('procedures/*.md')('procedures/x/a.md')).toBe(false);
    expect(fileMatcher('**/a.md')('a.md')).toBe(true);
    expect(fileMatcher('**/a.md')('procedures/x/a.md')).toBe(true);
    expect(fileMatcher('p?.md')('p1.md')).toBe(true);
  });
  it('a folder prefix matches every file below it (property)', () => {
    const seg = fc.stringMatching(/^[a-z0-9-]{1,8}$/);
    fc.assert(fc.property(fc.array(seg, { minLength: 1, maxLength: 3 }), fc.array(seg, { minLength: 1, maxLength: 3 }), (folder, rest) => {
      const f = folder.join('/');
      return fileMatcher(f)(`${f}/${rest.join('/')}.md`) && fileMatcher(`${f}/**`)(`${f}/${rest.join('/')}.md`);
    }));
  });
});
