// The offline copy's manifest: which built files the service worker keeps, and a content hash as its version.
import { createHash } from 'node:crypto';

export interface BuiltFile {
  /** Path inside the built site, with forward slashes, e.g. "procedures/u2-k210-batch-001/index.html". */
  path: string;
  bytes: Uint8Array;
}

export interface OfflineManifest {
  /** Hash of every kept file's path and content: equal sites give equal versions. */
  version: string;
  /** URLs to keep, sorted; a folder's index.html is kept under the folder's URL. */
  files: string[];
  /** Bytes the offline copy takes. */
  bytes: number;
}

/** Files the browser never needs offline, and the offline machinery itself. */
const skipped = [/^sw\.js$/, /^offline-manifest\.json$/, /\.map$/, /(^|\/)\.[^/]+$/];

export function offlineManifest(files: BuiltFile[]): OfflineManifest {
  const kept = files.filter((f) => !skipped.some((re) => re.test(f.path))).sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0));
  const hash = createHash('sha256');
  let bytes = 0;
  for (const file of kept) {
    hash.update(file.path).update('\0').update(createHash('sha256').update(file.bytes).digest('hex')).update('\n');
    bytes += file.bytes.byteLength;
  }
  return { version: hash.digest('hex').slice(0, 16), files: kept.map((f) => urlOf(f.path)), bytes };
}

export function urlOf(path: string): string {
  if (path === 'index.html') return '/';
  if (path.endsWith('/index.html')) return `/${path.slice(0, -'index.html'.length)}`;
  return `/${path}`;
}

/** The service worker: the manifest (no clock in it, so an unchanged site gives a byte-identical worker) and the code. */
export function serviceWorkerSource(manifest: OfflineManifest, workerCode: string): string {
  const data = { version: manifest.version, files: manifest.files };
  return `// Generated at build: the offline copy of the manual, version ${manifest.version}.\nself.OFFLINE_COPY = ${JSON.stringify(data)};\n${workerCode}`;
}
