// Procedures that were approved or in force at a base and that the working tree no longer holds under any name:
// deleted where they should have been retired. Their revisions, their audit trail and the procedures that name them
// go with the file, so a review must see the deletion as a finding of its own.
import { changedPaths, frontMatterScalar, procedureIdIn, resolveCommit } from './previous-version.ts';
import { showFiles, type Git } from './git.ts';
import type { Diagnostic } from '../parse/diagnostic.ts';

export interface DeletedProcedure {
  /** Its path at the base, relative to the repository root. */
  path: string;
  id: string;
  status: string;
  revision?: string;
}

/** The statuses a procedure may not be deleted from: it was approved or in force. */
export const inForceAtBase: ReadonlySet<string> = new Set(['approved', 'effective']);

/**
 * The procedures under `folders` (paths relative to the repository root) deleted since `base` (the working tree
 * included) that were approved or effective there and whose id no file of the run holds now (a moved file keeps it).
 */
export async function deletedInForce(git: Git, base: string, folders: string[], idsNow: ReadonlySet<string>): Promise<DeletedProcedure[]> {
  const commit = await resolveCommit(git, base);
  const changes = changedPaths(await git(['diff', '--name-status', '-M', '-z', commit, '--', ...folders]));
  const deleted = changes.filter((c) => c.status === 'D' && /\.md$/i.test(c.path)).map((c) => c.path);
  if (!deleted.length) return [];
  const texts = await showFiles(git, deleted.map((path) => `${commit}:${path}`));
  const out: DeletedProcedure[] = [];
  for (const path of deleted) {
    const text = texts.get(`${commit}:${path}`) ?? '';
    const id = procedureIdIn(text);
    const status = frontMatterScalar(text, 'status');
    if (!id || !status || !inForceAtBase.has(status) || idsNow.has(id)) continue;
    out.push({ path, id, status, revision: frontMatterScalar(text, 'revision') });
  }
  return out;
}

/** The error for a deleted procedure, at its path as the user sees it (`file`); `base` as the user named it. */
export function deletedProcedureError(d: DeletedProcedure, base: string, file: string): Diagnostic {
  return {
    file, line: 1, column: 1, endLine: 1, endColumn: 1, severity: 'error', rule: 'procedure-deleted',
    message: `${d.id}${d.revision ? ` (revision ${d.revision})` : ''} was ${d.status} at ${base} and its file is deleted: a procedure that was approved or in force is kept, with status retired or superseded, so that its revisions, its audit trail and the procedures that name it stay readable.`,
    hint: `Restore the file (git checkout ${base} -- ${d.path}), then give it a new revision with status retired (or superseded, naming what replaces it in its change note).`,
  };
}
