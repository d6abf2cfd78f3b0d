// Every committed revision of one procedure file (the commits where `revision` changed), plus uncommitted work as the next draft.
import { readProcedure } from '../read/read-procedure.ts';
import type { Approval, Procedure } from '../model/procedure.ts';
import type { FileCommit } from './file-log.ts';
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
  /** The file's text at each of `commits`, for audits that compare commit by commit. */
  commitTexts: string[];
  path: string;
  text: string;
  procedure: Procedure | null;
  /** False when a shallow clone may hide older commits of this revision. */
  complete: boolean;
}

export interface Draft {
  revision: number | null;
  status: string;
  text: string;
  procedure: Procedure | null;
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
  /** Reads a committed text into the model; lets a caller reuse what it has already read (same text, same result). */
  read?: (path: string, text: string) => Procedure | null;
}

/**
 * The histories of many files from a fixed number of git processes, however many files and commits there are:
 * one log of their common folder, one `cat-file --batch` for every text, and one shallow-clone question.
 */
export async function readHistories(git: Git, files: ReadonlyArray<{ path: string; workingText?: string }>, options: HistoryOptions = {}): Promise<Map<string, ProcedureHistory>> {
  const read = options.read ?? ((path: string, text: string) => readProcedure(path, text).procedure);
  const [logs, shallow] = await Promise.all([fileLogs(git, files.map((f) => f.path)), isShallow(git)]);
  const oldestFirstOf = new Map(files.map(({ path }) => [path, logs.get(path)!.filter((c) => c.change !== 'D').reverse()]));
  const shown = await showFiles(git, [...new Set([...oldestFirstOf.values()].flatMap((commits) => commits.map((c) => `${c.commit}:${c.path}`)))]);
  const out = new Map<string, ProcedureHistory>();
  for (const { path, workingText } of files) {
    const oldestFirst = oldestFirstOf.get(path)!;
    const revisions: Revision[] = [];
    for (const commit of oldestFirst) {
      const text = shown.get(`${commit.commit}:${commit.path}`);
      if (text === undefined) continue;
      const procedure = read(commit.path, text);
      const revision = revisionOf(procedure);
      const version: VersionCommit = { ...commit, revision, status: procedure?.status ?? '' };
      const last = revisions[revisions.length - 1];
      if (last && last.revision === revision) {
        last.commits.push(version);
        last.commitTexts.push(text);
        Object.assign(last, describe(procedure), { latest: version, path: commit.path, text, procedure });
      } else {
        revisions.push({ revision, ...describe(procedure), introduced: version, latest: version, commits: [version], commitTexts: [text], path: commit.path, text, procedure, complete: true });
      }
    }

    const cut = shallow && oldestFirst.length > 0 && !oldestFirst[0].hasParents;
    if (cut && revisions[0]) revisions[0].complete = false;
    const history: ProcedureHistory = { path, revisions, shallow };
    if (cut) history.notice = shallowNotice(oldestFirst[0], revisions[0]?.revision ?? null);

    const latest = revisions[revisions.length - 1];
    if (workingText !== undefined && workingText !== latest?.text) {
      const procedure = read(path, workingText);
      history.draft = { revision: revisionOf(procedure), status: procedure?.status ?? '', text: workingText, procedure };
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

function revisionOf(procedure: Procedure | null): number | null {
  return procedure && Number.isFinite(procedure.revision) ? procedure.revision : null;
}

function describe(procedure: Procedure | null): Pick<Revision, 'status' | 'effective' | 'change' | 'approvals'> {
  return { status: procedure?.status ?? '', effective: procedure?.effective, change: procedure?.change, approvals: procedure?.approvals ?? [] };
}
