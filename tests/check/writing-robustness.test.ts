// The content and writing rules finish on any text an author may type: no internal failure, every place valid.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';

const mine = Object.values(rules).filter((r) => ['writing', 'safety'].includes(r.meta.category));

describe('writing and safety rules on arbitrary text', () => {
  it('never fail internally and report inside the file', () => {
    const word = fc.oneof(fc.constantFrom('Open', 'the', 'and', 'then', 'XV-2101', '45', 'degC', 'as required', ',', ';', '.', 'If', 'Do not', 'death', 'approximately', '2.5', 'notice'), fc.string({ maxLength: 6 }));
    fc.assert(fc.property(fc.array(word, { maxLength: 25 }), fc.array(word, { maxLength: 25 }), (a, b) => {
      const doText = JSON.stringify(a.join(' '));
      const note = JSON.stringify(b.join(' '));
      const text = `---\nid: U2-FUZZ-001\ntitle: Fuzz\nkind: normal\nrevision: 0\nstatus: draft\nhazards:\n  - { level: notice, hazard: ${note}, consequence: ${doText} }\nsteps:\n  - { step: s, do: ${doText}, note: ${note}, confirm: ${note} }\n---\n`;
      const lines = text.split('\n').length;
      const result = checkSources([{ file: 'f.md', text }], { today: '2026-12-01', rules: mine });
      for (const d of result.diagnostics) {
        expect(d.message).not.toMatch(/could not finish/);
        expect(d.line).toBeGreaterThanOrEqual(1);
        expect(d.line).toBeLessThanOrEqual(lines);
      }
    }), { numRuns: 60 });
  });
});
