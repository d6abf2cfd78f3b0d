// A tag's where-used list in parts. A tag that many procedures use (the plant's main vessel, a shared interlock) would
// otherwise make one page that lists every one of them with its steps: megabytes on a tablet, drawn again and fetched
// again by every tablet whenever any of those procedures changes. Its list is cut into parts of a fixed number of
// procedures, in procedure id order: the first part is the tag's own page, the others are pages under it, and every
// part links to all of them. A changed procedure changes the one part it is listed in; a procedure added or taken
// away moves the parts after it.
import type { TagRole } from './where-used.ts';

/** Procedures listed on one part of a tag's where-used list. */
export const proceduresPerTagPart = 50;

/** One part of a tag's list, as the part links name it: its number, its page and which procedures it lists (1-based, in id order). */
export interface TagPartLink {
  number: number;
  url: string;
  first: number;
  last: number;
}

/** A tag with its uses and the links to its parts (the manual's tag view). */
export interface PartedTag<Use extends { procedureId: string }> {
  tag: string;
  slug: string;
  roles: TagRole[];
  uses: Use[];
  parts: TagPartLink[];
}

/** What one part's page shows: the whole tag's heading facts, the links to every part, and this part's uses. */
export interface TagPart<Use extends { procedureId: string }> {
  tag: string;
  slug: string;
  roles: TagRole[];
  procedureCount: number;
  number: number;
  parts: TagPartLink[];
  uses: Use[];
}

/** The procedure ids a tag's uses name, in the order the list shows them. */
export function procedureIdsOf(uses: ReadonlyArray<{ procedureId: string }>): string[] {
  return [...new Set(uses.map((u) => u.procedureId))].sort((a, b) => a.localeCompare(b));
}

/**
 * The parts of a list of `count` procedures, each with its page: `urlOf(1)` is the tag's own page. A list of no
 * procedures still has one part (the page says so).
 */
export function tagPartLinks(count: number, urlOf: (number: number) => string): TagPartLink[] {
  const parts = Math.max(1, Math.ceil(count / proceduresPerTagPart));
  return Array.from({ length: parts }, (_, i) => ({
    number: i + 1,
    url: urlOf(i + 1),
    first: Math.min(count, i * proceduresPerTagPart + 1),
    last: Math.min(count, (i + 1) * proceduresPerTagPart),
  }));
}

/** Every part of a tag's list, with the uses each shows (in the tag's own order: by role, then procedure). */
export function tagParts<Use extends { procedureId: string }>(t: PartedTag<Use>): Array<TagPart<Use>> {
  const ids = procedureIdsOf(t.uses);
  const partOf = new Map(ids.map((id, i) => [id, Math.floor(i / proceduresPerTagPart)]));
  const uses: Use[][] = t.parts.map(() => []);
  for (const use of t.uses) uses[partOf.get(use.procedureId)!].push(use);
  return t.parts.map((link, i) => ({
    tag: t.tag, slug: t.slug, roles: t.roles, procedureCount: ids.length, number: link.number, parts: t.parts, uses: uses[i],
  }));
}
