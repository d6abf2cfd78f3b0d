// Where `stepwright build --out` may publish. Publishing puts a link to the new version at the output path and keeps
// the folder that was there as an older version, which a later build removes (cli/publish-site.ts). So the output
// path must be nothing yet, an empty folder, a site a build published there (its manifest says so), or a link (which
// is replaced, what it points to left as it was) — never a folder of the user's own, and never a folder that holds the procedures, the register, the configuration, the
// folder the command runs in or the repository.
import { lstatSync, readdirSync, readlinkSync } from 'node:fs';
import { dirname, relative, resolve } from 'node:path';
import { isInside } from '../engine/project.ts';
import { manifestFile } from './site-manifest.ts';
import { versionsFolder } from './publish-site.ts';

/** A place the build reads or the user keeps, which the output path must neither be nor hold. */
export interface GuardedPlace {
  /** Absolute path. */
  path: string;
  /** What it is, for the message: "the procedures folder", "the repository". */
  what: string;
  /** A folder the output must not be put inside either (the procedures folder, the register). */
  notInside?: boolean;
}

function shown(path: string, cwd: string): string {
  return relative(cwd, path) || '.';
}

/** How the last few names of a folder are listed in a message. */
function someNames(names: string[]): string {
  const sorted = [...names].sort();
  const listed = sorted.slice(0, 3).join(', ');
  return sorted.length > 3 ? `${listed} and ${sorted.length - 3} more` : listed;
}

/**
 * Why the build must not publish at `outDir` (absolute), or undefined when it may: the output path holds or is one of
 * the guarded places, lies inside one that must not hold it, or is a folder, file or link the build did not make.
 */
export function outputPlaceProblem(outDir: string, cwd: string, guarded: GuardedPlace[]): string | undefined {
  const out = shown(outDir, cwd);
  const hint = 'Give the manual a folder of its own with --out (the default is dist).';
  for (const place of guarded) {
    if (isInside(place.path, outDir)) {
      const same = relative(outDir, place.path) === '';
      return `The output folder '${out}' ${same ? 'is' : 'holds'} ${place.what}${same ? '' : ` (${shown(place.path, cwd)})`}: a build replaces its output folder with the new manual and later removes what was there. ${hint}`;
    }
    if (place.notInside && isInside(outDir, place.path)) {
      return `The output folder '${out}' is inside ${place.what} (${shown(place.path, cwd)}): the manual's files would be mixed with it. ${hint}`;
    }
  }
  let kind: 'folder' | 'link' | 'other' | undefined;
  try {
    const s = lstatSync(outDir);
    kind = s.isSymbolicLink() ? 'link' : s.isDirectory() ? 'folder' : 'other';
  } catch {
    return undefined;
  }
  if (kind === 'other') return `The output path '${out}' is a file, not a folder; it was left alone. ${hint}`;
  // A link is replaced by the build's own link, in one step; what it pointed to is left as it was (see foreignLink).
  if (kind === 'link') return undefined;
  let names: string[];
  try {
    names = readdirSync(outDir);
  } catch (error) {
    return `The output folder '${out}' cannot be read (${(error as NodeJS.ErrnoException).code ?? (error as Error).message}). ${hint}`;
  }
  // Empty, or a manual published there (by a build that could not make links, or before builds made them).
  if (names.length === 0 || names.includes(manifestFile)) return undefined;
  return `The output folder '${out}' holds files a build did not write (${someNames(names)}): a build replaces its output folder with the new manual and later removes what was there, so it was left alone. Move those files elsewhere, or ${hint.charAt(0).toLowerCase()}${hint.slice(1)}`;
}

/**
 * Where the output path links to when it is a link a build did not make (a build links it to a version folder of its
 * own, <out>.versions/site-…), else undefined. Publishing replaces that link with the build's own; the build says so.
 */
export function foreignLink(outDir: string): string | undefined {
  let target: string;
  try {
    if (!lstatSync(outDir).isSymbolicLink()) return undefined;
    target = resolve(dirname(outDir), readlinkSync(outDir));
  } catch {
    return undefined;
  }
  const versions = versionsFolder(outDir);
  return isInside(target, versions) && target !== versions ? undefined : target;
}
