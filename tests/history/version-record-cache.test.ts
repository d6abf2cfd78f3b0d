// The records of a file's committed versions are kept in the result cache: a build reads them from there, and an
// entry that does not hold records of the shape this version writes is refused and read afresh, never trusted.
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadManual } from '../../src/site-data/manual.ts';
import { historiesOf } from '../../src/site-data/history.ts';
import { tempFolder } from '../temp-folder.ts';
import { buildStory, createTempRepo, type TempRepo } from './temp-repo.ts';

let repo: TempRepo;
let cache: string;

beforeAll(() => {
  repo = createTempRepo();
  buildStory(repo);
  cache = tempFolder('stepwright-record-cache-');
});
afterAll(() => repo.remove());

async function history() {
  const loaded = await loadManual({ cwd: repo.dir, env: { STEPWRIGHT_TODAY: '2026-03-02', STEPWRIGHT_PROCEDURES: 'procedures', STEPWRIGHT_CACHE: cache } });
  return (await historiesOf(loaded)).get('U2-TEST-001')!;
}

/** The cache's entries that hold a list of version records, with a way to write one back with a valid sum. */
function recordEntries() {
  const files = readdirSync(cache, { recursive: true }).map(String).filter((f) => f.endsWith('.json')).map((f) => join(cache, f));
  return files.flatMap((file) => {
    const entry = JSON.parse(readFileSync(file, 'utf8')) as { format: string; key: string; sum: string; value: unknown };
    const isRecords = Array.isArray(entry.value) && entry.value.length > 0 && entry.value.every((r) => r && typeof r === 'object' && 'content' in r);
    if (!isRecords) return [];
    return [{
      records: entry.value as Array<Record<string, unknown>>,
      write(value: unknown) {
        const body = JSON.stringify(value);
        writeFileSync(file, JSON.stringify({ ...entry, sum: createHash('sha256').update(body).digest('hex'), value }));
      },
    }];
  });
}

describe('records of committed versions in the result cache', () => {
  it('are kept once read, and a second build takes the history from them', async () => {
    const first = await history();
    expect(first.revisions.map((r) => r.revision)).toEqual([1, 2]);
    const [entry] = recordEntries();
    // One entry for the file: its six commits, oldest first.
    expect(recordEntries()).toHaveLength(1);
    expect(entry.records.map((r) => r.status)).toEqual(['draft', 'effective', 'draft', 'draft', 'effective', 'effective']);
    expect(JSON.stringify(await history())).toBe(JSON.stringify(first));
    // What the entry says is what the history shows: a kept status is read from it, not from the text.
    entry.write(entry.records.map((r, i) => (i === 0 ? { ...r, status: 'in-review' } : r)));
    expect((await history()).audit[0].status).toBe('in-review');
  });

  it('refuses an entry of another shape or length, and reads the versions again', async () => {
    const fresh = async () => {
      // What a build with no cache finds.
      const loaded = await loadManual({ cwd: repo.dir, env: { STEPWRIGHT_TODAY: '2026-03-02', STEPWRIGHT_PROCEDURES: 'procedures', STEPWRIGHT_CACHE: 'off' } });
      return JSON.stringify((await historiesOf(loaded)).get('U2-TEST-001'));
    };
    const expected = await fresh();
    for (const alter of [
      (records: Array<Record<string, unknown>>) => records.map(({ content: _content, ...rest }) => rest),
      (records: Array<Record<string, unknown>>) => records.slice(1),
      (records: Array<Record<string, unknown>>) => records.map((r) => ({ ...r, revision: 'two' })),
      (records: Array<Record<string, unknown>>) => records.map((r) => ({ ...r, approvals: [{ name: 'Ada Ferrand' }] })),
    ]) {
      const [entry] = recordEntries();
      entry.write(alter(entry.records));
      expect(JSON.stringify(await history())).toBe(expected);
    }
  });
});
