// Reads procedure files on a thread of its own while the main thread builds their models and checks them: a large
// run's reading (YAML with positions, the markdown body, the schema's check of the data) is split between two cores.
// The thread reads the files in the order the main thread will ask for them. Each file is claimed once, by whichever
// gets to it first: a file the thread has not started when asked is read on the main thread (the thread then passes
// over it), and one it is reading is waited for. So the main thread may also take files from the other end of the
// list and meet the thread in the middle (check/run-checks.ts does, for the files the cache answered for). What the
// thread sends is plain data (read/read-on-thread.ts): the parts as bytes (partsToBytes, which the caller may keep
// between runs), their table of positions and the schema's findings; the main thread reads a file's YAML document
// again only when a position in it is asked for.
// Anything that goes wrong with the thread only means the main thread reads the file itself: the answers are the
// same either way.
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { MessageChannel, receiveMessageOnPort, Worker, type MessagePort } from 'node:worker_threads';
import { partsFromBytes, type ReadParts } from '../parse/read-source.ts';
import type { SchemaIssue } from '../model/validate.ts';
import type { ReadOnThread } from './read-on-thread.ts';

/**
 * What the thread read from a file: its parts, the same parts (without the table of positions) as bytes, and what the
 * procedure schema finds in their data (undefined when the data is not a mapping of keys).
 */
export interface ReadAhead {
  parts: ReadParts;
  bytes: Uint8Array;
  schemaIssues: SchemaIssue[] | undefined;
}

export interface SourceReader {
  /** The parts the thread read for `file`, or undefined: then read the file here (the thread passes over it). */
  take(file: string): ReadAhead | undefined;
  /** How many files the thread has read that have not been taken yet (never waits). */
  readAhead(): number;
  /** Ends the thread; later `take`s answer undefined. */
  stop(): void;
}

/** The thread is worth starting from this many files on (it costs about as much to start as reading ten files). */
export const readerThreshold = 100;

/** The reading module, from this module's place: the sources in a checkout, the compiled files in the package (where the check command is one bundle one folder below the package's lib/). */
function readingModule(): string | undefined {
  // Compiled first; in a checkout, where nothing is compiled, the source (Node strips its types).
  for (const extension of ['js', 'ts']) {
    const url = new URL(`../read/read-on-thread.${extension}`, import.meta.url);
    if (existsSync(fileURLToPath(url))) return url.href;
  }
  return undefined;
}

/** A file's claim: nobody's yet, the thread's (being read), the main thread's, or read and sent by the thread. */
const free = 0;
const thread = 1;
const main = 2;
const sent = 3;

// The thread starts loading the reading code at once, and reads once it is given the files.
const threadSource = `
const { workerData, parentPort } = require('node:worker_threads');
const loading = import(workerData.url);
parentPort.once('message', ({ files, claims, port }) => {
  const claim = new Int32Array(claims);
  loading.then(({ readOnThread }) => {
    for (let i = 0; i < files.length; i++) {
      // The main thread has taken this file itself.
      if (Atomics.compareExchange(claim, i, ${free}, ${thread}) !== ${free}) continue;
      let message = [i, null];
      try {
        message = [i, readOnThread(files[i].file, files[i].text)];
      } catch {
        // The main thread reads it and reports what went wrong.
      }
      port.postMessage(message);
      Atomics.store(claim, i, ${sent});
      Atomics.notify(claim, i);
    }
  }, () => port.close());
});
`;

/** A thread started ahead (warmSourceReader), loading the reading code while the files are found and read. */
let warmed: Worker | undefined;

function newThread(url: string): Worker | undefined {
  try {
    const worker = new Worker(threadSource, { eval: true, workerData: { url } });
    // It never keeps the process alive.
    worker.unref();
    return worker;
  } catch {
    return undefined;
  }
}

/**
 * Starts the thread ahead of the files, for a run that will read many: loading the reading code takes the thread
 * about half a second, which it then spends while the main thread reads the files, the configuration and the register.
 * startSourceReader gives it the files, or ends it when the run reads too few after all.
 */
export function warmSourceReader(): void {
  const url = readingModule();
  if (warmed || !url) return;
  warmed = newThread(url);
  const worker = warmed;
  worker?.on('error', () => {
    if (warmed === worker) warmed = undefined;
  });
}

/** The thread started ahead, if any, taken for a run; ended when the run does not need it. */
function takeWarmed(needed: boolean): Worker | undefined {
  const worker = warmed;
  warmed = undefined;
  if (worker && !needed) void worker.terminate();
  return needed ? worker : undefined;
}

/** The longest the main thread waits for a file the thread is reading before it reads the file itself. */
const longestWaitMs = 2000;

export function startSourceReader(files: Array<{ file: string; text: string }>): SourceReader | undefined {
  const url = readingModule();
  const needed = url !== undefined && files.length >= readerThreshold;
  const ahead = takeWarmed(needed);
  if (!needed) return undefined;
  const indexOf = new Map<string, number>();
  files.forEach(({ file }, i) => {
    if (!indexOf.has(file)) indexOf.set(file, i);
  });
  const claims = new Int32Array(new SharedArrayBuffer(4 * files.length));
  let port: MessagePort | undefined;
  let worker: Worker | undefined;
  try {
    worker = ahead ?? newThread(url);
    if (!worker) return undefined;
    const channel = new MessageChannel();
    port = channel.port1;
    worker.postMessage({ files, claims: claims.buffer, port: channel.port2 }, [channel.port2]);
  } catch {
    port?.close();
    void worker?.terminate();
    return undefined;
  }
  // Neither keeps the process alive; a thread that fails is simply not asked again.
  port.unref();
  let running = true;
  const stop = () => {
    if (!running) return;
    running = false;
    port!.close();
    void worker!.terminate();
  };
  worker.on('error', stop);
  const read = new Map<number, ReadOnThread | null>();
  const receive = () => {
    for (let message = receiveMessageOnPort(port!); message; message = receiveMessageOnPort(port!)) {
      const [i, got] = message.message as [number, ReadOnThread | null];
      read.set(i, got);
    }
  };
  return {
    take(file) {
      const index = indexOf.get(file);
      if (index === undefined || !running) return undefined;
      // Not started by the thread: read here, and the thread passes over it.
      const claim = Atomics.compareExchange(claims, index, free, main);
      if (claim === free || claim === main) return undefined;
      // Being read on the thread: wait for it (a moment; a file takes milliseconds).
      if (claim === thread && Atomics.wait(claims, index, thread, longestWaitMs) === 'timed-out') return undefined;
      receive();
      const got = read.get(index);
      read.delete(index);
      // Undefined when the thread could not read it: read here, and report what goes wrong.
      const parts = got ? partsFromBytes(got[0]) : undefined;
      return parts ? { parts: { ...parts, positions: got![1] }, bytes: got![0], schemaIssues: got![2] } : undefined;
    },
    readAhead() {
      if (!running) return 0;
      receive();
      return read.size;
    },
    stop,
  };
}
