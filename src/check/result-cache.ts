// A content-addressed store of per-file results on disk (by default .stepwright/cache/): an entry is found by
// the hash of everything the result depends on, so an edited file, another config or another Stepwright simply
// misses. An entry that is unreadable, cut short, altered or written for another key is ignored, never trusted;
// the folder may be deleted at any time.
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { Worker } from 'node:worker_threads';

/** Bumped when the layout of an entry changes; part of every key. */
const entryFormat = 'stepwright-cache-1';

export interface ResultCache {
  /** The value stored under the key, or undefined when there is none or it cannot be trusted. */
  get<T>(key: string): T | undefined;
  set(key: string, value: unknown): void;
  /** Bytes stored under the key with setBytes, or undefined when there are none or they cannot be trusted. */
  getBytes(key: string): Uint8Array | undefined;
  setBytes(key: string, bytes: Uint8Array): void;
  /** Whether bytes are stored under the key (they may still be refused when read). */
  hasBytes(key: string): boolean;
  /** Waits until every entry set so far is on disk (or given up on): call before the run ends. */
  flush(): Promise<void>;
  /** Entries found and used, missed, and refused as corrupt or stale in this run. */
  readonly stats: { hits: number; misses: number; refused: number };
}

/** The key for a list of parts: a hash, so no part can be mistaken for another. */
export function cacheKey(parts: ReadonlyArray<string | undefined>): string {
  const hash = createHash('sha256');
  hash.update(entryFormat);
  for (const part of parts) {
    // Each part is framed by its length, so ("ab", "c") and ("a", "bc") differ.
    const text = part ?? '\u0000absent';
    hash.update(`\u0000${text.length}\u0000`);
    hash.update(text);
  }
  return hash.digest('hex');
}

export function openResultCache(dir: string): ResultCache {
  const stats = { hits: 0, misses: 0, refused: 0 };
  const pathOf = (key: string) => join(dir, key.slice(0, 2), `${key}.json`);
  const bytesPathOf = (key: string) => join(dir, key.slice(0, 2), `${key}.bin`);
  let broken = false;
  let written = 0;
  const writer = entryWriter();
  return {
    stats,
    get<T>(key: string): T | undefined {
      let raw: string;
      try {
        raw = readFileSync(pathOf(key), 'utf8');
      } catch {
        stats.misses++;
        return undefined;
      }
      try {
        const entry = JSON.parse(raw) as { format?: unknown; key?: unknown; sum?: unknown; value?: unknown };
        const body = JSON.stringify(entry.value);
        if (entry.format !== entryFormat || entry.key !== key || typeof body !== 'string' || entry.sum !== sumOf(body)) throw new Error('stale or altered');
        stats.hits++;
        return entry.value as T;
      } catch {
        // Cut short, garbled, or written by another version: read the file afresh instead.
        stats.refused++;
        try {
          rmSync(pathOf(key), { force: true });
        } catch {
          // A read-only cache is still only a cache.
        }
        return undefined;
      }
    },
    set(key: string, value: unknown): void {
      const body = JSON.stringify(value);
      store(pathOf(key), `{"format":${JSON.stringify(entryFormat)},"key":${JSON.stringify(key)},"sum":${JSON.stringify(sumOf(body))},"value":${body}}`);
    },
    getBytes(key: string): Uint8Array | undefined {
      let raw: Buffer;
      try {
        raw = readFileSync(bytesPathOf(key));
      } catch {
        stats.misses++;
        return undefined;
      }
      // A line that names the format, the key and the sum of the bytes that follow it.
      const end = raw.indexOf(10);
      const bytes = end < 0 ? undefined : raw.subarray(end + 1);
      if (bytes && raw.subarray(0, end).toString('latin1') === bytesHeader(key, sumOf(bytes))) {
        stats.hits++;
        return bytes;
      }
      stats.refused++;
      try {
        rmSync(bytesPathOf(key), { force: true });
      } catch {
        // A read-only cache is still only a cache.
      }
      return undefined;
    },
    hasBytes(key: string): boolean {
      return existsSync(bytesPathOf(key));
    },
    setBytes(key: string, bytes: Uint8Array): void {
      store(bytesPathOf(key), Buffer.concat([Buffer.from(`${bytesHeader(key, sumOf(bytes))}\n`, 'latin1'), bytes]));
    },
    async flush(): Promise<void> {
      await writer.finish();
    },
  };

  function store(path: string, entry: string | Uint8Array): void {
    if (broken) return;
    written++;
    // A large first run (hundreds of files) hands its writes to a thread of their own: the files are opened,
    // written and renamed there while the rules go on checking. A small one writes them here.
    if (written > writtenHere && !writer.failed) {
      writer.write(path, entry);
      return;
    }
    if (!writeEntry(path, entry)) broken = true;
  }
}

