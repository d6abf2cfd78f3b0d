// Tags ahead, in one reading of the English model, the phrases the writing rules will ask about in one
// procedure's prose (see tagAhead). Each writing rule that asks the model calls this first; the work is done
// once per procedure, and the rules' answers are the same as without it. With the model on its own thread, a
// procedure's phrases are sent to it before its rules run (tagProseLater), so that it tags while other rules run.
import type { Procedure } from '../../model/procedure.ts';
import { bareNumbers } from './bare-numbers.ts';
import { chainedImperatives, givesInstruction, startsWithActionVerb } from './imperatives.ts';
import { proseOf } from './prose-sites.ts';
import { tagAhead, tagAheadLater, taggedAheadReady } from './word-tags.ts';

const done = new WeakSet<Procedure>();

/** Asks, of the English model, what the writing rules will ask of one procedure's prose. */
function askAsTheRulesDo(procedure: Procedure): () => void {
  return () => {
    for (const site of proseOf(procedure)) {
      site.sentences.forEach((sentence, i) => {
        // What number-without-unit asks of every sentence.
        bareNumbers(sentence);
        // caution-holds-action (hazard texts), note-holds-action (notes), one-action-per-step and
        // step-starts-with-verb (step actions).
        if (site.role === 'hazard' || site.role === 'note' || (site.role === 'action' && i > 0)) givesInstruction(sentence);
        if (site.role === 'action') chainedImperatives(sentence);
        if (site.role === 'action' && i === 0) startsWithActionVerb(sentence);
      });
    }
  };
}

export function tagProseAhead(procedure: Procedure): void {
  if (done.has(procedure)) return;
  done.add(procedure);
  tagAhead(askAsTheRulesDo(procedure), procedure);
}

/**
 * Sends the procedure's phrases to the model's thread, when one runs, before any rule needs them: the thread tags
 * them while the main thread checks other files. tagProseAhead takes the answer. The answers are the same.
 */
export function tagProseLater(procedure: Procedure): void {
  if (done.has(procedure)) return;
  tagAheadLater(procedure, askAsTheRulesDo(procedure));
}

/**
 * Whether the writing rules can read the procedure's prose now without waiting for the model's thread: its phrases
 * have been tagged there, or none were sent. The answers are the same either way; only when they come differs.
 */
export function proseReady(procedure: Procedure): boolean {
  return done.has(procedure) || taggedAheadReady(procedure);
}
