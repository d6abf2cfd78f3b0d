// The plant register's history from git: the register as it was at any commit, and, for every commit that
// changed the register folder, which entries it added, removed or changed (key by key). The site's register
// pages show each entry's part of it; `review` compares the register at its base with today's.
import { readYamlSource } from '../parse/read-yaml-source.ts';
import { buildRegister, type PlantRegister } from '../model/register.ts';
import { showFiles, type Git } from './git.ts';
import { registerImpact } from './register-impact.ts';
import { repositoryLog } from './repository-log.ts';
import type { HistoryView } from './history-view.ts';

export interface RegisterAt {
  git: Git;
  /** The register folder relative to the repository root ('' for the root). */
  folder: string;
  /** The folder as people are shown it (relative to the working folder). */
  shownFolder: string;
  /** A repository path as shown in diagnostics and pages. */
  shown: (repoPath: string) => string;
  /** A shallow clone: its oldest commit's parents are missing. */
  shallow?: boolean;
}

/** The register as it was at a commit: every YAML file under the folder, read the same way as today's. */
export async function registerAt(place: RegisterAt, commit: string): Promise<PlantRegister> {
  let listing = '';
  try {
    listing = await place.git(['ls-tree', '-r', '-z', '--name-only', commit, '--', place.folder || '.']);
  } catch {
    // The commit does not hold the folder (or is not there at all): an empty register.
  }
  const names = listing.split('\0').filter((n) => /\.ya?ml$/i.test(n));
  const shown = await showFiles(place.git, names.map((n) => `${commit}:${n}`));
  const sources = names.flatMap((n) => {
    const text = shown.get(`${commit}:${n}`);
    const file = place.shown(n);
    return text === undefined ? [] : [{ file, source: readYamlSource(file, text) }];
  });
  return buildRegister(place.shownFolder, sources);
}

export interface RegisterEntryRevision {
  /** Full commit hash; `undefined` for changes in the working copy that are not committed yet. */
  commit?: string;
  /** YYYY-MM-DD of the commit. */
  date?: string;
  /** The commit's full author date (ISO 8601), to compare with other commits. */
  when?: string;
  author?: string;
  subject: string;
  change: 'added' | 'removed' | 'changed';
  /** Key-level changes, e.g. "trips-when: TI-210 >= 255 degC → TI-210 >= 265 degC". */
  details: string[];
  /** The oldest commit of a shallow clone: its parents are missing, so "added" may only mean "first seen". */
  firstInClone?: boolean;
}

export interface RegisterHistory {
  /** Entry id → its revisions, newest first. */
  byEntry: Map<string, RegisterEntryRevision[]>;
  /** Commits that changed the register folder, newest first. */
  commits: number;
  /** True when the working copy's register differs from the last commit. */
  uncommitted: boolean;
}

/**
 * Every change to every register entry, from the oldest commit that touched the folder to the working copy
 * (`now`, the register the check read). Each commit is compared with the register one commit earlier.
 */
export async function registerHistory(place: RegisterAt, now: PlantRegister | undefined): Promise<RegisterHistory> {
  const log = await repositoryLog(place.git, place.folder);
  const byEntry = new Map<string, RegisterEntryRevision[]>();
  const add = (id: string, revision: RegisterEntryRevision) => byEntry.set(id, [revision, ...(byEntry.get(id) ?? [])]);
  let before: PlantRegister | undefined;
  for (const c of [...log].reverse()) {
    const after = await registerAt(place, c.commit);
    for (const change of registerImpact(before, after, [], () => false)) {
      add(change.id, {
        commit: c.commit, date: c.date.slice(0, 10), when: c.date, author: c.author, subject: c.subject, change: change.change, details: change.details,
        ...(place.shallow && !c.hasParents && before === undefined ? { firstInClone: true } : {}),
      });
    }
    before = after;
  }
  let uncommitted = false;
  if (now) {
    for (const change of registerImpact(before, now, [], () => false)) {
      uncommitted = true;
      add(change.id, { subject: 'Changed in the working copy, not committed yet', change: change.change, details: change.details });
    }
  }
  return { byEntry, commits: log.length, uncommitted };
}

/**
 * Whether a procedure has had a new revision since a register change: its newest committed revision was
 * introduced in the same commit or later; for an uncommitted change, the working copy carries a newer revision.
 */
export function revisedSince(history: Pick<HistoryView, 'revisions' | 'draft'> | undefined, change: Pick<RegisterEntryRevision, 'commit' | 'when'>): boolean {
  if (!history) return false;
  const latest = history.revisions.at(-1);
  if (!change.commit) return Boolean(history.draft && history.draft.revision !== null && (latest === undefined || history.draft.revision > latest.revision));
  if (!latest || !change.when) return false;
  return latest.introduced.commit === change.commit || Date.parse(latest.introduced.date) >= Date.parse(change.when);
}
