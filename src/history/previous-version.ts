// Finds the previous committed version of each procedure file, for the history rules of `check` and `review`.
import { GitError, showFiles, type Git } from './git.ts';

export interface PreviousVersion {
  text: string;
  /** Short commit id, or the ref name and commit for a base. */
  commit: string;
}

/**
 * Each file as it was at `base` (a ref or commit), under the name it had there (renames since are followed).
 * `check` uses HEAD, so it judges the uncommitted change; `review` uses the pull request's base.
 * Keys and `files[].path` are paths relative to the repository root.
 */
export async function previousVersions(git: Git, files: Array<{ path: string }>, base: string, resolved?: string): Promise<Map<string, PreviousVersion>> {
  const found = new Map<string, PreviousVersion>();
  // The commit when the caller has resolved the base already; else (or to say why it cannot be found) here.
  const commit = resolved ?? (await resolveCommit(git, base));
  // The files under their names now; only those the base has not got under that name can have been renamed since
  // (a rename's new name is new at the base), so the renames are asked for only then: each git process costs the
  // checker tens of milliseconds to start.
  const underNewNames = await showFiles(git, files.map(({ path }) => `${commit}:${path}`));
  const missing = files.filter(({ path }) => underNewNames.get(`${commit}:${path}`) === undefined);
  const oldPaths = missing.length ? await pathsAtBase(git, commit) : new Map<string, string>();
  const renamed = new Set(missing.filter(({ path }) => oldPaths.has(path)).map(({ path }) => path));
  const specOf = (path: string) => `${commit}:${oldPaths.get(path) ?? path}`;
  const underOldNames = renamed.size ? await showFiles(git, [...renamed].map(specOf)) : new Map<string, string | undefined>();
  for (const { path } of files) {
    const text = renamed.has(path) ? underOldNames.get(specOf(path)) : underNewNames.get(`${commit}:${path}`);
    if (text !== undefined) found.set(path, { text, commit: describeBase(base, commit) });
  }
  return found;
}

/** "main (1a2b3c4)", or just the short id when the base was given as a commit id. */
export function describeBase(base: string, commit: string): string {
  return commit.startsWith(base.toLowerCase()) ? commit.slice(0, 7) : `${base} (${commit.slice(0, 7)})`;
}

/** Resolves a ref to a commit id, with a message that says what to do when a shallow clone lacks it. */
export async function resolveCommit(git: Git, ref: string): Promise<string> {
  try {
    return (await git(['rev-parse', '--verify', '--quiet', `${ref}^{commit}`])).trim();
  } catch (error) {
    if ((error as GitError).missingGit) throw error;
    throw new GitError(
      `The base '${ref}' is not in this clone. Fetch it first (e.g. 'git fetch origin ${ref.replace(/^origin\//, '')}'), ` +
        "or clone with full history (GitHub Actions: actions/checkout with 'fetch-depth: 0').",
      ['rev-parse', ref], '',
    );
  }
}

/** Maps each path renamed since `commit` (working tree included) to its name at `commit`. */
export async function pathsAtBase(git: Git, commit: string): Promise<Map<string, string>> {
  const out = await git(['diff', '--name-status', '-M', '-z', commit, '--']);
  const map = new Map<string, string>();
  for (const entry of changedPaths(out)) if (entry.oldPath) map.set(entry.path, entry.oldPath);
  return map;
}

export interface ChangedPath {
  status: 'A' | 'M' | 'D' | 'R' | 'C' | 'T' | 'U' | 'X';
  path: string;
  oldPath?: string;
}

/** Parses `git diff --name-status -z` output. */
export function changedPaths(out: string): ChangedPath[] {
  const parts = out.split('\0');
  const entries: ChangedPath[] = [];
  for (let i = 0; i < parts.length; ) {
    const code = parts[i++];
    if (!code) continue;
    const status = code[0] as ChangedPath['status'];
    if (status === 'R' || status === 'C') {
      const oldPath = parts[i++];
      const path = parts[i++];
      entries.push({ status, path, oldPath });
    } else entries.push({ status, path: parts[i++] });
  }
  return entries;
}
