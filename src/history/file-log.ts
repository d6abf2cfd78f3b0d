// The commits that touched one file, newest first, following renames, with the file's path at each commit.
import type { Git } from './git.ts';

export interface CommitInfo {
  commit: string;
  /** Author date, ISO 8601 with offset. */
  date: string;
  author: string;
  email: string;
  subject: string;
  /** False for the oldest commit of a shallow clone: its real parents are not in this clone. */
  hasParents: boolean;
}

export interface FileCommit extends CommitInfo {
  /** The file's path at this commit, relative to the repository root. */
  path: string;
  /** 'A' added, 'M' modified, 'R' renamed (maybe edited too), 'D' deleted, ... */
  change: string;
  /** The path before a rename. */
  renamedFrom?: string;
}

const recordMark = '\x1e';
const format = `${recordMark}%H%x00%aI%x00%an%x00%ae%x00%P%x00%s`;

/** `path` is relative to the repository root; `git` must run in the root. */
export async function fileLog(git: Git, path: string, options: { since?: string } = {}): Promise<FileCommit[]> {
  let out: string;
  try {
    const range = options.since ? [`${options.since}..HEAD`] : [];
    out = await git(['log', '--follow', '-M', '--name-status', `--format=${format}`, ...range, '--', path]);
  } catch {
    // No commits yet, or the path was never committed: no history, which is not an error.
    return [];
  }
  const commits: FileCommit[] = [];
  for (const record of out.split(recordMark)) {
    if (!record.trim()) continue;
    const [header, ...rest] = record.split('\n');
    const [commit, date, author, email, parents, subject] = header.split('\0');
    const status = rest.map((l) => l.trim()).find((l) => /^[A-Z]\d*\t/.test(l));
    if (!commit || !status) continue;
    const fields = status.split('\t');
    const change = fields[0][0];
    const current = fields[fields.length - 1];
    commits.push({
      commit, date, author, email, subject: subject ?? '', hasParents: Boolean(parents?.trim()),
      path: current, change, ...(change === 'R' || change === 'C' ? { renamedFrom: fields[1] } : {}),
    });
  }
  return commits;
}
