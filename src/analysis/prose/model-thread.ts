// The English model (compromise) loaded on a second thread, so that its load (a quarter of a second of unpacking
// its word lists) runs beside the main thread's own start: loading the checker, reading and parsing the files.
// The rules ask it synchronously, as they ask the model in the main thread: the question goes to the thread and
// the main thread waits on a shared flag for the answer (the answers are plain data: tags by term, lexicon
// entries). The same library file answers, with the same steps, so the tags are the same as in the main thread.
// Only the command line starts it (`stepwright check` when no result cache will answer). Should the thread fail
// to start, to load the library or to answer, it is stopped and the model is loaded in the main thread, as
// without it: the thread only ever changes when the work is done, never the answers.
import { MessageChannel, receiveMessageOnPort, Worker, type MessagePort } from 'node:worker_threads';
import { dependencyRequire } from '../load-dependency.ts';

/** One term of a tagged sentence, as the thread sends it: text, text before, text after, tags. */
export type TermData = [text: string, pre: string, post: string, tags: string[]];
type Question = { op: 'tag'; text: string } | { op: 'lexicon'; word: string };
type Answer = { ok: true; value: unknown } | { ok: false; error: string };

// Runs in the thread (CommonJS, given as text so that the package needs no file of its own for it).
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
    if (question.op === 'tag') {
      const doc = nlp.tokenize(question.text);
      doc.compute(steps);
      answer = { ok: true, value: doc.document.map((terms) => terms.map((t) => [t.text, t.pre, t.post, [...t.tags]])) };
    } else {
      // Only the word list's own entries (not what every object inherits, such as 'constructor').
      const lexicon = nlp.world().model.one.lexicon;
      answer = { ok: true, value: Object.hasOwn(lexicon, question.word) ? lexicon[question.word] : undefined };
    }
  } catch (error) {
    answer = { ok: false, error: String((error && error.message) || error) };
  }
  try {
    port.postMessage(answer);
  } catch (error) {
    port.postMessage({ ok: false, error: String((error && error.message) || error) });
  }
  Atomics.store(flag, 0, 1);
  Atomics.notify(flag, 0);
});
`;

type Thread = { worker: Worker; port: MessagePort; flag: Int32Array };
// Kept on globalThis: the command line starts the thread from its own copy of this module, the bundled checker asks
// it from another.
const slot = Symbol.for('stepwright.prose.model-thread');
const slots = globalThis as unknown as Record<symbol, Thread | undefined>;

/** How long one answer may take (the first waits for the library's load) before the main thread does it itself. */
const answerLimitMs = 60_000;

/** Starts loading the English model on a second thread; does nothing when it is running already or cannot start. */
export function startModelThread(): void {
  if (slots[slot]) return;
  try {
    const { entry } = dependencyRequire('compromise');
    const { port1, port2 } = new MessageChannel();
    const flag = new Int32Array(new SharedArrayBuffer(4));
    const worker = new Worker(threadSource, { eval: true, workerData: { port: port2, flag, entry }, transferList: [port2] });
    // Neither keeps the process alive: a run that never asks ends as soon as its work is done.
    worker.unref();
    port1.unref();
    worker.on('error', () => stopModelThread());
    slots[slot] = { worker, port: port1, flag };
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

/** The thread's answer, or undefined when there is no thread or it did not answer (then it is stopped). */
function ask(question: Question): { ok: true; value: unknown } | undefined {
  const thread = slots[slot];
  if (!thread) return undefined;
  Atomics.store(thread.flag, 0, 0);
  thread.port.postMessage(question);
  const waited = Atomics.wait(thread.flag, 0, 0, answerLimitMs);
  const message = waited === 'timed-out' ? undefined : receiveMessageOnPort(thread.port);
  const answer = message?.message as Answer | undefined;
  if (!answer || !answer.ok) {
    stopModelThread();
    return undefined;
  }
  return answer;
}

/** The sentences of a text with their terms, tagged by the thread; undefined when the main thread must do it. */
export function tagOnThread(text: string): TermData[][] | undefined {
  return ask({ op: 'tag', text })?.value as TermData[][] | undefined;
}

/** The model's lexicon entry of a word (lower case) from the thread; `found: false` when the main thread must look. */
export function lexiconOnThread(word: string): { found: true; value: string | string[] | undefined } | { found: false } {
  const answer = ask({ op: 'lexicon', word });
  return answer ? { found: true, value: answer.value as string | string[] | undefined } : { found: false };
}
