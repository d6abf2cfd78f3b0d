// The plant register entries a procedure takes over that changed after the revision shown took effect: the page
// shows them as the register defines them now, which is not what the revision's approvers saw. Said on the page,
// with each change, so that a value no approval covered never passes as approved.

/** What the page needs of one change of a register entry (the history reads it from git). */
export interface EntryChange {
  /** Undefined for a change not committed yet. */
  commit?: string;
  /** YYYY-MM-DD of the commit. */
  date?: string;
  change: 'added' | 'removed' | 'changed';
  details: string[];
}

export interface RegisterChangeSince {
  id: string;
  url: string;
  /** YYYY-MM-DD of the change; undefined for a change not committed yet. */
  date?: string;
  details: string[];
  change: EntryChange['change'];
}

/** A change's details as a line of the page: short ones as they are; a long one (a whole block) is left to the entry's page. */
const longestDetail = 120;

/**
 * Changes to `entries` after the revision shown took effect (`effective`, YYYY-MM-DD), newest first per entry, in the
 * entries' order: a change committed on a later day, or not committed yet. Said only of a revision in force
 * (status effective): a draft's page shows what it will be approved with, and a superseded or retired one is history.
 */
export function registerChangedSince(
  revision: { status: string; effective?: string },
  entries: ReadonlyArray<{ id: string; url: string }>,
  history: ReadonlyMap<string, readonly EntryChange[]>,
): RegisterChangeSince[] {
  const effective = revision.effective;
  if (revision.status !== 'effective' || !effective) return [];
  const out: RegisterChangeSince[] = [];
  for (const entry of entries) {
    for (const revision of history.get(entry.id) ?? []) {
      const after = revision.commit === undefined || (revision.date !== undefined && revision.date > effective);
      if (!after) continue;
      const details = revision.details.every((d) => d.length <= longestDetail) ? revision.details : [];
      out.push({ id: entry.id, url: entry.url, ...(revision.date && revision.commit ? { date: revision.date } : {}), details, change: revision.change });
    }
  }
  return out;
}
