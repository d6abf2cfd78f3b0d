// A tag's where-used list in parts: every use shown once, in order, a bounded number of procedures per part, and a
// change to one procedure reaching one part only.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { proceduresPerTagPart, procedureIdsOf, tagPartLinks, tagParts } from '../../src/render/tag-parts.ts';
import { pagePath } from '../../src/render/site-url.ts';

interface Use { role: 'equipment' | 'interlock' | 'signal'; procedureId: string; title: string }
const roleOrder = ['equipment', 'interlock', 'signal'] as const;

/** A tag as the manual's view makes it: uses by role, then procedure id; one part link per `proceduresPerTagPart` procedures. */
function tagOf(uses: Use[]) {
  const sorted = [...uses].sort((a, b) => roleOrder.indexOf(a.role) - roleOrder.indexOf(b.role) || a.procedureId.localeCompare(b.procedureId));
  const roles = roleOrder.filter((r) => sorted.some((u) => u.role === r));
  const parts = tagPartLinks(procedureIdsOf(sorted).length, (n) => pagePath.tagPart('k-210', n));
  return { tag: 'K-210', slug: 'k-210', roles: [...roles], uses: sorted, parts };
}

const usesArbitrary = fc.uniqueArray(
  fc.record({ role: fc.constantFrom(...roleOrder), procedureId: fc.integer({ min: 1, max: 400 }).map((n) => `U2-P-${String(n).padStart(3, '0')}`), title: fc.string({ maxLength: 8 }) }),
  // 'max': lists of up to 400 uses, so that a tag has many parts (the default size keeps lists to a few items).
  { maxLength: 400, size: 'max', selector: (u) => `${u.role}:${u.procedureId}` },
);

describe('tag parts', () => {
  it('shows every use exactly once, in the tag\'s order within a part, with at most the set number of procedures a part', () => {
    let manyParts = 0;
    fc.assert(fc.property(usesArbitrary, (uses) => {
      const tag = tagOf(uses);
      const parts = tagParts(tag);
      const key = (u: Use) => `${u.role}:${u.procedureId}`;
      expect(parts.flatMap((p) => p.uses).map(key).sort()).toEqual(tag.uses.map(key).sort());
      const ids = procedureIdsOf(uses);
      expect(parts).toHaveLength(Math.max(1, Math.ceil(ids.length / proceduresPerTagPart)));
      parts.forEach((part, i) => {
        const own = procedureIdsOf(part.uses);
        // The procedures a part lists are the ones its link names, by position in id order; no procedure is split.
        expect(own).toEqual(ids.slice(part.parts[i].first - 1, part.parts[i].last));
        expect(own.length).toBeLessThanOrEqual(proceduresPerTagPart);
        // Within a part, the tag's own order: by role, then procedure.
        expect(part.uses).toEqual(tag.uses.filter((u) => own.includes(u.procedureId)));
        expect(part.number).toBe(i + 1);
        expect(part.procedureCount).toBe(ids.length);
      });
      if (parts.length > 2) manyParts++;
    }), { numRuns: 300 });
    // The lists were long enough to be cut in several parts most of the time.
    expect(manyParts).toBeGreaterThan(100);
  });

  it('changes one part only when one procedure\'s entry changes', () => {
    fc.assert(fc.property(usesArbitrary.filter((u) => u.length > 0), fc.nat(), (uses, pick) => {
      const before = tagParts(tagOf(uses));
      const changedId = uses[pick % uses.length].procedureId;
      const after = tagParts(tagOf(uses.map((u) => (u.procedureId === changedId ? { ...u, title: `${u.title}, second edition` } : u))));
      const differ = before.filter((part, i) => JSON.stringify(part) !== JSON.stringify(after[i]));
      expect(differ).toHaveLength(1);
      expect(differ[0].uses.some((u) => u.procedureId === changedId)).toBe(true);
    }), { numRuns: 300 });
  });

  it('keeps a tag of few procedures on one page, its own, and names later parts under it', () => {
    expect(tagPartLinks(0, (n) => pagePath.tagPart('k-210', n))).toEqual([{ number: 1, url: '/tags/k-210/', first: 0, last: 0 }]);
    expect(tagPartLinks(proceduresPerTagPart, (n) => pagePath.tagPart('k-210', n))).toHaveLength(1);
    const links = tagPartLinks(proceduresPerTagPart * 2 + 1, (n) => pagePath.tagPart('k-210', n));
    expect(links.map((l) => [l.url, l.first, l.last])).toEqual([
      ['/tags/k-210/', 1, proceduresPerTagPart],
      ['/tags/k-210/2/', proceduresPerTagPart + 1, proceduresPerTagPart * 2],
      ['/tags/k-210/3/', proceduresPerTagPart * 2 + 1, proceduresPerTagPart * 2 + 1],
    ]);
  });
});
