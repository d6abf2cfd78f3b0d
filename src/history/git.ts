// Runs the git command line in one working folder; injected so tests can point it at a repository they build.
import { execFile, execFileSync } from 'node:child_process';

/** Runs `git <args>` and resolves with its standard output; rejects with a GitError. */
export interface Git {
  (args: string[]): Promise<string>;
  /** Runs git with text on standard input and resolves with the raw output bytes (for `cat-file --batch`). */
  bytes?(args: string[], input: string): Promise<Buffer>;
}

export class GitError extends Error {
  override name = 'GitError';
  readonly args: string[];
  readonly stderr: string;
  readonly missingGit: boolean;
  constructor(message: string, args: string[], stderr: string, missingGit = false) {
    super(message);
    this.args = args;
    this.stderr = stderr;
    this.missingGit = missingGit;
  }
}

function gitFailure(args: string[], error: Error, stderr: unknown): GitError {
  const missing = (error as NodeJS.ErrnoException).code === 'ENOENT';
  const detail = String(stderr || error.message).trim().split('\n')[0];
  return new GitError(missing ? 'git is not installed or not on the PATH' : `git ${args[0]} failed: ${detail}`, args, String(stderr), missing);
}

/**
 * Runs `git <args>` in `cwd` and waits for it, returning its standard output; throws a GitError. For the one short
 * question a run asks before anything else, so that what follows can be started without waiting for a turn of the
 * event loop (which the checker's own work would hold up).
 */
export function gitNow(cwd: string, args: string[]): string {
  try {
    return execFileSync('git', args, { cwd, encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 64 * 1024 * 1024 });
  } catch (error) {
    throw gitFailure(args, error as Error, (error as { stderr?: unknown }).stderr);
  }
}

export function gitIn(cwd: string, env?: Record<string, string | undefined>): Git {
  const options = { cwd, env: env as NodeJS.ProcessEnv | undefined, maxBuffer: 1024 * 1024 * 1024 };
  const run: Git = (args) =>
    new Promise((resolve, reject) => {
      execFile('git', args, { ...options, encoding: 'utf8' }, (error, stdout, stderr) => (error ? reject(gitFailure(args, error, stderr)) : resolve(stdout)));
    });
  run.bytes = (args, input) =>
    new Promise((resolve, reject) => {
      const child = execFile('git', args, { ...options, encoding: 'buffer' }, (error, stdout, stderr) => (error ? reject(gitFailure(args, error, stderr)) : resolve(stdout)));
      // git may exit before it has read all of its input (e.g. outside a repository): the write then fails
      // with EPIPE, which must become the command's failure, not an unhandled error that ends the process.
      child.stdin?.on('error', () => {});
      child.stdin?.end(input);
    });
  return run;
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

/**
 * Many files at once (`spec` is "commit:path"), with one git process instead of one per file; a missing file maps
 * to undefined. Falls back to one `git show` per file when the runner cannot pass standard input.
 */
export async function showFiles(git: Git, specs: string[]): Promise<Map<string, string | undefined>> {
  const out = new Map<string, string | undefined>();
  if (!specs.length) return out;
  if (!git.bytes || specs.some((s) => s.includes('\n'))) {
    await Promise.all(specs.map(async (s) => out.set(s, await showSpec(git, s))));
    return out;
  }
  const bytes = await git.bytes(['cat-file', '--batch'], `${specs.join('\n')}\n`);
  let at = 0;
  for (const spec of specs) {
    const eol = bytes.indexOf(10, at);
    const header = bytes.subarray(at, eol).toString('utf8');
    at = eol + 1;
    const m = / (\w+) (\d+)$/.exec(header);
    if (!m || m[1] !== 'blob') {
      out.set(spec, undefined);
      continue;
    }
    const size = Number(m[2]);
    out.set(spec, bytes.subarray(at, at + size).toString('utf8'));
    at += size + 1;
  }
  return out;
}

async function showSpec(git: Git, spec: string): Promise<string | undefined> {
  try {
    return await git(['show', spec]);
  } catch {
    return undefined;
  }
}
