// A rebuild draws again only the pages whose inputs changed; the others are taken from the last output. The pages
// come in folders (a procedure's folder with its next/, audit/ and rev/ pages; one tag's page; one later part of a
// tag's list, a folder inside the tag's; one rule's page), and what each folder's pages were made from is kept as one
// key per folder (site-data/page-keys.ts) in a record in the cache folder, with the size, time and SHA-256 of every
// file under the folder but not under a folder inside it that has a key of its own, as published.
//
// A page is taken over only when its key is unchanged and its file in the output is the one the record describes:
// the same file (inode), size, modification time and change time (the kernel sets the change time on every write and
// no one can set it back), checked when the build plans and again just before it links the file into the new site.
// From there on the new name is watched the same way: the build's final pass reads the pages the search index is
// sent and compares their SHA-256 with the record, and checks that every other one is still the file it linked
// (linking sets the change time, so its own stat after linking is the reference). Should either differ, the build
// stops and forgets the record, so the next build draws every page. The built assets (`_astro/…`, named by their
// content) the old pages link to are carried over when the new build did not make them. A record that cannot be read or was written for something
// else is ignored; the folder may be deleted at any time (STEPWRIGHT_CACHE=off: no reuse).
import { createHash } from 'node:crypto';
import { copyFileSync, existsSync, linkSync, mkdirSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { packageRoot, stepwrightStamp } from '../check/code-stamp.ts';
import { readSummedJson, writeSummedJson } from '../check/summed-json.ts';
import { marksSearchablePart, type FinishedPage, type RecordedPage } from './index-site.ts';

const recordFormat = 'stepwright-page-record-4';

export interface RecordedFile {
  /** Path in the site, with '/' (e.g. "procedures/r-101/index.html"). */
  path: string;
  size: number;
  mtimeMs: number;
  /** Change time and inode: a file written in place, or replaced, no longer matches. */
  ctimeMs: number;
  ino: number;
  sha256: string;
  /** The page carries the mark of a searchable part: the final pass reads it for the search index. */
  marked: boolean;
}

export interface PageRecord {
  format: typeof recordFormat;
  /** The output path the record describes. */
  site: string;
  /** The built assets (`_astro/…`) the recorded pages may link to. */
  assets: string[];
  /** Page folder in the site (e.g. "procedures/r-101", "tags/k-210") → its pages' key and files. */
  folders: Record<string, { key: string; files: RecordedFile[] }>;
}

export interface ReusePlan {
  /** Page folder → the files to take from the last output. */
  reused: Map<string, RecordedFile[]>;
  /** The record's assets: the reused pages may link to any of them. */
  assets: string[];
  /** Page folders that had a record entry but changed (or whose old files were not as recorded). */
  redrawn: number;
  /** True when a record of the last build was found and could be read. */
  hadRecord: boolean;
}

/** A file as it was right after it was linked into the new site. */
export interface TakenFile {
  size: number;
  mtimeMs: number;
  ctimeMs: number;
  ino: number;
}

/** Where the record for one output path lives in the cache folder. */
export function pageRecordPath(cacheFolder: string, outDir: string): string {
  return join(cacheFolder, 'pages', `${createHash('sha256').update(outDir).digest('hex').slice(0, 24)}.json`);
}

/** The record, or undefined when there is none or it cannot be trusted. */
export function readPageRecord(file: string, outDir: string): PageRecord | undefined {
  const record = readSummedJson(file) as PageRecord | undefined;
  if (!record || typeof record !== 'object' || record.format !== recordFormat || record.site !== outDir || !Array.isArray(record.assets) || typeof record.folders !== 'object' || !record.folders) return undefined;
  return record;
}

/** Which page folders can be taken from the output as it is now: same key, files as recorded. */
export function planReuse(record: PageRecord | undefined, keys: Map<string, string>, outDir: string): ReusePlan {
  const reused = new Map<string, RecordedFile[]>();
  let redrawn = 0;
  if (!record) return { reused, assets: [], redrawn, hadRecord: false };
  // Without every asset the old pages may link to, no old page is whole.
  if (!record.assets.every((asset) => typeof asset === 'string' && /^_astro\/[^]+$/.test(asset) && !asset.split('/').includes('..') && existsSync(join(outDir, ...asset.split('/'))))) {
    return { reused, assets: [], redrawn: Object.keys(record.folders).length, hadRecord: true };
  }
  for (const [folder, key] of keys) {
    const entry = Object.hasOwn(record.folders, folder) ? record.folders[folder] : undefined;
    if (!entry) continue;
    if (entry.key !== key || !isPageFolder(folder) || !Array.isArray(entry.files) || entry.files.length === 0 || !entry.files.every((f) => unchangedOnDisk(outDir, folder, f))) {
      redrawn++;
      continue;
    }
    reused.set(folder, entry.files);
  }
  return { reused, assets: record.assets, redrawn, hadRecord: true };
}

/** Whether `path`, a file under page folder `name`, lies in a folder between the two that has a key of its own. */
function inFolderOfItsOwn(path: string, name: string, keys: ReadonlyMap<string, string>): boolean {
  for (let end = path.lastIndexOf('/'); end > name.length; end = path.lastIndexOf('/', end - 1)) {
    if (keys.has(path.slice(0, end))) return true;
  }
  return false;
}

/** A folder inside the site, named with '/': no empty, "." or ".." part. */
function isPageFolder(folder: string): boolean {
  return folder.split('/').every((part) => part !== '' && part !== '.' && part !== '..' && !part.includes('\\'));
}

function unchangedOnDisk(outDir: string, folder: string, file: RecordedFile): boolean {
  if (typeof file.path !== 'string' || !file.path.startsWith(`${folder}/`) || file.path.split('/').includes('..')) return false;
  const stat = statSync(join(outDir, ...file.path.split('/')), { throwIfNoEntry: false });
  return stat !== undefined && stat.isFile() && sameFile(stat, file) && typeof file.sha256 === 'string' && typeof file.marked === 'boolean';
}

function sameFile(stat: TakenFile, expected: TakenFile): boolean {
  return stat.size === expected.size && stat.mtimeMs === expected.mtimeMs && stat.ctimeMs === expected.ctimeMs && stat.ino === expected.ino;
}

function takenFile(path: string): TakenFile | undefined {
  const stat = statSync(path, { throwIfNoEntry: false });
  return stat?.isFile() ? { size: stat.size, mtimeMs: stat.mtimeMs, ctimeMs: stat.ctimeMs, ino: stat.ino } : undefined;
}

/**
 * Copies the reused folders' files from the last output into the new site, and the assets they may link to
 * that the new build did not make. Each file is checked against the record once more just before it is taken (it
 * may have changed since the plan). Returns every taken file as it was right after it was taken.
 */
export function copyReusedPages(plan: ReusePlan, outDir: string, site: string): Map<string, TakenFile> {
  const taken = new Map<string, TakenFile>();
  if (plan.reused.size === 0) return taken;
  for (const asset of plan.assets) {
    const to = join(site, ...asset.split('/'));
    if (existsSync(to)) continue;
    mkdirSync(dirname(to), { recursive: true });
    copyFileSync(join(outDir, ...asset.split('/')), to);
  }
  for (const files of plan.reused.values()) {
    for (const file of files) {
      const to = join(site, ...file.path.split('/'));
      // A page the new build drew for the same path would mean the plan and the pages disagree: never overwrite it.
      if (existsSync(to)) throw new Error(`${file.path} was drawn although its folder's pages were to be reused`);
      mkdirSync(dirname(to), { recursive: true });
      const from = join(outDir, ...file.path.split('/'));
      const before = takenFile(from);
      if (!before || !sameFile(before, file)) throw new ReusedPageChanged([file.path]);
      takeOver(from, to);
      const after = takenFile(to);
      if (!after) throw new ReusedPageChanged([file.path]);
      taken.set(file.path, after);
    }
  }
  return taken;
}

/** Pages of the last build changed while this build ran: the build stops, and its record is forgotten. */
export class ReusedPageChanged extends Error {
  readonly paths: string[];
  constructor(paths: string[]) {
    super(`pages of the last build are not as recorded (${paths.slice(0, 3).join(', ')}${paths.length > 3 ? ', …' : ''}); their record is forgotten, and the next build draws every page`);
    this.paths = paths;
  }
}

/**
 * A second name for a published file (nothing writes to a published page; a build writes new files), else a copy
 * (another file system, or one without links).
 */
function takeOver(from: string, to: string): void {
  try {
    linkSync(from, to);
  } catch {
    copyFileSync(from, to);
  }
}

/** The reused pages as the final pass takes them: recorded hash, size and search mark, by path in the site. */
export function recordedPages(plan: ReusePlan): Map<string, RecordedPage> {
  return new Map([...plan.reused.values()].flatMap((files) => files.map((f) => [f.path, { sha256: f.sha256, size: f.size, marked: f.marked }] as const)));
}

/**
 * The reused pages that did not come through the pages' final pass as recorded: a page it read must hash as
 * recorded; a page it took as recorded without reading, or never saw (not a page), must still be the file taken.
 * None, unless a file changed while the build ran.
 */
export function reusedPagesAltered(plan: ReusePlan, site: string, hashed: ReadonlyMap<string, FinishedPage>, taken: ReadonlyMap<string, TakenFile>): string[] {
  const altered: string[] = [];
  for (const files of plan.reused.values()) {
    for (const file of files) {
      const page = hashed.get(file.path);
      const full = join(site, ...file.path.split('/'));
      if (page && !page.asRecorded) {
        if (page.sha256 !== file.sha256) altered.push(file.path);
        continue;
      }
      const then = taken.get(file.path);
      const now = takenFile(full);
      if (!then || !now || !sameFile(now, then)) altered.push(file.path);
    }
  }
  return altered;
}

/**
 * Writes the record of a published site: every page folder's key with the files under it as they are in
 * the folder the build published (`site`, by default the output path itself). Hashes come from the build's final
 * pass where it has them. A record that cannot be written only means the next build draws every page.
 */
export function writePageRecord(file: string, outDir: string, keys: Map<string, string>, hashed: ReadonlyMap<string, FinishedPage>, site = outDir): void {
  try {
    const folders: PageRecord['folders'] = {};
    for (const [name, key] of keys) {
      if (!isPageFolder(name)) continue;
      const folder = join(site, ...name.split('/'));
      if (!existsSync(folder)) continue;
      const files: RecordedFile[] = [];
      for (const entry of readdirSync(folder, { recursive: true, withFileTypes: true })) {
        if (!entry.isFile()) continue;
        const full = join(entry.parentPath, entry.name);
        const path = `${name}/${full.slice(folder.length + 1).split(/[\\/]/).join('/')}`;
        // A folder under this one with a key of its own (a tag's later parts) is recorded as that folder.
        if (inFolderOfItsOwn(path, name, keys)) continue;
        const stat = statSync(full);
        const page = hashed.get(path);
        const bytes = page ? undefined : readFileSync(full);
        files.push({
          path, size: stat.size, mtimeMs: stat.mtimeMs, ctimeMs: stat.ctimeMs, ino: stat.ino,
          sha256: page?.sha256 ?? sha256(bytes!), marked: page?.marked ?? (path.endsWith('.html') && marksSearchablePart(bytes!)),
        });
      }
      files.sort((a, b) => a.path.localeCompare(b.path));
      folders[name] = { key, files };
    }
    const assetFolder = join(site, '_astro');
    const assets = existsSync(assetFolder)
      ? readdirSync(assetFolder, { recursive: true, withFileTypes: true }).filter((e) => e.isFile())
        .map((e) => `_astro/${join(e.parentPath, e.name).slice(assetFolder.length + 1).split(/[\\/]/).join('/')}`).sort()
      : [];
    const record: PageRecord = { format: recordFormat, site: outDir, assets, folders };
    writeSummedJson(file, record);
  } catch {
    // Not written: the next build draws every page, as the first one did.
  }
}

const salts = new Map<string, string>();

/**
 * Names the code that draws the pages: Stepwright's own (as the cache folder's index of code stamps gives it), and
 * the version of every package it depends on.
 */
export function pageCodeStamp(cacheFolder: string): string {
  const known = salts.get(cacheFolder);
  if (known !== undefined) return known;
  const parts = [stepwrightStamp(cacheFolder)];
  const root = packageRoot(import.meta.dirname);
  try {
    const manifest = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { dependencies?: Record<string, string> };
    for (const name of Object.keys(manifest.dependencies ?? {}).sort()) parts.push(`${name}@${installedVersion(root, name) ?? 'missing'}`);
  } catch {
    parts.push(`unknown-${process.pid}-${Date.now()}`);
  }
  const salt = parts.join('\n');
  salts.set(cacheFolder, salt);
  return salt;
}

/** The version of a package as Node would find it from our package's folder. */
function installedVersion(from: string, name: string): string | undefined {
  for (let dir = from; ; dir = dirname(dir)) {
    const file = join(dir, 'node_modules', ...name.split('/'), 'package.json');
    if (existsSync(file)) {
      try {
        return String((JSON.parse(readFileSync(file, 'utf8')) as { version?: unknown }).version);
      } catch {
        return undefined;
      }
    }
    if (dirname(dir) === dir) return undefined;
  }
}

function sha256(data: string | Buffer): string {
  return createHash('sha256').update(data).digest('hex');
}
