// Finds procedure files under the given paths and reads them; unreadable ones become inputs with an error.
// Only regular files are read: the type is checked before a file is opened (a FIFO would block, a device
// never end), links that lead back into a folder already read are reported, and every read is capped.
// A path may be a file, a folder (searched for *.md, any case: .MD too), a glob (`procedures/**/pump-*.md`, `{a,b}`, `[u]`)
// or `-` for one procedure on standard input (handled by the engine). A path or glob that finds nothing is
// reported, never dropped.
import { closeSync, fstatSync, lstatSync, openSync, readdirSync, readSync, statSync, constants, type Stats } from 'node:fs';
import { basename, join, relative, resolve } from 'node:path';
import picomatch from 'picomatch';
import { globSync } from 'tinyglobby';
import type { SourceInput } from '../check/run-checks.ts';
import { isMarkdownName } from './markdown-name.ts';

export { isMarkdownName };

/**
 * Folders a folder search does not read, and why: installed packages, built sites and tool state are no procedures.
 * Markdown found in them is named in a note (see FileNotRead), never dropped in silence. Every other folder is
 * read, a dot-folder (`.drafts`) too.
 */
const skipDirs = new Map<string, string>([
  ['node_modules', 'a folder of installed packages'],
  ['dist', 'a folder a built manual is written to'],
  ['.git', "git's own folder"],
  ['.astro', 'a folder of the site builder\'s own files'],
  ['.stepwright', "Stepwright's cache folder"],
]);

/**
 * When a folder inside the procedures folder lies in (or is) a folder the search does not read: that folder, relative
 * to the procedures folder, and why. Both paths absolute.
 */
export function unreadFolderOf(folder: string, procedures: string): { folder: string; why: string } | undefined {
  const parts = relative(procedures, folder).split(/[\\/]/).filter(Boolean);
  const at = parts.findIndex((part) => skipDirs.has(part));
  return at === -1 ? undefined : { folder: parts.slice(0, at + 1).join('/'), why: skipDirs.get(parts[at])! };
}

/** Markdown names that are not read as procedures because only `.md` is: said in a note, with the fix. */
const otherMarkdown = /\.(markdown|mdown|mkdn|mkd|mdx)$/i;

/** Most markdown files named one by one inside one folder that is not read; the rest are counted in one more note. */
export const maxNamedPerFolder = 20;

/** A file under a searched folder that is not read, and why: reported as an info line, never left out silently. */
export interface FileNotRead {
  file: string;
  reason: string;
  hint: string;
}

/** The name a procedure read from standard input goes by in diagnostics. */
export const stdinName = '<stdin>';

/** A glob that ends in `.md` also finds `.MD`, `.Md`: the same as a folder search. */
function anyCaseExtension(pattern: string): string {
  return pattern.replace(/\.md$/i, '.[mM][dD]');
}

/** True when a path is meant as a glob pattern rather than a file or folder name. */
export function isGlob(path: string): boolean {
  return picomatch.scan(path).isGlob;
}

/** Largest procedure file read, in bytes. The biggest real procedure is well under 100 kB. */
export const maxProcedureBytes = 1024 * 1024;
/** Deepest folder nesting followed under a procedures folder. */
export const maxFolderDepth = 32;

export interface FoundFile {
  file: string;
  absolute: string;
  /** Why the path cannot be read; it is reported instead of being read. */
  missing?: string;
  /** Found by searching a folder or a glob (not named on the command line): markdown that is not a procedure may be skipped. */
  discovered?: boolean;
  /** The text, for a procedure read from standard input. */
  text?: string;
}

/**
 * The procedure files under `paths`. Markdown a folder search passes over (in a folder that is not read, a
 * `.markdown` name, an editor's lock file) is added to `notRead` when given, so the caller can say so.
 */
