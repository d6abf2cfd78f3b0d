// The English model (compromise) loaded on a second thread, so that its load (a quarter of a second of unpacking
// its word lists) runs beside the main thread's own start: loading the checker, reading and parsing the files.
// Questions are numbered and answered in order. A question may be sent ahead (a procedure's phrases, posted
// before the rules run) and its answer taken later, so that the thread tags while the main thread runs other rules;
// a rule that needs an answer now waits on a shared counter for it. The answers are plain data (tags by term); the
// same library file answers, with the same steps, so the tags are the same as in the main thread. (Whether a word is
// a base-form verb in the model's word list is answered from a list taken from it: model-infinitives.ts.)
// Only the command line starts it (`stepwright check` when no result cache will answer). Should the thread fail
// to start, to load the library or to answer, it is stopped and the model is loaded in the main thread, as
// without it: the thread only ever changes when the work is done, never the answers.
import { MessageChannel, receiveMessageOnPort, Worker, type MessagePort } from 'node:worker_threads';
import { dependencyRequire } from '../load-dependency.ts';

/** One term of a tagged sentence, as the thread sends it: text, text before, text after, tags. */
export type TermData = [text: string, pre: string, post: string, tags: string[]];
type Question = { id: number } & { op: 'tag'; text: string };
type Answer = { id: number } & ({ ok: true; value: unknown } | { ok: false; error: string });

// Runs in the thread (CommonJS, given as text so that the package needs no file of its own for it). Questions are
// answered one at a time, in the order they came; each answer carries its question's number, and the shared
// counter says how many answers have been sent.
const threadSource = `
const { workerData } = require('node:worker_threads');
const { port, flag, entry } = workerData;
let nlp, steps, failure;
try {
  nlp = require(entry);
  steps = nlp.world().hooks.filter((step) => step !== 'chunks');
} catch (error) {
  failure = String((error && error.message) || error);
}
port.on('message', (question) => {
  let answer;
  try {
    if (failure) throw new Error(failure);
    const doc = nlp.tokenize(question.text);
    doc.compute(steps);
    answer = { id: question.id, ok: true, value: doc.document.map((terms) => terms.map((t) => [t.text, t.pre, t.post, [...t.tags]])) };
  } catch (error) {
    answer = { id: question.id, ok: false, error: String((error && error.message) || error) };
  }
  try {
    port.postMessage(answer);
  } catch (error) {
    port.postMessage({ id: question.id, ok: false, error: String((error && error.message) || error) });
  }
  Atomics.add(flag, 0, 1);
  Atomics.notify(flag, 0);
});
`;

type Thread = {
  worker: Worker; port: MessagePort;
  /** How many answers the thread has sent. */
  flag: Int32Array;
  /** The last question's number, and how many answers have been read off the port. */
  asked: number; read: number;
  /** Answers read off the port before they were asked for. */
  early: Map<number, Answer>;
};
// Kept on globalThis: the command line starts the thread from its own copy of this module, the bundled checker asks
// it from another.
const slot = Symbol.for('stepwright.prose.model-thread');
const slots = globalThis as unknown as Record<symbol, Thread | undefined>;

/** How long the main thread waits for any one answer (the first waits for the library's load) before doing it itself. */
const answerLimitMs = 60_000;

