// The offline copy's file list: every built file a tablet may keep, with a content hash, its size and what it
// belongs to (an area of the plant, an emergency procedure, or the frame every page needs). The service worker
// reads it at run time and fetches only the files whose hash it does not hold yet.
import { createHash } from 'node:crypto';

export interface BuiltFile {
  /** Path inside the built site, with forward slashes, e.g. "procedures/u2-k210-batch-001/index.html". */
  path: string;
  bytes: Uint8Array;
}

/** A built file already hashed while it was read (its bytes need not stay in memory). */
export interface HashedFile {
  path: string;
  /** Hex SHA-256 of the whole content. */
  sha256: string;
  size: number;
}

/** What the manual knows about a procedure page, so its files can be kept by area. */
export interface ProcedurePlace {
  /** The folder name of its pages, e.g. "u2-k210-batch-001" for procedures/u2-k210-batch-001/. */
  slug: string;
  area: string;
  kind: string;
}

export interface OfflineEntry {
  /** URL relative to the manual's root ("./" for the home page, "procedures/x/" for a folder page). */
  url: string;
  /** SHA-256 of the content, hex, first 32 characters. */
  hash: string;
  bytes: number;
  /** The area of the procedure this file belongs to; absent for the frame every page needs. */
  area?: string;
  /** Part of every offline copy, whatever the tablet chose: emergency and emergency-shutdown procedures. */
  always?: true;
  /** For a search-index fragment: the page it describes, so it is kept exactly when that page is. */
  page?: string;
}

export interface AreaSize {
  area: string;
  procedures: number;
  files: number;
  bytes: number;
}

export interface OfflineFileList {
  format: 1;
  /** Hash of every kept file's URL and content hash: equal sites give equal versions. */
  version: string;
  builtAt: string;
  /** Sorted by URL. */
  files: OfflineEntry[];
  /** Sorted by area name; emergency procedures are counted in their area too. */
  areas: AreaSize[];
}

/** The small record a tablet reads on every check: is there a newer manual, and how big is it. */
export interface OfflinePublication {
  version: string;
  builtAt: string;
  files: number;
  bytes: number;
}

/** Kinds a tablet keeps whatever areas it chose. */
export const alwaysKeptKinds: readonly string[] = ['emergency', 'emergency-shutdown'];

/**
 * Files the browser never needs offline: the offline machinery itself, source maps, hidden files, records for
 * people and tools rather than the reader, and pagefind's ready-made search screens (the manual's search page
 * uses pagefind.js only).
 */
const skipped = [
  /^sw\.js$/, /^offline-(manifest|files)\.json$/, /\.map$/, /(^|\/)\.[^/]+$/,
  /^pagefind\/pagefind-(component-ui|modular-ui|ui)\.(js|css)$/, /^pagefind\/pagefind-highlight\.js$/,
];

export function isOfflineFile(path: string): boolean {
  return !skipped.some((re) => re.test(path));
}

export function urlOf(path: string): string {
  if (path === 'index.html') return './';
  if (path.endsWith('/index.html')) return path.slice(0, -'index.html'.length);
  return path;
}

export function contentHash(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex').slice(0, 32);
}

const byUrl = (a: { url: string }, b: { url: string }) => (a.url < b.url ? -1 : a.url > b.url ? 1 : 0);

/**
 * The file list of a built site. `places` ties procedure pages to areas; `fragmentPages` ties each search-index
 * fragment (by path) to the page URL it describes.
 */
export function offlineFileList(
  files: Array<BuiltFile | HashedFile>,
  options: { builtAt: string; places?: ProcedurePlace[]; fragmentPages?: Map<string, string> },
): OfflineFileList {
  const places = new Map((options.places ?? []).map((p) => [p.slug, p]));
  const placeOfUrl = (url: string) => {
    const m = /^procedures\/([^/]+)\//.exec(url);
    return m ? places.get(m[1]) : undefined;
  };
  const entries: OfflineEntry[] = [];
  for (const file of files) {
    if (!isOfflineFile(file.path)) continue;
    const url = urlOf(file.path);
    const page = options.fragmentPages?.get(file.path);
    const place = placeOfUrl(page ?? url);
    const entry: OfflineEntry = 'bytes' in file
      ? { url, hash: contentHash(file.bytes), bytes: file.bytes.byteLength }
      : { url, hash: file.sha256.slice(0, 32), bytes: file.size };
    if (place) entry.area = place.area;
    if (place && alwaysKeptKinds.includes(place.kind)) entry.always = true;
    if (page !== undefined) entry.page = page;
    entries.push(entry);
  }
  entries.sort(byUrl);
  const version = createHash('sha256');
  for (const e of entries) version.update(e.url).update('\0').update(e.hash).update('\n');
  const areas = new Map<string, AreaSize>();
  for (const p of places.values()) {
    const size = areas.get(p.area) ?? { area: p.area, procedures: 0, files: 0, bytes: 0 };
    size.procedures++;
    areas.set(p.area, size);
  }
  for (const e of entries) {
    if (!e.area) continue;
    const size = areas.get(e.area)!;
    size.files++;
    size.bytes += e.bytes;
  }
  return {
    format: 1,
    version: version.digest('hex').slice(0, 16),
    builtAt: options.builtAt,
    files: entries,
    areas: [...areas.values()].sort((a, b) => (a.area < b.area ? -1 : a.area > b.area ? 1 : 0)),
  };
}

export function publicationOf(list: OfflineFileList): OfflinePublication {
  return { version: list.version, builtAt: list.builtAt, files: list.files.length, bytes: list.files.reduce((n, e) => n + e.bytes, 0) };
}

export interface UpdateCost {
  /** Files a tablet holding the previous copy fetches: new files and files whose content changed. */
  fetched: number;
  fetchedBytes: number;
  added: number;
  changed: number;
  /** Files the tablet deletes. */
  removed: number;
  /** URLs fetched, sorted. */
  urls: string[];
}

/** What a tablet holding `previous` (the whole manual) downloads and deletes to hold `next`. */
export function updateCost(previous: Pick<OfflineFileList, 'files'>, next: Pick<OfflineFileList, 'files'>): UpdateCost {
  const before = new Map(previous.files.map((e) => [e.url, e.hash]));
  const held = new Set(previous.files.map((e) => e.hash));
  const nextUrls = new Set(next.files.map((e) => e.url));
  const cost: UpdateCost = { fetched: 0, fetchedBytes: 0, added: 0, changed: 0, removed: 0, urls: [] };
  for (const e of next.files) {
    const old = before.get(e.url);
    if (old === e.hash) continue;
    if (old === undefined) cost.added++;
    else cost.changed++;
    // The same content under another URL is already on the tablet: stored by hash, it is not fetched again.
    if (held.has(e.hash)) continue;
    cost.fetched++;
    cost.fetchedBytes += e.bytes;
    cost.urls.push(e.url);
  }
  for (const url of before.keys()) if (!nextUrls.has(url)) cost.removed++;
  return cost;
}

/** Sizes in the units a reader expects: "812 B", "43.1 KB", "68.8 MB" (1 KB = 1024 bytes). */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} KB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}
