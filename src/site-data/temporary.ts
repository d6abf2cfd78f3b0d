// Temporary procedures in force over other procedures (document control), as the pages show them: on each
// modified procedure's page and on the procedure list, with the temporary procedure's end date and link.
import { temporaryProceduresInForce } from '../analysis/document-control.ts';
import { siteManual } from './manual.ts';

export interface TemporaryNotice {
  id: string;
  title: string;
  url?: string;
  /** The end date (YYYY-MM-DD); a temporary procedure without one is an error the check reports. */
  expires?: string;
  /** The procedures it modifies, with their pages. */
  modifies: Array<{ id: string; title?: string; url?: string }>;
}

type SiteTemporaries = { byProcedure: Map<string, TemporaryNotice[]>; all: TemporaryNotice[] };

/** Worked out once per check run and view: every procedure page asks (once per page, a scan of every file). */
const worked = new WeakMap<object, { view: object; temporaries: SiteTemporaries }>();

/** Modified procedure id → the temporary procedures in force over it, on the build date. */
export async function siteTemporaries(): Promise<SiteTemporaries> {
  const { loaded, view } = await siteManual();
  const known = worked.get(loaded);
  if (known && known.view === view) return known.temporaries;
  const temporaries = temporariesOf(loaded, view);
  worked.set(loaded, { view, temporaries });
  return temporaries;
}

export function temporariesOf(loaded: Awaited<ReturnType<typeof siteManual>>['loaded'], view: Awaited<ReturnType<typeof siteManual>>['view']): SiteTemporaries {
  const procedures = loaded.result.files.flatMap((f) => (f.procedure ? [f.procedure] : []));
  const inForce = temporaryProceduresInForce(procedures, loaded.today);
  const viewOf = new Map(view.procedures.map((p) => [p.id, p]));
  const notices = new Map<string, TemporaryNotice>();
  const byProcedure = new Map<string, TemporaryNotice[]>();
  for (const [target, temporaries] of inForce) {
    for (const t of temporaries) {
      let notice = notices.get(t.id);
      if (!notice) {
        notice = { id: t.id, title: t.title, url: viewOf.get(t.id)?.url, ...(t.expires ? { expires: t.expires } : {}), modifies: [] };
        notices.set(t.id, notice);
      }
      notice.modifies.push({ id: target, title: viewOf.get(target)?.title, url: viewOf.get(target)?.url });
      byProcedure.set(target, [...(byProcedure.get(target) ?? []), notice]);
    }
  }
  return { byProcedure, all: [...notices.values()].sort((a, b) => a.id.localeCompare(b.id)) };
}
