// A file a command writes where the user names it (`schema --out`, `review --output`). It is written only where
// nothing of the user's is lost: a new or empty file, or one the same command wrote before (recognised by how that output
// starts). Anything else at that path — a procedure, the configuration, notes — is left as it is, and the command
// says so.
import { mkdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { dirname, relative } from 'node:path';
import { UsageError } from '../engine/usage-error.ts';

export interface OutputKind {
  /** What the command writes, for the message: "a JSON Schema written by 'stepwright schema'". */
  what: string;
  /** Whether a file already there is an earlier output of the same kind. */
  isOwn(existing: string): boolean;
}

/** Writes `text` to `target` (absolute), refusing a folder or a file that is not an earlier output of this kind. */
export function writeOutputFile(target: string, text: string, cwd: string, kind: OutputKind): void {
  const shown = relative(cwd, target) || target;
  const there = statSync(target, { throwIfNoEntry: false });
  if (there?.isDirectory()) throw new UsageError(`'${shown}' is a folder; give a file name.`);
  if (there) {
    let existing = '';
    try {
      existing = readFileSync(target, 'utf8');
    } catch {
      // Unreadable: not recognised as an earlier output.
    }
    // An empty file (one a CI runner made for the summary, say) holds nothing to lose.
    if (existing.trim() !== '' && !kind.isOwn(existing)) {
      throw new UsageError(`'${shown}' already exists and is not ${kind.what}; it was left as it is. Give another file name, or move that file away first.`);
    }
  }
  mkdirSync(dirname(target), { recursive: true });
  writeFileSync(target, text);
}
