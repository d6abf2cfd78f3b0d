// What the history keeps of each committed version of a procedure: its document control (revision, status, dates,
// approvals), the procedures its steps call, and a print of its content for telling which areas a commit changed.
// A plant's repository holds thousands of versions; keeping their whole readings (markdown trees, facts) cost
// seconds and gigabytes, and only the pages drawn for a revision need its whole reading (read from its text then).
import { readFrontMatter } from '../parse/read-source.ts';
import { buildProcedure } from '../model/build-procedure.ts';
import { holdsKeys } from '../model/validate.ts';
import type { Approval, Procedure } from '../model/procedure.ts';
import { callSitesOf } from '../analysis/inline-calls.ts';
import { contentPrint, type ContentPrint } from '../analysis/document-content.ts';

export interface VersionRecord {
  /** The `revision` number, or null when the file did not state a readable one. */
  revision: number | null;
  status: string;
  effective?: string;
  change?: string;
  approvals: Approval[];
  /** The ids of the procedures its steps call, in step order (each once). */
  calls: string[];
  content: ContentPrint;
}

/** The record of a version already read in full (by the check, say); null for a file that holds no procedure. */
export function recordOf(procedure: Procedure | null): VersionRecord | null {
  if (!procedure) return null;
  return {
    revision: Number.isFinite(procedure.revision) ? procedure.revision : null,
    status: procedure.status,
    ...(procedure.effective !== undefined ? { effective: procedure.effective } : {}),
    ...(procedure.change !== undefined ? { change: procedure.change } : {}),
    approvals: procedure.approvals,
    calls: [...new Set(callSitesOf(procedure).map((site) => site.callee))],
    content: contentPrint(procedure),
  };
}

/**
 * The record of a committed text, read from its front-matter alone: the same record as from its whole reading
 * (the model's document control and steps come from the front-matter; the content print reads the narrative's text).
 */
export function readVersionRecord(path: string, text: string): VersionRecord | null {
  const { data, bodyText } = readFrontMatter(path, text);
  // The narrative's tree is left empty: nothing in a record reads it.
  return holdsKeys(data) ? recordOf(buildProcedure(path, data, { type: 'root', children: [] }, bodyText)) : null;
}

const isText = (v: unknown): v is string => typeof v === 'string';
const isTextOrAbsent = (v: unknown) => v === undefined || typeof v === 'string';

/** A record of the shape this version writes (a record kept between runs is used only then). */
export function isVersionRecord(value: unknown): value is VersionRecord {
  if (!value || typeof value !== 'object') return false;
  const r = value as Record<string, unknown>;
  const content = r.content as Record<string, unknown> | undefined;
  return (r.revision === null || (typeof r.revision === 'number' && Number.isFinite(r.revision))) && isText(r.status)
    && isTextOrAbsent(r.effective) && isTextOrAbsent(r.change)
    && Array.isArray(r.approvals) && r.approvals.every((a) => {
      const x = a as Record<string, unknown> | null;
      return !!x && typeof x === 'object' && isText(x.role) && isText(x.name) && isText(x.date) && isText(x.meaning) && Array.isArray(x.path);
    })
    && Array.isArray(r.calls) && r.calls.every(isText)
    && !!content && typeof content === 'object' && isText(content.body)
    && Array.isArray(content.keys) && content.keys.every((k) => Array.isArray(k) && k.length === 2 && isText(k[0]) && isText(k[1]));
}
