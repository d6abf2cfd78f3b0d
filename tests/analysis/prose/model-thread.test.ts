// The English model on a second thread (started by `stepwright check` when no result cache will answer) gives the
// same tags as the model loaded in the main thread, one phrase or many phrases ahead.
import fc from 'fast-check';
import { afterEach, describe, expect, it, vi } from 'vitest';

type WordTags = typeof import('../../../src/analysis/prose/word-tags.ts');
type ModelThread = typeof import('../../../src/analysis/prose/model-thread.ts');

// Each reading gets its own module (its own memo of answers), so that the second reading asks the model again.
async function freshModules(): Promise<{ tags: WordTags; thread: ModelThread }> {
  vi.resetModules();
  return {
    tags: await import('../../../src/analysis/prose/word-tags.ts'),
    thread: await import('../../../src/analysis/prose/model-thread.ts'),
  };
}

type Reading = { tags: string[][][]; onThread: boolean };
async function read(phrases: string[], onThread: boolean): Promise<Reading> {
  const { tags, thread } = await freshModules();
  thread.stopModelThread();
  if (onThread) thread.startModelThread();
  try {
    // Half of them tagged ahead as one document, the rest one by one.
    tags.tagAhead(() => phrases.slice(0, Math.ceil(phrases.length / 2)).forEach((p) => tags.tagsAt(p, 0)));
    const tagged = phrases.map((p) => p.split(' ').map((_, i) => [...tags.tagsAt(p, i)].sort()));
    return { tags: tagged, onThread: thread.modelThreadRunning() };
  } finally {
    thread.stopModelThread();
  }
}

const plantPhrases = [
  'Close the nitrogen valve XV-2102', 'Open the hot-oil supply', 'Check that P-211 runs', 'Start agitator M-210',
  'Vent the kettle to the scrubber', 'Record the time on form ARC-F-120', 'Do not open the hatch',
  'If the level is low, then stop the pump', 'Wait for the drum to cool', 'Isolate the feed', 'Purge the line with nitrogen',
];

afterEach(async () => {
  (await import('../../../src/analysis/prose/model-thread.ts')).stopModelThread();
});

describe('the English model on its own thread', () => {
  it('answers as the main thread does: tags of phrases alone and ahead', async () => {
    const here = await read(plantPhrases, false);
    const there = await read(plantPhrases, true);
    expect(here.onThread).toBe(false);
    // Still running after every answer: the answers came from the thread, not from a fallback.
    expect(there.onThread).toBe(true);
    expect(there.tags).toEqual(here.tags);
    expect(here.tags.flat().some((t) => t.includes('Verb'))).toBe(true);
  }, 60_000);

  it('answers as the main thread does for random phrases (property)', async () => {
    const word = fc.constantFrom('open', 'the', 'valve', 'slowly', 'pump', 'a', 'drum', 'to', 'cool', 'check', 'XV-201', '5', 'kPa', 'if', 'not', 'is', 'hot', 'resin', 'and', 'then', ',');
    const phrase = fc.array(word, { minLength: 1, maxLength: 7 }).map((w) => w.join(' '));
    await fc.assert(
      fc.asyncProperty(fc.array(phrase, { minLength: 1, maxLength: 12 }), async (phrases) => {
        const here = await read(phrases, false);
        const there = await read(phrases, true);
        expect(there.onThread).toBe(true);
        expect(there.tags).toEqual(here.tags);
      }),
      { numRuns: 15, seed: 1203 },
    );
  }, 120_000);

  it('tags phrases sent ahead while the main thread goes on, with the answers of the main thread', async () => {
    const here = await read(plantPhrases, false);
    const { tags, thread } = await freshModules();
    thread.startModelThread();
    const procedures = [{}, {}];
    const asks = [plantPhrases.slice(0, 6), plantPhrases.slice(6)].map((batch) => () => batch.forEach((p) => tags.tagsAt(p, 0)));
    // Both sent before either is asked for; the second answer is taken after the first.
    procedures.forEach((key, i) => tags.tagAheadLater(key, asks[i]));
    // Nothing is left to tag: every phrase's answer came from what was sent ahead.
    expect(procedures.map((key, i) => tags.tagAhead(asks[i], key))).toEqual([0, 0]);
    const tagged = plantPhrases.map((p) => p.split(' ').map((_, i) => [...tags.tagsAt(p, i)].sort()));
    expect(thread.modelThreadRunning()).toBe(true);
    expect(tagged).toEqual(here.tags);
    // A third procedure with the first one's phrases has nothing left to send; the rules then do not gather again.
    let asked = 0;
    const again = () => {
      asked++;
      asks[0]();
    };
    const third = {};
    tags.tagAheadLater(third, again);
    const gatheredAhead = asked;
    expect(tags.tagAhead(again, third)).toBe(0);
    expect(gatheredAhead).toBeGreaterThan(0);
    expect(asked).toBe(gatheredAhead);
    // Without a thread nothing is sent: tagging ahead does the work itself.
    const fresh = await freshModules();
    fresh.thread.stopModelThread();
    fresh.tags.tagAheadLater(procedures[0], asks[0]);
    const alone = () => plantPhrases.slice(0, 6).forEach((p) => fresh.tags.tagsAt(p, 0));
    expect(fresh.tags.tagAhead(alone, procedures[0])).toBe(6);
  }, 60_000);

  it('says, without waiting, whether the answer sent ahead has come', async () => {
    const { tags, thread } = await freshModules();
    thread.startModelThread();
    const key = {};
    const ask = () => plantPhrases.forEach((p) => tags.tagsAt(p, 0));
    // Nothing sent for a key: nothing to wait for.
    expect(tags.taggedAheadReady({})).toBe(true);
    tags.tagAheadLater(key, ask);
    // Just sent, while the thread still loads the model: not there yet, and asking does not wait for it.
    const asked = performance.now();
    expect(tags.taggedAheadReady(key)).toBe(false);
    expect(performance.now() - asked).toBeLessThan(50);
    // The answer comes in time while the main thread goes on; once it has, taking it tags nothing more.
    const deadline = Date.now() + 30_000;
    while (!tags.taggedAheadReady(key) && Date.now() < deadline) await new Promise((r) => setTimeout(r, 20));
    expect(tags.taggedAheadReady(key)).toBe(true);
    expect(tags.tagAhead(ask, key)).toBe(0);
    expect(thread.modelThreadRunning()).toBe(true);
    // A stopped thread keeps no one waiting.
    const other = {};
    tags.tagAheadLater(other, () => ['Start the pump', 'Stop the pump'].forEach((p) => tags.tagsAt(p, 0)));
    thread.stopModelThread();
    expect(tags.taggedAheadReady(other)).toBe(true);
  }, 60_000);

  it('once stopped, leaves the work to the main thread with the same answers', async () => {
    const { tags, thread } = await freshModules();
    thread.startModelThread();
    const first = [...tags.tagsAt('Open the hot-oil supply', 0)].sort();
    thread.stopModelThread();
    expect(thread.modelThreadRunning()).toBe(false);
    expect([...tags.tagsAt('Close the drain valve', 0)].sort()).toContain('Verb');
    expect(first).toContain('Verb');
  }, 60_000);
});
