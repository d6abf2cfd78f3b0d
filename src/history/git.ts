// Runs the git command line in one working folder; injected so tests can point it at a repository they build.
import { execFile } from 'node:child_process';

/** Runs `git <args>` and resolves with its standard output; rejects with a GitError. */
export type Git = (args: string[]) => Promise<string>;

export class GitError extends Error {
  override name = 'GitError';
  constructor(message: string, readonly args: string[], readonly stderr: string, readonly missingGit = false) {
    super(message);
  }
}

export function gitIn(cwd: string, env?: Record<string, string | undefined>): Git {
  return (args) =>
    new Promise((resolve, reject) => {
      execFile('git', args, { cwd, env: env as NodeJS.ProcessEnv | undefined, maxBuffer: 256 * 1024 * 1024, encoding: 'utf8' }, (error, stdout, stderr) => {
        if (!error) return resolve(stdout);
        const missing = (error as NodeJS.ErrnoException).code === 'ENOENT';
        const detail = String(stderr || error.message).trim().split('\n')[0];
        reject(new GitError(missing ? 'git is not installed or not on the PATH' : `git ${args[0]} failed: ${detail}`, args, String(stderr), missing));
      });
    });
}

/** The repository's top folder, or undefined when the folder is not inside a git work tree. */
export async function repositoryRoot(git: Git): Promise<string | undefined> {
  try {
    return (await git(['rev-parse', '--show-toplevel'])).trim() || undefined;
  } catch {
    return undefined;
  }
}

export async function isShallow(git: Git): Promise<boolean> {
  try {
    return (await git(['rev-parse', '--is-shallow-repository'])).trim() === 'true';
  } catch {
    return false;
  }
}

/** The text of a file at a commit, or undefined when it does not exist there. `path` is relative to the repository root. */
export async function showFile(git: Git, commit: string, path: string): Promise<string | undefined> {
  try {
    return await git(['show', `${commit}:${path}`]);
  } catch {
    return undefined;
  }
}
