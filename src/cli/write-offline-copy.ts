// Post-build step (after pagefind): writes the offline copy's file list, the small publication record tablets
// check, and the service worker (a plain copy of its code: no list inside, so it stays byte-identical between
// publications and is not downloaded again).
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { readdir, readFile, writeFile } from 'node:fs/promises';
import { join, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import {
  offlineFileList, publicationOf, updateCost, type BuiltFile, type HashedFile, type OfflineFileList, type OfflinePublication, type ProcedurePlace, type UpdateCost,
} from '../render/offline-manifest.ts';
import { fragmentPages } from './pagefind-fragments.ts';

const workerCodeFile = fileURLToPath(new URL('../site/client/service-worker.js', import.meta.url));

export const fileListName = 'offline-files.json';
export const publicationName = 'offline-manifest.json';

export interface OfflineCopySummary extends OfflinePublication {
  list: OfflineFileList;
  /** What a tablet holding the previous build's whole copy fetches; null when there was no previous build. */
  update: UpdateCost | null;
  /** Path → hex SHA-256 of every file read for the list and left as it was read. */
  hashes: Map<string, string>;
}

export interface OfflineCopyOptions {
  /** The publication time written into the record (the build date: the same sources give the same bytes). */
  now: Date;
  /** Procedure pages by area and kind, from the manual. */
  places?: ProcedurePlace[];
  /**
   * The path the site is served under, when not the root (e.g. "/manual/"): recorded in the publication so
   * `stepwright serve` serves the folder where its links point. (The search index's URLs start at "/" all the
   * same: they are read without it.)
   */
  publishedUnder?: string;
  /** A folder holding the previously published site, to report what an update from it costs. */
  previousSite?: string;
  /**
   * Files of this build already hashed and not changed since (the pages, from the last pass over them), by path in
   * the site: they are not read again. Any other file is read.
   */
  known?: ReadonlyMap<string, HashedFile>;
}

export async function writeOfflineCopy(siteDir: string, options: OfflineCopyOptions): Promise<OfflineCopySummary> {
  // Each file is read once and hashed as it is read (a page hashed by the pass before is not read at all); only the
  // search fragments (small) stay in memory, to be tied to their pages. The hashes are handed on to the site
  // manifest, which would read every file again. Read one after another without waiting on the event loop: some
  // thousand small files, each an open, a read and a close.
  const files: HashedFile[] = [];
  const fragments: BuiltFile[] = [];
  for (const entry of await readdir(siteDir, { recursive: true, withFileTypes: true })) {
    if (!entry.isFile()) continue;
    const full = join(entry.parentPath, entry.name);
    const path = relative(siteDir, full).split(sep).join('/');
    // A search fragment is always read: its bytes tie it to its page.
    const fragment = path.startsWith('pagefind/fragment/');
    const hashed = fragment ? undefined : options.known?.get(path);
    if (hashed) {
      files.push({ path, sha256: hashed.sha256, size: hashed.size });
      continue;
    }
    const bytes = readFileSync(full);
    files.push({ path, sha256: createHash('sha256').update(bytes).digest('hex'), size: bytes.byteLength });
    if (fragment) fragments.push({ path, bytes });
  }
  const list = offlineFileList(files, { builtAt: options.now.toISOString(), places: options.places, fragmentPages: fragmentPages(fragments) });
  const publication = publicationOf(list);
  const previous = options.previousSite ? await readFileList(options.previousSite) : null;
  const written = new Set(['sw.js', fileListName, publicationName]);
  await writeFile(join(siteDir, 'sw.js'), await readFile(workerCodeFile));
  await writeFile(join(siteDir, fileListName), formatFileList(list));
  const under = options.publishedUnder && options.publishedUnder !== '/' ? { base: options.publishedUnder } : {};
  await writeFile(join(siteDir, publicationName), `${JSON.stringify({ ...publication, list: fileListName, ...under })}\n`);
  // The files written just now are not among the hashes handed on.
  const hashes = new Map(files.filter((f) => !written.has(f.path)).map((f) => [f.path, f.sha256]));
  return { ...publication, list, update: previous ? updateCost(previous, list) : null, hashes };
}

/** One file per line: the list stays readable, and two publications compare line by line. */
export function formatFileList(list: OfflineFileList): string {
  const { files, ...head } = list;
  const top = JSON.stringify(head).slice(0, -1);
  return `${top},"files":[\n${files.map((f) => JSON.stringify(f)).join(',\n')}\n]}\n`;
}

/** The file list of a built site, or null when it has none (never built, or built before lists existed). */
export async function readFileList(siteDir: string): Promise<OfflineFileList | null> {
  try {
    const list = JSON.parse(await readFile(join(siteDir, fileListName), 'utf8')) as OfflineFileList;
    return list.format === 1 && Array.isArray(list.files) ? list : null;
  } catch {
    return null;
  }
}