export function findProcedureFiles(paths: string[], cwd: string, notRead?: FileNotRead[]): FoundFile[] {
  const out: FoundFile[] = [];
  const note = (absolute: string, reason: string, hint: string) => notRead?.push({ file: displayPath(absolute, cwd), reason, hint });
  /** Notes every markdown file inside a folder that is not read (not following links), up to maxNamedPerFolder. */
  const noteSkippedFolder = (dir: string, why: string) => {
    if (!notRead) return;
    const files: string[] = [];
    const visit = (here: string, depth: number) => {
      let entries;
      try {
        entries = readdirSync(here, { withFileTypes: true });
      } catch {
        return;
      }
      for (const e of entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0))) {
        const full = join(here, e.name);
        if (e.isDirectory() && depth < maxFolderDepth) visit(full, depth + 1);
        else if (!e.isDirectory() && (isMarkdownName(e.name) || otherMarkdown.test(e.name))) files.push(full);
      }
    };
    visit(dir, 0);
    const folder = displayPath(dir, cwd);
    const hint = `Stepwright does not read ${folder}/ (${why}). Move a procedure out of it into the procedures folder to have it checked and published.`;
    for (const f of files.slice(0, maxNamedPerFolder)) note(f, `it lies in ${folder}/, ${why}, which is not read`, hint);
    const more = files.length - maxNamedPerFolder;
    if (more > 0) notRead.push({ file: folder, reason: `${more} more markdown file${more === 1 ? '' : 's'} in it ${more === 1 ? 'is' : 'are'} not read either (${why})`, hint });
  };
  const seen = new Set<string>();
  /** Real paths (device and inode) of folders and files read so far: a second way to the same one is a link. */
  const visited = new Map<string, string>();
  // Set while a folder or a glob is searched: what is found there may be skipped when it is no procedure.
  let discovered = false;
  const add = (absolute: string, missing?: string) => {
    if (seen.has(absolute)) return;
    seen.add(absolute);
    out.push({ file: displayPath(absolute, cwd), absolute, missing, ...(discovered && !missing ? { discovered: true } : {}) });
  };
  const identity = (s: Stats) => `${s.dev}:${s.ino}`;
  const firstVisit = (s: Stats, absolute: string): string | undefined => {
    const key = identity(s);
    const earlier = visited.get(key);
    if (earlier !== undefined) return earlier;
    visited.set(key, absolute);
    return undefined;
  };
  const walk = (dir: string, depth: number) => {
    let entries: string[];
    try {
      entries = readdirSync(dir).sort();
    } catch (error) {
      add(dir, describeError(error));
      return;
    }
    // Plain entries before links, so that a file or folder is read under its own name and the link is the one reported.
    const kinds = entries.filter((name) => {
      const why = skipDirs.get(name);
      if (why !== undefined) {
        const full = join(dir, name);
        if (statSync(full, { throwIfNoEntry: false })?.isDirectory()) {
          noteSkippedFolder(full, why);
          return false;
        }
      }
      const unread = unreadName(name);
      if (unread) {
        note(join(dir, name), unread.reason, unread.hint);
        return false;
      }
      return true;
    }).map((name) => {
      const full = join(dir, name);
      try {
        return { name, full, link: lstatSync(full).isSymbolicLink() };
      } catch {
        return { name, full, link: true };
      }
    });
    for (const { name, full, link } of [...kinds.filter((k) => !k.link), ...kinds.filter((k) => k.link)]) {
      let target: Stats;
      try {
        target = statSync(full);
      } catch (error) {
        // A dangling link or a link loop (ELOOP): only worth a report when it looks like a procedure.
        if (isMarkdownName(name)) add(full, describeError(error));
        else if ((error as NodeJS.ErrnoException).code === 'ELOOP') add(full, describeError(error));
        continue;
      }
      if (!target.isDirectory() && link && isMarkdownName(name)) {
        // A file reached through a link is taken after every folder has been read, so that a file is read under its
        // own name wherever the link sits, and the link is the one reported.
        linkedFiles.push({ full, target, discovered });
        continue;
      }
      if (target.isDirectory()) {
        const earlier = firstVisit(target, full);
        if (earlier !== undefined) {
          add(full, `it is a link to the folder ${displayPath(earlier, cwd)}, which is already read (a link loop or a second way to the same folder); it was skipped`);
          continue;
        }
        if (depth >= maxFolderDepth) {
          add(full, `folders nest more than ${maxFolderDepth} levels deep here; deeper folders were not read`);
          continue;
        }
        walk(full, depth + 1);
      } else if (isMarkdownName(name)) {
        addFile(full, target);
      }
    }
  };
  const linkedFiles: Array<{ full: string; target: Stats; discovered: boolean }> = [];
  const addFile = (absolute: string, stats: Stats) => {
    const problem = notRegular(stats);
    if (problem) return add(absolute, problem);
    const earlier = firstVisit(stats, absolute);
    if (earlier !== undefined && earlier !== absolute) return add(absolute, `it is a second name (a link) for ${displayPath(earlier, cwd)}, which is already read; it was skipped`);
    add(absolute);
  };
  for (const p of paths) {
    const absolute = resolve(cwd, p);
    let stats: Stats;
    try {
      stats = statSync(absolute);
    } catch (error) {
      const absent = (error as NodeJS.ErrnoException).code === 'ENOENT';
      if (absent && isGlob(p)) {
        const matches = globSync(anyCaseExtension(p.split('\\').join('/')), {
          cwd, absolute: true, onlyFiles: true, dot: true, expandDirectories: false, followSymbolicLinks: false,
          ignore: [...skipDirs.keys()].map((d) => `**/${d}/**`),
        }).filter((f) => isMarkdownName(f) && !unreadName(basename(f))).map((f) => resolve(f)).sort();
        if (!matches.length) add(absolute, `no markdown file matches the pattern ${p}`);
        discovered = true;
        for (const m of matches) {
          try {
            addFile(m, statSync(m));
          } catch (e) {
            add(m, describeError(e));
          }
        }
        discovered = false;
        continue;
      }
      add(absolute, absent ? `no such file or folder: ${p}` : describeError(error));
      continue;
    }
    if (stats.isDirectory()) {
      discovered = true;
      if (firstVisit(stats, absolute) === undefined) walk(absolute, 0);
      discovered = false;
    } else addFile(absolute, stats);
  }
  for (const { full, target, discovered: found } of linkedFiles) {
    discovered = found;
    addFile(full, target);
  }
  discovered = false;
  return out;
}

