// Finds the previous committed version of each procedure file, for the history rules of `check` and `review`.
import { GitError, showFiles, type Git } from './git.ts';
import { shellWord } from '../model/shell-word.ts';

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
export async function previousVersions(git: Git, files: Array<{ path: string; text?: string }>, base: string, resolved?: string): Promise<Map<string, PreviousVersion>> {
  const found = new Map<string, PreviousVersion>();
  // The commit when the caller has resolved the base already; else (or to say why it cannot be found) here.
  const commit = resolved ?? (await resolveCommit(git, base));
  // The files under their names now; only those the base has not got under that name can have been renamed since
  // (a rename's new name is new at the base), so the renames are asked for only then: each git process costs the
  // checker tens of milliseconds to start.
  const underNewNames = await showFiles(git, files.map(({ path }) => `${commit}:${path}`));
  const missing = files.filter(({ path }) => underNewNames.get(`${commit}:${path}`) === undefined);
  const changes = missing.length ? await changesSince(git, commit) : [];
  const oldPaths = renamesIn(changes);
  // A file git does not take for a rename (not yet added, or changed too much to look like the old file) that holds
  // the procedure of a file deleted since the base is that procedure moved: found by its id, which the manual holds
  // once. Without this an effective procedure moved to another folder and edited would have no previous version, and
  // its edit would pass as a new procedure.
  for (const [path, oldPath] of await movedById(git, commit, missing.filter(({ path }) => !oldPaths.has(path)), changes)) oldPaths.set(path, oldPath);
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
      `The base '${ref}' is not in this clone. Fetch it first (e.g. 'git fetch origin ${shellWord(ref.replace(/^origin\//, ''))}'), ` +
        "or clone with full history (GitHub Actions: actions/checkout with 'fetch-depth: 0').",
      ['rev-parse', ref], '',
    );
  }
}

/** Maps each path renamed since `commit` (working tree included) to its name at `commit`. */
export async function pathsAtBase(git: Git, commit: string): Promise<Map<string, string>> {
  return renamesIn(await changesSince(git, commit));
}

/** What changed since `commit` in the working tree (files git tracks), renames found as git finds them. */
async function changesSince(git: Git, commit: string): Promise<ChangedPath[]> {
  return changedPaths(await git(['diff', '--name-status', '-M', '-z', commit, '--']));
}

function renamesIn(changes: ChangedPath[]): Map<string, string> {
  const map = new Map<string, string>();
  for (const entry of changes) if (entry.oldPath) map.set(entry.path, entry.oldPath);
  return map;
}

/** The value of a top-level key of a procedure's front-matter, read from its text without parsing it. */
export function frontMatterScalar(text: string, key: string): string | undefined {
  const head = /^\uFEFF?---[ \t]*\r?\n([\s\S]*?)\r?\n---[ \t]*(?:\r?\n|$)/.exec(text)?.[1];
  const m = head && scalarLine(key).exec(head);
  const value = m ? (m[1] ?? m[2] ?? m[3]).trim() : undefined;
  return value || undefined;
}

const scalarLines = new Map<string, RegExp>();
/** `key: value`, `key: "value"` or `key: 'value'` on a line of its own, an end-of-line comment allowed. */
function scalarLine(key: string): RegExp {
  let found = scalarLines.get(key);
  if (!found) {
    found = new RegExp(`^${key}:[ \\t]*(?:"([^"\\r\\n]+)"|'([^'\\r\\n]+)'|([^\\s#][^\\r\\n#]*?))[ \\t]*(?:#.*)?$`, 'm');
    scalarLines.set(key, found);
  }
  return found;
}

/** The `id` a procedure's front-matter gives, read from its text without parsing it (undefined when none). */
export function procedureIdIn(text: string): string | undefined {
  return frontMatterScalar(text, 'id');
}

/**
 * Files (by their path now) whose procedure id is that of exactly one file deleted since `commit`, with the deleted
 * file's path at `commit`.
 */
async function movedById(git: Git, commit: string, files: Array<{ path: string; text?: string }>, changes: ChangedPath[]): Promise<Map<string, string>> {
  const moved = new Map<string, string>();
  const wanted = new Map<string, string[]>();
  for (const { path, text } of files) {
    const id = text === undefined ? undefined : procedureIdIn(text);
    if (id) wanted.set(id, [...(wanted.get(id) ?? []), path]);
  }
  const deleted = changes.filter((c) => c.status === 'D' && /\.md$/i.test(c.path)).map((c) => c.path);
  if (!wanted.size || !deleted.length) return moved;
  const texts = await showFiles(git, deleted.map((path) => `${commit}:${path}`));
  const byId = new Map<string, string[]>();
  for (const path of deleted) {
    const id = procedureIdIn(texts.get(`${commit}:${path}`) ?? '');
    if (id && wanted.has(id)) byId.set(id, [...(byId.get(id) ?? []), path]);
  }
  for (const [id, paths] of wanted) {
    const from = byId.get(id);
    // Only where it is plain which file became which.
    if (paths.length === 1 && from?.length === 1) moved.set(paths[0], from[0]);
  }
  return moved;
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