/** Starts loading the English model on a second thread; does nothing when it is running already or cannot start. */
export function startModelThread(): void {
  if (slots[slot]) return;
  try {
    const { entry } = dependencyRequire('compromise');
    const { port1, port2 } = new MessageChannel();
    const flag = new Int32Array(new SharedArrayBuffer(4));
    const worker = new Worker(threadSource, {
      eval: true, workerData: { port: port2, flag, entry }, transferList: [port2],
      // Loading the model makes much short-lived garbage. With V8's default, the thread's young generation grows to
      // 16 MB a half, and every page it touches first costs a page fault; kept at 4 MB a half (12 MB in all), it
      // stays in pages already touched. Cold check of the demo manual, median of 12 interleaved runs each: 1.005 s →
      // 0.97 s, 39,300 → 37,800 page faults; the check of 1,001 files is unchanged (5.62/5.78 s against 5.67/5.73 s).
      resourceLimits: { maxYoungGenerationSizeMb: 12 },
    });
    // Neither keeps the process alive: a run that never asks ends as soon as its work is done.
    worker.unref();
    port1.unref();
    worker.on('error', () => stopModelThread());
    const thread: Thread = { worker, port: port1, flag, asked: 0, read: 0, early: new Map() };
    slots[slot] = thread;
  } catch {
    // no thread: the model is loaded in the main thread when it is first needed
  }
}

/** Whether a thread is there to ask. */
export function modelThreadRunning(): boolean {
  return slots[slot] !== undefined;
}

export function stopModelThread(): void {
  const thread = slots[slot];
  if (!thread) return;
  slots[slot] = undefined;
  thread.port.close();
  void thread.worker.terminate();
}

/** A question on its way, to be answered by `take`. */
export type Ticket = number;

/** Sends a question without waiting for its answer; undefined when there is no thread. */
function post(question: { op: 'tag'; text: string }): Ticket | undefined {
  const thread = slots[slot];
  if (!thread) return undefined;
  const id = ++thread.asked;
  try {
    thread.port.postMessage({ id, ...question } satisfies Question);
  } catch {
    stopModelThread();
    return undefined;
  }
  return id;
}

/**
 * The answer to a question sent earlier, waiting for it when it has not come yet; undefined when the thread is
 * gone, failed or did not answer in time (then it is stopped, and the caller does the work itself).
 */
function take(ticket: Ticket): { ok: true; value: unknown } | undefined {
  const thread = slots[slot];
  if (!thread) return undefined;
  const started = Date.now();
  while (!thread.early.has(ticket)) {
    if (receiveAnswer(thread)) continue;
    const left = answerLimitMs - (Date.now() - started);
    const sent = Atomics.load(thread.flag, 0);
    // An answer counted but not yet readable is a moment away; otherwise wait for the counter to move.
    if (left <= 0 || (sent <= thread.read && Atomics.wait(thread.flag, 0, sent, left) === 'timed-out')) {
      stopModelThread();
      return undefined;
    }
  }
  const answer = thread.early.get(ticket)!;
  thread.early.delete(ticket);
  if (!answer.ok) {
    stopModelThread();
    return undefined;
  }
  return answer;
}

/**
 * Whether the answer to a question sent earlier can be taken without waiting (or the thread is gone, so that the
 * caller will not wait either). Reads what has come in off the port; never blocks.
 */
export function answered(ticket: Ticket): boolean {
  const thread = slots[slot];
  if (!thread) return true;
  while (!thread.early.has(ticket)) if (!receiveAnswer(thread)) return false;
  return true;
}

/** Reads one answer that has come in off the port, if any, and keeps it until it is taken. Never blocks. */
function receiveAnswer(thread: Thread): boolean {
  const message = receiveMessageOnPort(thread.port)?.message as Answer | undefined;
  if (!message) return false;
  thread.read++;
  thread.early.set(message.id, message);
  return true;
}

/** Sends a text to be tagged; its sentences come back from `takeTagged`. */
export function postTagging(text: string): Ticket | undefined {
  return post({ op: 'tag', text });
}

/** The sentences of a text posted earlier, with their terms; undefined when the main thread must tag it. */
export function takeTagged(ticket: Ticket): TermData[][] | undefined {
  return take(ticket)?.value as TermData[][] | undefined;
}

/** The sentences of a text with their terms, tagged by the thread; undefined when the main thread must do it. */
export function tagOnThread(text: string): TermData[][] | undefined {
  const ticket = postTagging(text);
  return ticket === undefined ? undefined : takeTagged(ticket);
}