function bytesHeader(key: string, sum: string): string {
  return `${entryFormat} bytes ${key} ${sum}`;
}

/** Entries a run writes itself before it hands the rest to the writing thread. */
const writtenHere = 64;

/** Writes an entry aside and renames it into place, so a reader never sees half an entry. False when it could not. */
function writeEntry(path: string, entry: string | Uint8Array): boolean {
  const tmp = `${path}.tmp-${process.pid}-${Math.random().toString(36).slice(2)}`;
  try {
    mkdirSync(dirname(path), { recursive: true });
    writeFileSync(tmp, entry);
    renameSync(tmp, path);
    return true;
  } catch {
    // A full disk or a read-only folder: go on without caching rather than fail the check.
    try {
      rmSync(tmp, { force: true });
    } catch {
      // Nothing was written.
    }
    return false;
  }
}

/** The writing thread's own code: the same steps as writeEntry, one message per entry; stops at the first failure. */
const writerSource = `
const { parentPort, threadId } = require('node:worker_threads');
const { mkdirSync, writeFileSync, renameSync, rmSync } = require('node:fs');
const { dirname } = require('node:path');
let failed = false;
const made = new Set();
parentPort.on('message', (message) => {
  if (message === 'finish') return parentPort.postMessage({ finished: true, failed });
  if (failed) return;
  const [path, entry] = message;
  const tmp = path + '.tmp-' + process.pid + '-' + threadId + '-' + Math.random().toString(36).slice(2);
  try {
    const dir = dirname(path);
    if (!made.has(dir)) { mkdirSync(dir, { recursive: true }); made.add(dir); }
    writeFileSync(tmp, entry);
    renameSync(tmp, path);
  } catch {
    failed = true;
    try { rmSync(tmp, { force: true }); } catch {}
  }
});
`;

interface EntryWriter {
  /** True once the thread could not be started or stopped writing: entries are then not cached. */
  readonly failed: boolean;
  write(path: string, entry: string | Uint8Array): void;
  finish(): Promise<void>;
}

/** The thread that writes a large run's entries, started on the first entry it is given. */
function entryWriter(): EntryWriter {
  let worker: Worker | undefined;
  let failed = false;
  let done: Promise<void> | undefined;
  const stop = () => {
    failed = true;
    void worker?.terminate();
  };
  return {
    get failed() { return failed; },
    write(path, entry) {
      if (!worker) {
        try {
          worker = new Worker(writerSource, { eval: true });
        } catch {
          failed = true;
          return;
        }
        worker.on('error', stop);
        // Never what keeps the process alive; finish() holds it until the entries are written.
        worker.unref();
      }
      worker.postMessage([path, entry]);
    },
    finish() {
      if (!worker || failed) return Promise.resolve();
      const running = worker;
      done ??= new Promise<void>((resolve) => {
        const end = () => {
          void running.terminate();
          // Entries set later (after a check, by the build) start a thread of their own.
          if (worker === running) {
            worker = undefined;
            done = undefined;
          }
          resolve();
        };
        running.once('message', end);
        running.once('error', end);
        running.once('exit', end);
        running.ref();
        running.postMessage('finish');
      });
      return done;
    },
  };
}

function sumOf(body: string | Uint8Array): string {
  return createHash('sha256').update(body).digest('hex');
}
