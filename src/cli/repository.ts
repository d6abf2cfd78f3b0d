// Opens the git repository around the working folder for the commands that read history (check, review).
import { isAbsolute, relative, resolve } from 'node:path';
import type { SourceInput } from '../check/run-checks.ts';
import { GitError, gitIn, type Git } from '../history/git.ts';
import { previousVersions, type PreviousVersion } from '../history/previous-version.ts';
import type { CliIo } from './io.ts';

export interface Repository {
  /** Runs git in the repository's top folder. */
  git: Git;
  root: string;
  /** The working folder relative to the root ('' or 'sub/dir/'). */
  prefix: string;
  shallow: boolean;
}

export async function openRepository(io: Pick<CliIo, 'cwd' | 'env'>): Promise<Repository | undefined> {
  // git runs with the process environment (PATH, HOME, GIT_*), not the CLI's injected variables.
  let lines: string[];
  try {
    // One git process for all three answers: this runs before every check.
    lines = (await gitIn(io.cwd)(['rev-parse', '--show-toplevel', '--show-prefix', '--is-shallow-repository'])).split('\n');
  } catch {
    return undefined;
  }
  const [root, prefix = '', shallow = 'false'] = lines;
  if (!root) return undefined;
  return { git: gitIn(root), root, prefix: prefix.trim(), shallow: shallow.trim() === 'true' };
}

/** A file name as the CLI shows it (relative to the working folder, or absolute) → a path relative to the repository root. */
export function repoPath(repo: Repository, file: string): string {
  if (isAbsolute(file)) return relative(repo.root, file).split('\\').join('/');
  return relative('/', resolve('/', repo.prefix, file)).split('\\').join('/');
}

/**
 * The `previous` function for checkSources: each file at `base` (default HEAD, i.e. the last committed version).
 * Outside a repository, or before the first commit, there is no history and the history rules stay silent;
 * a base that cannot be found is an error the user must see.
 */
export async function previousFromGit(
  inputs: SourceInput[],
  io: Pick<CliIo, 'cwd' | 'env'>,
  base?: string,
): Promise<{ previous?: (file: string) => PreviousVersion | undefined; repo?: Repository }> {
  const repo = await openRepository(io);
  if (!repo) return {};
  const files = inputs.flatMap((i) => ('text' in i ? [{ file: i.file, path: repoPath(repo, resolve(io.cwd, i.file)) }] : []));
  let found: Map<string, PreviousVersion>;
  try {
    found = await previousVersions(repo.git, files, base ?? 'HEAD');
  } catch (error) {
    // Before the first commit there is no HEAD and so no history; a missing --base is the user's to fix.
    if (base === undefined && error instanceof GitError && !error.missingGit) return { repo };
    throw error;
  }
  const byFile = new Map(files.flatMap((f) => (found.has(f.path) ? [[f.file, found.get(f.path)!] as const] : [])));
  return { previous: (file) => byFile.get(file), repo };
}
