// What only the rules read (a procedure's prose, sequence, decisions and plant state) is kept once per procedure while
// a check runs and let go when a site build is done with the check; asked for again, it is made again, the same.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readProcedure } from '../../src/read/read-procedure.ts';
import { forgetRuleAnalyses } from '../../src/analysis/rule-memo.ts';
import { proseOf } from '../../src/analysis/prose/prose-sites.ts';
import { analyseSequence } from '../../src/analysis/soundness/analyse-sequence.ts';
import { analyseDecisions } from '../../src/analysis/decisions/analyse-decisions.ts';

const asData = (value: unknown) => JSON.stringify(value, (_, v: unknown) => (typeof v === 'function' ? '(function)' : v instanceof Map ? [...v] : v instanceof Set ? [...v] : v));

const file = 'procedures/k-210-resin/u2-k210-batch-001.md';

describe('rule analyses kept per procedure', () => {
  it('are shared while kept, made again after they are let go, with the same content', () => {
    const { procedure, facts } = readProcedure(file, readFileSync(file, 'utf8'));
    const made = () => ({ prose: proseOf(procedure!), sequence: analyseSequence(facts!), decisions: analyseDecisions(facts!), state: facts!.state });
    const first = made();
    const again = made();
    for (const key of Object.keys(first) as Array<keyof typeof first>) expect(again[key], key).toBe(first[key]);
    expect(first.prose.length).toBeGreaterThan(10);
    expect(first.decisions.length).toBeGreaterThan(0);
    forgetRuleAnalyses();
    const remade = made();
    for (const key of Object.keys(first) as Array<keyof typeof first>) {
      expect(remade[key], key).not.toBe(first[key]);
      // Compared as data: an analysis may hold functions of its own (the signal space's), made again with it.
      expect(asData(remade[key]), key).toBe(asData(first[key]));
    }
  });
});
