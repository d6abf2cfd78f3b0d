// Splits a procedure into its content (what operators follow) and its document control (who signed, when):
// a change of content needs a new revision, a change of document control does not.
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
  const changed = new Set<ContentArea>();
  const control = new Set<string>(documentControlKeys);
  const keys = new Set([...Object.keys(before.data), ...Object.keys(after.data)]);
  for (const key of keys) {
    if (control.has(key)) continue;
    if (canonical(before.data[key]) !== canonical(after.data[key])) changed.add(areaOfKey[key] ?? 'other');
  }
  if (normalizeBody(before.bodyText) !== normalizeBody(after.bodyText)) changed.add('body');
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
