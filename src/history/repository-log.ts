// The history of many files from one pass over git: one `git log --name-status` over the folder that holds
// them, then each file's commits are picked out of it, following renames, as `git log --follow` would one by one.
import { fileLog, type CommitInfo, type FileCommit } from './file-log.ts';
import type { Git } from './git.ts';

/** One commit of the log with what it changed inside the logged folder. */
export interface LoggedCommit extends CommitInfo {
  changes: Array<{ change: string; path: string; renamedFrom?: string }>;
}

const recordMark = '\x1e';
const format = `${recordMark}%H%x00%aI%x00%an%x00%ae%x00%P%x00%s%x00`;

/** Every commit that changed something under `folder` ('' for the whole repository), newest first. */
export async function repositoryLog(git: Git, folder: string): Promise<LoggedCommit[]> {
  let out: string;
  try {
    // -l0: no limit on rename detection, so a whole folder moved at once is still followed.
    out = await git(['log', '-M', '-l0', '--name-status', '-z', `--format=${format}`, '--', folder || '.']);
  } catch {
    // No commits yet: no history, which is not an error.
    return [];
  }
  return parseLog(out);
}

/** Parses the output of `git log --name-status -z` with the format above. */
export function parseLog(out: string): LoggedCommit[] {
  const commits: LoggedCommit[] = [];
  for (const record of out.split(recordMark)) {
    if (!record) continue;
    const fields = record.split('\0');
    const [commit, date, author, email, parents, subject] = fields;
    if (!commit || fields.length < 6) continue;
    const changes: LoggedCommit['changes'] = [];
    for (let i = 6; i < fields.length; ) {
      const code = fields[i++].replace(/^\n+/, '');
      if (!/^[A-Z]\d*$/.test(code)) continue;
      const change = code[0];
      if (change === 'R' || change === 'C') {
        const from = fields[i++];
        const to = fields[i++];
        if (to !== undefined) changes.push({ change, path: to, renamedFrom: from });
      } else {
        const path = fields[i++];
        if (path !== undefined) changes.push({ change, path });
      }
    }
    commits.push({ commit, date, author, email, subject: subject ?? '', hasParents: Boolean(parents?.trim()), changes });
  }
  return commits;
}

/**
 * One file's commits, newest first, with its path at each commit, following renames backwards from `path`
 * (its name now). The same list `git log --follow -- path` gives for a file that stayed inside the logged folder.
 */
export function followFile(log: readonly LoggedCommit[], path: string, index = indexLog(log)): FileCommit[] {
  const out: FileCommit[] = [];
  let name = path;
  let after = -1;
  for (;;) {
    const hit = index.get(name)?.find((h) => h.at > after);
    if (!hit) return out;
    const { changes: _changes, ...info } = log[hit.at];
    const { change, renamedFrom } = hit.entry;
    out.push({ ...info, path: name, change, ...(renamedFrom !== undefined ? { renamedFrom } : {}) });
    after = hit.at;
    if (change === 'R' && renamedFrom !== undefined) name = renamedFrom;
  }
}

/** Path → the log's entries for it, newest first, so following many files does not rescan the whole log. */
export function indexLog(log: readonly LoggedCommit[]): Map<string, Array<{ at: number; entry: LoggedCommit['changes'][number] }>> {
  const index = new Map<string, Array<{ at: number; entry: LoggedCommit['changes'][number] }>>();
  log.forEach((commit, at) => {
    for (const entry of commit.changes) {
      const list = index.get(entry.path);
      if (list) list.push({ at, entry });
      else index.set(entry.path, [{ at, entry }]);
    }
  });
  return index;
}

/** The deepest folder holding every one of the paths ('' when they share none). */
export function commonFolder(paths: readonly string[]): string {
  if (!paths.length) return '';
  let parts = paths[0].split('/').slice(0, -1);
  for (const p of paths.slice(1)) {
    const other = p.split('/').slice(0, -1);
    let n = 0;
    while (n < parts.length && n < other.length && parts[n] === other[n]) n++;
    parts = parts.slice(0, n);
  }
  return parts.join('/');
}

/**
 * Each file's commits (newest first) from one log of their common folder. A file whose oldest commit in that
 * log added it may have been moved in from outside the folder; those few are asked about in one more git
 * process and, when they were, read one by one with `git log --follow`, so no earlier revision is lost.
 */
export async function fileLogs(git: Git, paths: readonly string[]): Promise<Map<string, FileCommit[]>> {
  const folder = commonFolder(paths);
  const log = await repositoryLog(git, folder);
  const out = new Map<string, FileCommit[]>();
  const index = indexLog(log);
  for (const path of paths) out.set(path, followFile(log, path, index));
  if (!folder) return out;
  // Commits where a followed file first appeared: was it added there, or moved in from outside the folder?
  const born = new Map<string, string[]>();
  for (const [path, commits] of out) {
    const oldest = commits[commits.length - 1];
    if (oldest?.change === 'A' && oldest.hasParents) born.set(oldest.commit, [...(born.get(oldest.commit) ?? []), path]);
  }
  if (!born.size) return out;
  const movedIn = await renamedIntoFolder(git, [...born.keys()], folder);
  for (const [commit, paths] of born) {
    for (const path of paths) {
      const oldest = out.get(path)!.at(-1)!;
      // When git could not answer, every such file is read on its own rather than risk a shortened history.
      if (!movedIn || movedIn.has(`${commit}\0${oldest.path}`)) out.set(path, await fileLog(git, path));
    }
  }
  return out;
}

/** "commit\0path" for every path under `folder` that the commit renamed or copied from outside it. */
async function renamedIntoFolder(git: Git, commits: string[], folder: string): Promise<Set<string> | undefined> {
  const found = new Set<string>();
  const prefix = `${folder}/`;
  const args = ['diff-tree', '-r', '-M', '-l0', '--name-status', '-z', '--root'];
  let out = '';
  try {
    // One process reads every commit from standard input; a runner without it asks commit by commit.
    if (git.bytes) out = (await git.bytes([...args, '--stdin'], `${commits.join('\n')}\n`)).toString('utf8');
    else for (const commit of commits) out += `${commit}\0${await git([...args, commit])}`;
  } catch {
    return undefined;
  }
  // With several commits, each one's changes follow a line with its id.
  let current = '';
  const fields = out.split('\0');
  for (let i = 0; i < fields.length; ) {
    const token = fields[i++].replace(/^\n+/, '');
    if (/^[0-9a-f]{40,64}$/.test(token)) {
      current = token;
      continue;
    }
    if (!/^[A-Z]\d*$/.test(token)) continue;
    if (token[0] === 'R' || token[0] === 'C') {
      const from = fields[i++];
      const to = fields[i++];
      if (to?.startsWith(prefix) && !from?.startsWith(prefix)) found.add(`${current}\0${to}`);
    } else i++;
  }
  return found;
}
