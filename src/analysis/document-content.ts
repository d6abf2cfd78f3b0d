// Splits a procedure into its content (what operators follow) and its document control (who signed, when):
// a change of content needs a new revision, a change of document control does not.
import { createHash } from 'node:crypto';
import type { Procedure } from '../model/procedure.ts';

/**
 * Front-matter keys that describe the document rather than the operation. The yearly certification (a new entry
 * under `certifications` and the next `review-by`) confirms the content as it is, so it is not an edit of it.
 */
export const documentControlKeys = ['revision', 'status', 'effective', 'review-by', 'certifications', 'owner', 'author', 'change', 'approvals'] as const;

/** Content areas in the order reviewers read them; 'body' is the narrative below the steps. */
export type ContentArea =
  | 'id' | 'title' | 'kind' | 'equipment' | 'ppe' | 'signals' | 'limits' | 'interlocks' | 'hazards' | 'steps' | 'body' | 'other';

const areaOfKey: Record<string, ContentArea> = {
  id: 'id', title: 'title', kind: 'kind', equipment: 'equipment', ppe: 'ppe', signals: 'signals',
  limits: 'limits', interlocks: 'interlocks', hazards: 'hazards', steps: 'steps',
};

const areaOrder: ContentArea[] = ['id', 'title', 'kind', 'equipment', 'ppe', 'signals', 'limits', 'interlocks', 'hazards', 'steps', 'body', 'other'];

/** The content areas that differ between two versions of one procedure, in reading order. */
export function changedContentAreas(before: Pick<Procedure, 'data' | 'bodyText'>, after: Pick<Procedure, 'data' | 'bodyText'>): ContentArea[] {
  // A file unchanged since the commit is compared with its own reading (the check reads it once).
  if (before === after) return [];
  return changedAreasBetween(contentPrint(before), contentPrint(after));
}

/**
 * What comparing one version's content with another's reads, kept small: a digest of each front-matter key's value
 * outside document control (sorted by key), and of the narrative's words. The history keeps one per commit instead
 * of the commit's whole reading.
 */
export interface ContentPrint {
  keys: Array<[key: string, digest: string]>;
  body: string;
}

const digestOf = (text: string) => createHash('sha256').update(text).digest('base64url');

export function contentPrint(p: Pick<Procedure, 'data' | 'bodyText'>): ContentPrint {
  const control = new Set<string>(documentControlKeys);
  const keys = Object.keys(p.data).filter((key) => !control.has(key)).sort().map((key): [string, string] => [key, digestOf(canonical(p.data[key]))]);
  return { keys, body: digestOf(normalizeBody(p.bodyText)) };
}

/** The content areas that differ between two versions, from their prints, in reading order. */
export function changedAreasBetween(before: ContentPrint, after: ContentPrint): ContentArea[] {
  const changed = new Set<ContentArea>();
  const old = new Map(before.keys);
  const now = new Map(after.keys);
  for (const key of new Set([...old.keys(), ...now.keys()])) {
    if (old.get(key) !== now.get(key)) changed.add(Object.hasOwn(areaOfKey, key) ? areaOfKey[key] : 'other');
  }
  if (before.body !== after.body) changed.add('body');
  return areaOrder.filter((a) => changed.has(a));
}

/** JSON with sorted object keys, so re-ordering keys in YAML is not a change of content. */
export function canonical(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) => {
    if (v && typeof v === 'object' && !Array.isArray(v) && !(v instanceof Date)) {
      // Any fixed order will do for telling equal from different; code-unit order needs no collation tables.
      return Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
    }
    return v;
  }) ?? 'undefined';
}

/** Re-wrapping a paragraph or trailing blank lines do not change what the reader sees. */
function normalizeBody(text: string): string {
  return text.replace(/\s+/g, ' ').trim();
}
