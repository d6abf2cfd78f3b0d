// Lookups the procedure pages make, built once per check run instead of a scan of every file on every page
// (a scan per page makes a 2,000-page build quadratic): the checked file, the model and the page of a procedure
// by its id, and who calls whom.
import type { CheckedFile } from '../check/run-checks.ts';
import type { Procedure } from '../model/procedure.ts';
import type { ManualView, ProcedureView } from '../render/manual.ts';
import { indexCalls, type CallIndex } from '../render/call-links-view.ts';
import { sharedOn, type LoadedManual } from './manual.ts';

export interface ManualIndex {
  /** The checked file of a procedure id (the first, as a scan would find it). */
  fileOf(id: string): CheckedFile | undefined;
  procedureOf(id: string): Procedure | undefined;
  /** The page model of a procedure id in the manual view. */
  viewOf(id: string): ProcedureView | undefined;
  /** Every procedure that could be read, in file order. */
  procedures: Procedure[];
  calls: CallIndex;
}

/**
 * The index of one loaded manual and its view, made once whether the build (keying its pages) or the pages ask
 * first (at 2,000 procedures it takes a fifth of a second to make).
 */
export function manualIndex(loaded: Pick<LoadedManual, 'result' | 'shared'>, view: ManualView): ManualIndex {
  const known = sharedOn(loaded, 'manual-index', () => ({ view, index: indexOf(loaded.result, view) }));
  return known.view === view ? known.index : indexOf(loaded.result, view);
}

function indexOf(result: { files: CheckedFile[] }, view: ManualView): ManualIndex {
  const files = new Map<string, CheckedFile>();
  const procedures: Procedure[] = [];
  const byId = new Map<string, Procedure>();
  for (const f of result.files) {
    const procedure = f.procedure;
    if (!procedure) continue;
    procedures.push(procedure);
    if (!files.has(procedure.id)) files.set(procedure.id, f);
    if (!byId.has(procedure.id)) byId.set(procedure.id, procedure);
  }
  const views = new Map<string, ProcedureView>();
  for (const v of view.procedures) if (!views.has(v.id)) views.set(v.id, v);
  return {
    fileOf: (id) => files.get(id),
    procedureOf: (id) => byId.get(id),
    viewOf: (id) => views.get(id),
    procedures,
    calls: indexCalls(procedures),
  };
}
