// Opens the git repository that holds the procedures (not the working folder's, not the tool's own) for the
// commands that read history: check, review and the site's revisions, audit trail and build date.
import { realpathSync, statSync } from 'node:fs';
import { basename, dirname, join, relative, resolve, sep } from 'node:path';
import type { SourceInput } from '../check/run-checks.ts';
import { GitError, gitIn, gitNow, type Git } from '../history/git.ts';
import { previousVersions, type PreviousVersion } from '../history/previous-version.ts';

export interface Repository {
  /** Runs git in the repository's top folder. */
  git: Git;
  root: string;
  /** The working folder, against which relative file names are read. */
  cwd: string;
  shallow: boolean;
}

/**
 * The repository around `at` (a file or folder; default the working folder). Pass the procedures folder:
 * history belongs to the repository that holds the procedures, wherever the command was started. With `base`, the
 * same git process also resolves that ref to its commit (`commit`, absent when the ref is not in the clone). Waits
 * for git's one short answer in place, so that a caller can start its next git process at once.
 */
export function openRepository(io: { cwd: string; env?: Record<string, string | undefined> }, at?: string, base?: string): (Repository & { commit?: string }) | undefined {
  const start = existingFolder(resolve(io.cwd, at ?? '.'));
  // A ref never starts with '-' (git check-ref-format): such a base is left to resolveCommit to refuse, not read
  // as an option here.
  const ref = base !== undefined && !base.startsWith('-') ? [`--revs-only`, `${base}^{commit}`] : [];
  // git runs with the process environment (PATH, HOME, GIT_*), not the CLI's injected variables.
  let lines: string[];
  try {
    // One git process for all three answers: this runs before every check, and each git process costs the
    // checker tens of milliseconds to start.
    lines = gitNow(start, ['rev-parse', '--show-toplevel', '--is-shallow-repository', ...ref]).split('\n');
  } catch {
    return undefined;
  }
  const [root, shallow = 'false', commit = ''] = lines;
  if (!root) return undefined;
  return {
    git: gitIn(root), root, cwd: io.cwd, shallow: shallow.trim() === 'true',
    ...(/^[0-9a-f]{40,64}$/.test(commit.trim()) ? { commit: commit.trim() } : {}),
  };
}

/** A file name as the CLI shows it (relative to the working folder, or absolute) → a path relative to the repository root. */
export function repoPath(repo: Repository, file: string): string {
  // git names the root by its real path; the working folder may be reached through a symbolic link.
  return relative(repo.root, realPath(resolve(repo.cwd, file))).split(sep).join('/');
}

/** The real path of `path`, or of its nearest existing folder with the rest appended (a deleted file). */
function realPath(path: string): string {
  try {
    // The system's own realpath: one call a file, where Node's walks the path a folder at a time (11 ms for the
    // demo manual's 13 files, cold).
    return realpathSync.native(path);
  } catch {
    const parent = dirname(path);
    return parent === path ? path : join(realPath(parent), basename(path));
  }
}

/** The folder itself, or the nearest existing folder above a file or a missing path (git needs a folder to start in). */
function existingFolder(path: string): string {
  let here = path;
  for (;;) {
    try {
      const real = realpathSync(here);
      // A file: start from its folder.
      return here === path && !isFolder(real) ? dirname(real) : real;
    } catch {
      const parent = dirname(here);
      if (parent === here) return path;
      here = parent;
    }
  }
}

function isFolder(path: string): boolean {
  return statSync(path, { throwIfNoEntry: false })?.isDirectory() === true;
}

/**
 * The `previous` function for checkSources: each file at `base` (default HEAD, i.e. the last committed version).
 * Outside a repository, or before the first commit, there is no history and the history rules stay silent;
 * a base that cannot be found is an error the user must see.
 */
export async function previousFromGit(
  inputs: SourceInput[],
  io: { cwd: string; env?: Record<string, string | undefined> },
  base?: string,
  /** Where the procedures are (default: the first file read): its repository holds their history. */
  at?: string,
): Promise<{ previous?: (file: string) => PreviousVersion | undefined; repo?: Repository }> {
  // Asked in place, so that the previous versions are asked for at once: git reads them while this thread reads the
  // configuration and the register.
  const repo = openRepository(io, at ?? inputs.find((i) => 'text' in i)?.file, base ?? 'HEAD');
  if (!repo) return {};
  const files = inputs.flatMap((i) => ('text' in i ? [{ file: i.file, path: repoPath(repo, resolve(io.cwd, i.file)), text: i.text }] : []));
  let found: Map<string, PreviousVersion>;
  try {
    found = await previousVersions(repo.git, files, base ?? 'HEAD', repo.commit);
  } catch (error) {
    // Before the first commit there is no HEAD and so no history; a missing --base is the user's to fix.
    if (base === undefined && error instanceof GitError && !error.missingGit) return { repo };
    throw error;
  }
  const byFile = new Map(files.flatMap((f) => (found.has(f.path) ? [[f.file, found.get(f.path)!] as const] : [])));
  return { previous: (file) => byFile.get(file), repo };
}
