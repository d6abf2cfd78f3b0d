// A small summary of one checked file, kept with its cached diagnostics: what a later run needs to know about the
// file without reading it again (its identity, what it calls and requires, whether it waives anything).
import type { Procedure } from '../model/procedure.ts';
import { callSitesOf } from '../analysis/inline-calls.ts';
import { walkSteps } from '../model/walk-steps.ts';

export interface FileSummary {
  /** Null when the front-matter could not be read as a procedure. */
  id: string | null;
  title: string | null;
  kind: string | null;
  revision: number | null;
  status: string | null;
  /** Ids of the procedures its steps call. */
  calls: string[];
  /** Ids of the procedures that must have been completed first. */
  requires: string[];
  /** Register ids it uses, as written. */
  uses: string[];
  /** Whether any step waives a rule (then its diagnostics need the source to be placed). */
  waivers: boolean;
}

export function summarise(procedure: Procedure | null): FileSummary {
  if (!procedure) return { id: null, title: null, kind: null, revision: null, status: null, calls: [], requires: [], uses: [], waivers: false };
  return {
    id: typeof procedure.id === 'string' ? procedure.id : null,
    title: typeof procedure.title === 'string' ? procedure.title : null,
    kind: typeof procedure.kind === 'string' ? procedure.kind : null,
    revision: Number.isFinite(procedure.revision) ? procedure.revision : null,
    status: typeof procedure.status === 'string' ? procedure.status : null,
    calls: [...new Set(callSitesOf(procedure).map((c) => String(c.callee)))],
    requires: procedure.requires.map((r) => String(r.value)),
    uses: procedure.uses.map((u) => String(u.value)),
    waivers: walkSteps(procedure.steps).some(({ step }) => (step.waivers?.length ?? 0) > 0),
  };
}

/** Whether a value read back from the cache has the summary's shape (anything else is refused). */
export function isFileSummary(value: unknown): value is FileSummary {
  if (!value || typeof value !== 'object') return false;
  const v = value as Record<string, unknown>;
  const textOrNull = (x: unknown) => x === null || typeof x === 'string';
  const texts = (x: unknown) => Array.isArray(x) && x.every((t) => typeof t === 'string');
  return textOrNull(v.id) && textOrNull(v.title) && textOrNull(v.kind) && textOrNull(v.status)
    && (v.revision === null || typeof v.revision === 'number')
    && texts(v.calls) && texts(v.requires) && texts(v.uses) && typeof v.waivers === 'boolean';
}
