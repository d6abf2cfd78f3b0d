// Which content areas differ between two versions of a procedure: what the history rules and the redline read.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonical, changedAreasBetween, changedContentAreas, contentPrint, documentControlKeys } from '../../src/analysis/document-content.ts';

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

  it('reports a change under a key named like a member of every object (constructor, toString) as other', () => {
    for (const key of ['constructor', 'toString', 'hasOwnProperty', '__proto__']) {
      const before = JSON.parse(`{"id": "U2-X-001", "${key}": "a"}`) as Record<string, unknown>;
      const after = JSON.parse(`{"id": "U2-X-001", "${key}": "b"}`) as Record<string, unknown>;
      expect(changedContentAreas(version(before), version(after)), key).toEqual(['other']);
    }
  });

  it('tells from two prints the areas a direct comparison of the two versions tells (property)', () => {
    // The comparison the prints stand for: each content key's value as JSON with sorted keys, and the words of the narrative.
    const control = new Set<string>(documentControlKeys);
    const areas = ['id', 'title', 'kind', 'equipment', 'ppe', 'signals', 'limits', 'interlocks', 'hazards', 'steps'];
    const direct = (a: ReturnType<typeof version>, b: ReturnType<typeof version>) => {
      const changed = new Set<string>();
      for (const key of new Set([...Object.keys(a.data), ...Object.keys(b.data)])) {
        if (!control.has(key) && canonical(a.data[key]) !== canonical(b.data[key])) changed.add(areas.includes(key) ? key : 'other');
      }
      if (a.bodyText.replace(/\s+/g, ' ').trim() !== b.bodyText.replace(/\s+/g, ' ').trim()) changed.add('body');
      return [...areas, 'body', 'other'].filter((x) => changed.has(x));
    };
    // Few keys and values, so that two versions often share some and differ in others.
    const key = fc.constantFrom('id', 'title', 'steps', 'limits', 'revision', 'status', 'notes', 'approvals', 'constructor');
    const value = fc.oneof(fc.constantFrom('a', 'b', 1, null, [1, 2], { x: 1, y: [2] }, { y: [2], x: 1 }), fc.jsonValue({ maxDepth: 2 }));
    const body = fc.constantFrom('Heat the kettle.', 'Heat  the\nkettle.\n', 'Cool the kettle.', '');
    const side = fc.record({ data: fc.dictionary(key, value, { maxKeys: 5 }), bodyText: body });
    fc.assert(
      fc.property(side, side, (a, b) => {
        expect(changedAreasBetween(contentPrint(a), contentPrint(b))).toEqual(direct(a, b));
        expect(changedContentAreas(a, b)).toEqual(direct(a, b));
      }),
      { numRuns: 2000, seed: 1206 },
    );
  });
});