export function readProcedureFiles(paths: string[], cwd: string, notRead?: FileNotRead[]): SourceInput[] {
  return readFoundFiles(findProcedureFiles(paths, cwd, notRead));
}

/**
 * Why a file with this name in a searched folder is not read, when it is not: a `.markdown` (or `.mkd`, `.mdx`) name,
 * an editor's lock file (`.#name.md`, a link to nowhere while the file is open) or a macOS resource fork (`._name.md`,
 * binary). Other dot-files are read like any file.
 */
function unreadName(name: string): { reason: string; hint: string } | undefined {
  if (isMarkdownName(name) && name.startsWith('.#')) {
    return { reason: "it is an editor's lock file (a name that starts with .#)", hint: 'The editor removes it when the file is saved or closed; the procedure itself is read under its own name.' };
  }
  if (isMarkdownName(name) && name.startsWith('._')) {
    return { reason: 'it is a macOS resource-fork file (a name that starts with ._), not text', hint: 'macOS writes these beside files copied to some drives; delete it. The procedure itself is read under its own name.' };
  }
  const other = otherMarkdown.exec(name);
  if (other) {
    return { reason: `its name ends in .${other[1]}, and only files whose name ends in .md are procedures`, hint: `Rename it to end in .md to have it checked and published (${name.slice(0, -other[0].length)}.md).` };
  }
  return undefined;
}

const utf8 = new TextDecoder('utf-8', { fatal: true });

