// Lookups the procedure pages make, built once per check run instead of a scan of every file on every page
// (a scan per page makes a 2,000-page build quadratic): the checked file, the model and the page of a procedure
// by its id, and who calls whom.
import type { CheckedFile } from '../check/run-checks.ts';
import type { Procedure } from '../model/procedure.ts';
import type { ManualView, ProcedureView } from '../render/manual.ts';
import { indexCalls, type CallIndex } from '../render/call-links-view.ts';

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

// On globalThis, not in a module variable: the pages run from Astro's own bundle of this module, and the build works
// out which pages to draw with this one; both take the same index of one run (at 2,000 procedures it takes a fifth
// of a second to make).
const builtSlot = Symbol.for('stepwright.site-data.manual-index');
const built: WeakMap<object, { view: ManualView; index: ManualIndex }> = ((globalThis as Record<symbol, unknown>)[builtSlot] as WeakMap<object, { view: ManualView; index: ManualIndex }> | undefined)
  ?? ((globalThis as Record<symbol, unknown>)[builtSlot] = new WeakMap());

/** The index of one check run and its view; the same objects give the same index. */
export function manualIndex(result: { files: CheckedFile[] }, view: ManualView): ManualIndex {
  const known = built.get(result);
  if (known && known.view === view) return known.index;
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
  const index: ManualIndex = {
    fileOf: (id) => files.get(id),
    procedureOf: (id) => byId.get(id),
    viewOf: (id) => views.get(id),
    procedures,
    calls: indexCalls(procedures),
  };
  built.set(result, { view, index });
  return index;
}
