// Every committed revision of one procedure file (the commits where `revision` changed), plus uncommitted work as the next draft.
import type { Approval } from '../model/procedure.ts';
import type { FileCommit } from './file-log.ts';
import { readVersionRecord, type VersionRecord } from './version-record.ts';
import { fileLogs } from './repository-log.ts';
import { isShallow, showFiles, type Git } from './git.ts';

/** One commit of the file with the revision and status it recorded. */
export interface VersionCommit extends FileCommit {
  revision: number | null;
  status: string;
}

export interface Revision {
  /** The `revision` number, or null when the file did not state a readable one. */
  revision: number | null;
  status: string;
  effective?: string;
  change?: string;
  approvals: Approval[];
  /** The commit that first recorded this revision number. */
  introduced: VersionCommit;
  /** The last commit with this revision number: its text is the revision's content. */
  latest: VersionCommit;
  /** Every commit of this revision, oldest first: status changes and any edits made in place. */
  commits: VersionCommit[];
  /** What each of `commits` recorded, for audits that compare commit by commit. */
  commitRecords: Array<VersionRecord | null>;
  path: string;
  /** The text of the revision's last commit: what its pages are drawn from. */
  text: string;
  /** What its last commit recorded. */
  record: VersionRecord | null;
  /** False when a shallow clone may hide older commits of this revision. */
  complete: boolean;
}

export interface Draft {
  revision: number | null;
  status: string;
  text: string;
  record: VersionRecord | null;
}

export interface ProcedureHistory {
  path: string;
  /** Oldest first. */
  revisions: Revision[];
  /** Uncommitted work on the file, when the working copy differs from the last commit. */
  draft?: Draft;
  shallow: boolean;
  /** Says what is missing from a shallow clone, in words a CI log reader can act on. */
  notice?: string;
}

/**
 * `path` is relative to the repository root and `git` runs in the root. `workingText` is the file as it is on
 * disk now (undefined when deleted or not read).
 */
export async function readHistory(git: Git, path: string, workingText?: string): Promise<ProcedureHistory> {
  return (await readHistories(git, [{ path, workingText }])).get(path)!;
}

export interface HistoryOptions {
  /** Reads a committed text's record; lets a caller reuse what it has already read (same text, same result). */
  read?: (path: string, text: string) => VersionRecord | null;
  /**
   * Reads the records of one file's committed versions (oldest first; `path`: the file's name now), each as `read`
   * would: lets a caller keep them between runs.
   */
  readVersions?: (path: string, versions: ReadonlyArray<{ path: string; text: string }>) => Array<VersionRecord | null>;
}

/**
 * The histories of many files from a fixed number of git processes, however many files and commits there are:
 * one log of their common folder, one `cat-file --batch` for every text, and one shallow-clone question.
 */
export async function readHistories(git: Git, files: ReadonlyArray<{ path: string; workingText?: string }>, options: HistoryOptions = {}): Promise<Map<string, ProcedureHistory>> {
  const read = options.read ?? readVersionRecord;
  const [logs, shallow] = await Promise.all([fileLogs(git, files.map((f) => f.path)), isShallow(git)]);
  const oldestFirstOf = new Map(files.map(({ path }) => [path, logs.get(path)!.filter((c) => c.change !== 'D').reverse()]));
  // Asked for newest first, as the log runs: git then reads neighbouring versions one after another (a quarter quicker
  // than file by file on a repository of 11,858 commits).
  const commits = [...oldestFirstOf.values()].flat().sort((a, b) => (a.date < b.date ? 1 : a.date > b.date ? -1 : 0));
  const shown = await showFiles(git, [...new Set(commits.map((c) => `${c.commit}:${c.path}`))]);
  const out = new Map<string, ProcedureHistory>();
  for (const { path, workingText } of files) {
    const oldestFirst = oldestFirstOf.get(path)!.flatMap((commit) => {
      const text = shown.get(`${commit.commit}:${commit.path}`);
      return text === undefined ? [] : [{ commit, text }];
    });
    const versions = oldestFirst.map(({ commit, text }) => ({ path: commit.path, text }));
    const records = options.readVersions ? options.readVersions(path, versions) : versions.map((v) => read(v.path, v.text));
    const revisions: Revision[] = [];
    for (const [at, { commit, text }] of oldestFirst.entries()) {
      const record = records[at];
      const revision = record?.revision ?? null;
      const version: VersionCommit = { ...commit, revision, status: record?.status ?? '' };
      const last = revisions[revisions.length - 1];
      if (last && last.revision === revision) {
        last.commits.push(version);
        last.commitRecords.push(record);
        Object.assign(last, describe(record), { latest: version, path: commit.path, text, record });
      } else {
        revisions.push({ revision, ...describe(record), introduced: version, latest: version, commits: [version], commitRecords: [record], path: commit.path, text, record, complete: true });
      }
    }

    const logged = oldestFirstOf.get(path)!;
    const cut = shallow && logged.length > 0 && !logged[0].hasParents;
    if (cut && revisions[0]) revisions[0].complete = false;
    const history: ProcedureHistory = { path, revisions, shallow };
    if (cut) history.notice = shallowNotice(logged[0], revisions[0]?.revision ?? null);

    const latest = revisions[revisions.length - 1];
    if (workingText !== undefined && workingText !== latest?.text) {
      const record = read(path, workingText);
      history.draft = { revision: record?.revision ?? null, status: record?.status ?? '', text: workingText, record };
    }
    out.set(path, history);
  }
  return out;
}

export function shallowNotice(boundary: FileCommit, revision: number | null): string {
  const day = boundary.date.slice(0, 10);
  const which = revision === null ? 'earlier revisions' : `revision ${revision} may have started earlier, and older revisions`;
  return `This is a shallow clone: history stops at commit ${boundary.commit.slice(0, 7)} (${day}), so ${which} are missing. ` +
    "Fetch the full history with 'git fetch --unshallow' (in GitHub Actions: actions/checkout with 'fetch-depth: 0').";
}

function describe(record: VersionRecord | null): Pick<Revision, 'status' | 'effective' | 'change' | 'approvals'> {
  return { status: record?.status ?? '', effective: record?.effective, change: record?.change, approvals: record?.approvals ?? [] };
}