export function readFoundFiles(found: FoundFile[]): SourceInput[] {
  return found.map(({ file, absolute, missing, text: given }) => {
    if (missing) return { file, error: missing };
    if (given !== undefined) return { file, text: given };
    const read = readRegularFile(absolute, maxProcedureBytes);
    if ('error' in read) return { file, error: read.error };
    try {
      const text = utf8.decode(read.bytes);
      return { file, text };
    } catch {
      return { file, error: 'it is not valid UTF-8 text' };
    }
  });
}

/**
 * Reads a file only if it is a regular file, and at most `limit` bytes of it. The type is checked before
 * opening (opening a FIFO blocks), again on the open descriptor (the path may have been swapped), and the
 * read stops at the limit whatever size the file claims (files under /proc claim 0).
 */
export function readRegularFile(path: string, limit: number): { bytes: Uint8Array } | { error: string } {
  let before: Stats;
  try {
    before = statSync(path);
  } catch (error) {
    return { error: describeError(error) };
  }
  const problem = notRegular(before);
  if (problem) return { error: problem };
  if (before.size > limit) return { error: tooLarge(before.size, limit) };
  let fd: number;
  try {
    fd = openSync(path, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0) | (constants.O_NOCTTY ?? 0));
  } catch (error) {
    return { error: describeError(error) };
  }
  try {
    const opened = fstatSync(fd);
    const again = notRegular(opened);
    if (again) return { error: again };
    // Room for the size the file claims (plus one byte, to see it grow), grown as needed up to the limit: a
    // buffer of the whole limit for every file cost more than reading a thousand procedures.
    let buffer = Buffer.allocUnsafe(Math.min(limit + 1, Math.max(opened.size + 1, 16 * 1024)));
    let length = 0;
    while (length <= limit) {
      if (length === buffer.length) {
        const larger = Buffer.allocUnsafe(Math.min(limit + 1, buffer.length * 2));
        buffer.copy(larger, 0, 0, length);
        buffer = larger;
      }
      const n = readSync(fd, buffer, length, buffer.length - length, null);
      if (n === 0) break;
      length += n;
    }
    if (length > limit) return { error: tooLarge(length, limit) };
    return { bytes: buffer.subarray(0, length) };
  } catch (error) {
    return { error: describeError(error) };
  } finally {
    closeSync(fd);
  }
}

function notRegular(stats: Stats): string | undefined {
  if (stats.isFile()) return undefined;
  if (stats.isDirectory()) return 'it is a folder, not a file';
  if (stats.isFIFO()) return 'it is a named pipe (FIFO), not a regular file; it was not opened';
  if (stats.isCharacterDevice() || stats.isBlockDevice()) return 'it is a device, not a regular file; it was not opened';
  if (stats.isSocket()) return 'it is a socket, not a regular file; it was not opened';
  return 'it is not a regular file; it was not opened';
}

function tooLarge(size: number, limit: number): string {
  return `it holds ${size > limit + 1 ? size : `more than ${limit}`} bytes; the limit for one procedure file is ${limit} bytes (${limit / 1024 / 1024} MB). Split it or shorten the narrative`;
}

function describeError(error: unknown): string {
  const e = error as NodeJS.ErrnoException;
  switch (e?.code) {
    case 'ELOOP': return 'it is a link that leads back to itself (a link loop)';
    case 'ENOENT': return 'it is a link to something that does not exist';
    case 'EACCES':
    case 'EPERM': return 'permission to read it was denied';
    case 'ENAMETOOLONG': return 'its path is too long for the file system';
    default: return e?.message ?? String(error);
  }
}

/**
 * How a file or folder is named in diagnostics and in the manual: relative to the working folder when inside it
 * (with `/`), else absolute. A folder given as `procedures` or as `/plant/procedures` is named the same way.
 */
export function displayPath(absolute: string, cwd: string): string {
  const rel = relative(cwd, absolute);
  return rel && !rel.startsWith('..') ? rel.split('\\').join('/') : absolute;
}
