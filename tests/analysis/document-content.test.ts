// Which content areas differ between two versions of a procedure: what the history rules and the redline read.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { changedContentAreas } from '../../src/analysis/document-content.ts';

const version = (data: Record<string, unknown>, bodyText = 'Purpose: heat the kettle.\n') => ({ data, bodyText });
const base = {
  id: 'U2-K210-BATCH-001', title: 'Resin batch', revision: 3, status: 'effective',
  limits: [{ name: 'TI-210', max: 180, unit: 'degC' }], steps: [{ step: 'heat', do: 'Heat the kettle to 150 degC.' }],
};

/** The same value with every object's keys in the reverse order. */
function reversedKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(reversedKeys);
  if (value && typeof value === 'object') return Object.fromEntries(Object.entries(value).reverse().map(([k, v]) => [k, reversedKeys(v)]));
  return value;
}

describe('changed content areas', () => {
  it('finds nothing between a version and itself, or a copy with its keys in another order', () => {
    const v = version(base);
    expect(changedContentAreas(v, v)).toEqual([]);
    expect(changedContentAreas(v, version(structuredClone(base)))).toEqual([]);
    expect(changedContentAreas(v, version(reversedKeys(base) as Record<string, unknown>))).toEqual([]);
  });

  it('names the areas that changed, in reading order, and leaves document control out', () => {
    const after = structuredClone(base) as typeof base & Record<string, unknown>;
    after.steps[0].do = 'Heat the kettle to 160 degC.';
    after.limits[0].max = 185;
    after.revision = 4;
    after.status = 'draft';
    expect(changedContentAreas(version(base), version(after, 'Purpose: heat the kettle slowly.\n'))).toEqual(['limits', 'steps', 'body']);
    expect(changedContentAreas(version(base), version({ ...base, revision: 4, 'review-by': '2027-12-01' }))).toEqual([]);
    // Re-wrapping the narrative is not a change of what the reader sees.
    expect(changedContentAreas(version(base, 'Purpose: heat\nthe kettle.'), version(base, 'Purpose: heat the kettle.\n\n'))).toEqual([]);
  });

  it('never sees a change in a copy, whatever the data (property)', () => {
    const data = fc.dictionary(fc.string({ minLength: 1, maxLength: 8 }), fc.jsonValue({ maxDepth: 3 }));
    fc.assert(
      fc.property(data, (d) => {
        expect(changedContentAreas(version(d), version(structuredClone(d)))).toEqual([]);
        expect(changedContentAreas(version(d), version(reversedKeys(d) as Record<string, unknown>))).toEqual([]);
      }),
      { numRuns: 300, seed: 1204 },
    );
  });

  it('sees a changed value under any content key (property)', () => {
    const key = fc.constantFrom('title', 'equipment', 'hazards', 'steps', 'limits', 'notes');
    fc.assert(
      fc.property(key, fc.string({ minLength: 1 }), (k, value) => {
        const before = { ...base, [k]: `was ${value}` };
        const after = { ...base, [k]: `now ${value}` };
        expect(changedContentAreas(version(before), version(after))).toEqual([k === 'notes' ? 'other' : k]);
      }),
      { numRuns: 100, seed: 1205 },
    );
  });
});
