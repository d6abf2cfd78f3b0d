// What the history keeps of each committed version, read from its front-matter alone, must be what the whole reading
// of the same text gives: the audit trail, the in-force decision and the page keys read it instead.
import { readFileSync } from 'node:fs';
import { relative } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { readVersionRecord, recordOf } from '../../src/history/version-record.ts';
import { splitFrontMatter } from '../../src/parse/split-front-matter.ts';
import { alteredFrontMatter, demoFiles } from '../parse/altered-front-matters.ts';

const whole = (path: string, text: string) => recordOf(readProcedure(path, text).procedure);

describe('the record of a committed version', () => {
  it('is the record of the whole reading, for every demo procedure', () => {
    expect(demoFiles.length).toBeGreaterThan(5);
    for (const file of demoFiles) {
      const path = relative(process.cwd(), file);
      const text = readFileSync(file, 'utf8');
      const record = readVersionRecord(path, text);
      expect(record, path).not.toBeNull();
      expect(record, path).toEqual(whole(path, text));
    }
    // The calls are there: the demo batch procedure runs the inerting procedure as a step.
    expect(demoFiles.some((f) => (readVersionRecord(f, readFileSync(f, 'utf8'))?.calls.length ?? 0) > 0)).toBe(true);
  });

  it('is the record of the whole reading, or null with it, for altered demo front-matters and narratives (property)', () => {
    const pieces = ['- ', ': ', '#', '"', '|', '\n', '[', '{', 'revision: 7\n', 'status: effective\n', 'null', '\t', '---', '\n---\n', '> ', '* ', '1. '];
    const texts = demoFiles.map((f) => readFileSync(f, 'utf8'));
    const arbitrary = fc.tuple(fc.nat({ max: texts.length - 1 }), alteredFrontMatter(pieces), fc.constantFrom('', '\n# Notes\n\n- one\n  - two\n', '\n> quoted\n'));
    let readable = 0;
    fc.assert(fc.property(arbitrary, ([which, yaml, extra]) => {
      const body = splitFrontMatter(texts[which]).body + extra;
      const text = `---\n${yaml}\n---\n${body}`;
      const record = readVersionRecord('procedures/p.md', text);
      if (record) readable++;
      expect(record).toEqual(whole('procedures/p.md', text));
    }), { numRuns: 300, seed: 1207 });
    expect(readable).toBeGreaterThan(50);
  });

  it('is null for a text that holds no procedure, as the whole reading is', () => {
    for (const text of ['', 'Just notes.\n', '---\n- a list\n---\nBody\n', '---\nid: [unclosed\n---\n']) {
      expect(readVersionRecord('procedures/p.md', text)).toBeNull();
      expect(whole('procedures/p.md', text)).toBeNull();
    }
  });
});
