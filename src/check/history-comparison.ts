// What the history rules share: this version and the previous committed one, both readable, with their revisions.
import type { Procedure } from '../model/procedure.ts';
import type { FileContext } from './define-rule.ts';

export interface Comparison {
  before: Procedure;
  after: Procedure;
  /** Where the previous version came from, for messages (a short commit id or a base ref). */
  commit: string;
}

/** Both versions with readable revision numbers, or undefined (then the history rules stay silent). */
export function compareWithPrevious(ctx: FileContext): Comparison | undefined {
  const before = ctx.history?.procedure;
  const after = ctx.procedure;
  if (!ctx.history || !before || !after) return undefined;
  if (!Number.isInteger(before.revision) || !Number.isInteger(after.revision)) return undefined;
  return { before, after, commit: ctx.history.commit };
}

/** Statuses in which a revision is still being written, so editing it in place is normal. */
export const editableStatuses = new Set(['draft', 'in-review']);
