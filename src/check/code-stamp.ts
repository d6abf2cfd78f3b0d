// What identifies the Stepwright code that runs, for the result cache and the build's page records: results kept
// by one code are never taken by another.
//
// Two stamps name the same code:
// - the quick stamp, from the version and the size and modification time of every file of the code: cheap (a few
//   milliseconds), but it changes whenever the files are written again. Installing the same package again
//   (`npm ci` on every CI run) gives every file a new time.
// - the content stamp, from the version and the bytes of every file: it survives a reinstall, but reading the code
//   (about 6 MB) costs some 40 ms.
// A cache folder keeps a short index from quick stamps to the content stamps worked out for them. A run whose
// quick stamp is in the index takes its content stamp from there; any other run reads the code once and adds it.
// A file changed in place changes the quick stamp, so the index never answers for code it has not read. A
// damaged or altered index is ignored, and rewritten.
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { readSummedJson, writeSummedJson } from './summed-json.ts';

/** Quick stamps the index remembers, most recent first: a few installs and checkouts. */
const remembered = 16;

/** The index's file in a cache folder. */
export function stampIndexPath(cacheFolder: string): string {
  return join(cacheFolder, 'code-stamps.json');
}

/** The nearest folder at or above `from` that holds a package.json. */
export function packageRoot(from: string | undefined): string {
  let dir = from ?? '/';
  for (;;) {
    if (statSync(join(dir, 'package.json'), { throwIfNoEntry: false })?.isFile()) return dir;
    const up = dirname(dir);
    if (up === dir) return dir;
    dir = up;
  }
}

interface CodeFiles {
  root: string;
  manifest: Buffer;
  /** Every file of the code that runs, in a fixed order, with its size and modification time. */
  files: Array<{ path: string; size: number; mtimeMs: number }>;
}

/** Undefined when the code at `root` is not a Stepwright package (bundled away from it, or a damaged install). */
function codeFiles(root: string): CodeFiles | undefined {
  let manifest: Buffer;
  try {
    manifest = readFileSync(join(root, 'package.json'));
    if ((JSON.parse(manifest.toString('utf8')) as { name?: unknown }).name !== 'stepwright') return undefined;
  } catch {
    return undefined;
  }
  const files: CodeFiles['files'] = [];
  // The code that runs: a development checkout runs its sources (bin/stepwright.mjs), whatever a compile left in
  // lib/ meanwhile; an installed package runs lib/.
  const running = existsSync(join(root, 'src', 'cli', 'main.ts')) ? ['src'] : ['lib', 'dist'];
  const walk = (dir: string) => {
    let names: string[];
    try {
      names = readdirSync(dir).sort();
    } catch {
      return;
    }
    for (const name of names) {
      const full = join(dir, name);
      const s = statSync(full, { throwIfNoEntry: false });
      if (!s) continue;
      if (s.isDirectory()) walk(full);
      else files.push({ path: full.slice(root.length), size: s.size, mtimeMs: s.mtimeMs });
    }
  };
  for (const folder of running) walk(join(root, folder));
  return { root, manifest, files };
}

/** A stamp no other run has: nothing can say which code this is, so this run's results are never reused. */
function unknownStamp(): string {
  return `unknown-${process.pid}-${Date.now()}-${Math.random()}`;
}

function quickStampOf(code: CodeFiles): string {
  const hash = createHash('sha256');
  hash.update(code.manifest);
  for (const f of code.files) hash.update(`${f.path}\u0000${f.size}\u0000${f.mtimeMs}\n`);
  return hash.digest('hex');
}

/** The content stamp, read from the code's bytes; undefined when a file cannot be read. */
function contentStamp(code: CodeFiles): string | undefined {
  const hash = createHash('sha256');
  hash.update('content\n');
  hash.update(code.manifest);
  try {
    for (const f of code.files) {
      const bytes = readFileSync(join(code.root, f.path));
      hash.update(`\n${f.path}\u0000${bytes.byteLength}\n`);
      hash.update(bytes);
    }
  } catch {
    return undefined;
  }
  return hash.digest('hex');
}

type StampIndex = Array<[quick: string, content: string]>;

const isStamp = (value: unknown): value is string => typeof value === 'string' && /^[0-9a-f]{64}$/.test(value);

function readIndex(file: string): StampIndex {
  const pairs = readSummedJson(file);
  if (!Array.isArray(pairs)) return [];
  return pairs.filter((p): p is [string, string] => Array.isArray(p) && p.length === 2 && isStamp(p[0]) && isStamp(p[1]));
}

function writeIndex(file: string, pairs: StampIndex): void {
  try {
    writeSummedJson(file, pairs);
  } catch {
    // Not written: the next run reads the code again, which costs time only.
  }
}

/** The stamps of the code in the package at `root`: the quick one, and the content one through `cacheFolder`'s index. */
export function codeStamps(root: string): { quick: string; inFolder(cacheFolder: string): string } {
  const code = codeFiles(root);
  if (!code) {
    const unknown = unknownStamp();
    return { quick: unknown, inFolder: () => unknown };
  }
  const quick = quickStampOf(code);
  const byFolder = new Map<string, string>();
  return {
    quick,
    inFolder(cacheFolder) {
      const known = byFolder.get(cacheFolder);
      if (known !== undefined) return known;
      const file = stampIndexPath(cacheFolder);
      const pairs = readIndex(file);
      let stamp = pairs.find(([q]) => q === quick)?.[1];
      if (stamp === undefined) {
        stamp = contentStamp(code) ?? unknownStamp();
        if (isStamp(stamp)) {
          const added: [string, string] = [quick, stamp];
          writeIndex(file, [added, ...pairs.filter(([q]) => q !== quick)].slice(0, remembered));
        }
      }
      byFolder.set(cacheFolder, stamp);
      return stamp;
    },
  };
}

let running: ReturnType<typeof codeStamps> | undefined;

/**
 * What identifies the Stepwright that runs: without a cache folder, the quick stamp; with one, the content stamp,
 * found through the folder's index (or read once and added to it). A changed rule, even in a working copy at the
 * same version, never meets results from the old one.
 */
export function stepwrightStamp(cacheFolder?: string): string {
  running ??= codeStamps(packageRoot(import.meta.dirname));
  return cacheFolder === undefined ? running.quick : running.inFolder(cacheFolder);
}
