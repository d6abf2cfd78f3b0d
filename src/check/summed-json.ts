// A small JSON file kept in the cache folder with the SHA-256 of its body beside it, written whole (to a temporary
// name, then renamed): a file cut short, garbled or edited by hand is read as no file at all.
import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';

const sumOf = (body: string) => createHash('sha256').update(body).digest('hex');

/** The value written to `file`, or undefined when there is none or it cannot be trusted. */
export function readSummedJson(file: string): unknown {
  try {
    const stored = JSON.parse(readFileSync(file, 'utf8')) as { sum?: unknown; body?: unknown };
    if (typeof stored.body !== 'string' || stored.sum !== sumOf(stored.body)) return undefined;
    return JSON.parse(stored.body) as unknown;
  } catch {
    return undefined;
  }
}

/** Writes `value` to `file` whole; throws when it cannot (the caller decides what a missing file costs). */
export function writeSummedJson(file: string, value: unknown): void {
  const body = JSON.stringify(value);
  mkdirSync(dirname(file), { recursive: true });
  const temporary = `${file}.tmp-${process.pid}`;
  writeFileSync(temporary, JSON.stringify({ sum: sumOf(body), body }));
  renameSync(temporary, file);
}
