// Temporary folders for tests, made in the system's temporary folder and removed when their test file ends
// (tests/remove-temp-folders.ts runs before every test file and registers that), so a run leaves none behind.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const made: string[] = [];

export function tempFolder(prefix: string): string {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  made.push(dir);
  return dir;
}

export function removeTempFolders(): void {
  for (const dir of made.splice(0)) rmSync(dir, { recursive: true, force: true });
}
