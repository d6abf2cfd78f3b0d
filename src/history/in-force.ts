// Which revision of a procedure is in force: the one the procedure page shows, search finds and the home page
// lists. A newer draft or revision in review never replaces it; it gets its own page, linked from a notice. Nor
// does a newer revision whose effective date is still ahead, whether its status says approved or effective.
import { hasTakenEffect } from '../analysis/document-control.ts';

/** The facts of one revision that decide whether it is in force. */
export interface RevisionState {
  revision: number;
  status: string;
  effective?: string;
}

/** A revision is in force once approved or effective with its effective date reached, until replaced. */
export function canBeInForce(r: Pick<RevisionState, 'status' | 'effective'>, today: string): boolean {
  return hasTakenEffect(r, today);
}

export type InForce<E extends RevisionState> =
  /** The newest text (the file as it is) is in force. */
  | { state: 'newest' }
  /** An earlier committed revision is in force; the newest one is not yet. */
  | { state: 'earlier'; entry: E }
  /** Nothing is in force; `reason` says why in words an operator can act on. */
  | { state: 'none'; reason: string };

/**
 * `newest` is the procedure as its file reads now; `committed` are its committed revisions (any order). An earlier
 * revision counts only when its own last committed status put it in force and it is older than the newest.
 */
export function revisionInForce<E extends RevisionState>(newest: RevisionState, committed: readonly E[], today: string): InForce<E> {
  if (canBeInForce(newest, today)) return { state: 'newest' };
  if (newest.status === 'retired') return { state: 'none', reason: `This procedure was retired at revision ${newest.revision}. It no longer applies to the plant.` };
  if (newest.status === 'superseded') return { state: 'none', reason: `Revision ${newest.revision} is marked superseded and no later revision is in this manual. Ask the procedure owner which document replaces it.` };
  const earlier = committed
    .filter((e) => e.revision < newest.revision && canBeInForce(e, today))
    .sort((a, b) => b.revision - a.revision)[0];
  if (earlier) return { state: 'earlier', entry: earlier };
  const what = newest.status === 'approved' || newest.status === 'effective' ? `${newest.status} but takes effect on ${newest.effective}` : `${newest.status === 'in-review' ? 'in review' : newest.status || 'of unknown status'}`;
  const before = newest.revision > 1
    ? ` No earlier revision in force is in this manual's history, so there is no revision of this procedure to operate from here; ask the procedure owner for the controlled copy in force.`
    : ' It has never been in force.';
  return { state: 'none', reason: `No revision of this procedure is in force. Revision ${newest.revision} is ${what}.${before}` };
}
