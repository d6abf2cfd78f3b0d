// Reads every procedure's revisions from git once per site build, for the revision, redline and audit pages.
import { resolve } from 'node:path';
import { readProcedure } from '../check/run-checks.ts';
import { buildHistoryView, type HistoryView, type RevisionEntry } from '../history/history-view.ts';
import { readHistory } from '../history/revisions.ts';
import { buildProcedureView, type ProcedureView } from '../render/manual.ts';
import { siteManual } from './load-manual.ts';
import { openRepository, repoPath } from './repository.ts';

let cached: { key: string; histories: Promise<Map<string, HistoryView>> } | undefined;

/** Procedure id → its history. Outside a git checkout every history is empty and says why. */
export function siteHistory(): Promise<Map<string, HistoryView>> {
  const key = `${process.cwd()}\u0000${process.env.STEPWRIGHT_PROCEDURES ?? ''}\u0000${process.env.STEPWRIGHT_TODAY ?? ''}`;
  if (!cached || cached.key !== key) cached = { key, histories: loadHistories() };
  return cached.histories;
}

async function loadHistories(): Promise<Map<string, HistoryView>> {
  const { loaded, view } = siteManual();
  const io = { cwd: process.cwd(), env: process.env };
  const repo = await openRepository(io);
  const out = new Map<string, HistoryView>();
  await Promise.all(view.procedures.map(async (p) => {
    const input = loaded.inputs.find((i) => i.file === p.file);
    const text = input && 'text' in input ? input.text : undefined;
    const identity = { id: p.id, slug: p.slug, currentRevision: p.revision, currentStatus: p.status };
    if (!repo) {
      out.set(p.id, buildHistoryView({ path: p.file, revisions: [], shallow: false, notice: 'This manual was built outside a git checkout, so no earlier revisions are available.' }, identity));
      return;
    }
    const history = await readHistory(repo.git, repoPath(repo, resolve(io.cwd, p.file)), text);
    out.set(p.id, buildHistoryView(history, identity));
  }));
  return out;
}

/** The same page model as the current procedure page, built from a committed revision's text. */
export function revisionPageView(entry: RevisionEntry): ProcedureView | undefined {
  const { loaded } = siteManual();
  const read = readProcedure(entry.path, entry.text);
  if (!read.procedure) return undefined;
  return buildProcedureView({ file: entry.path, source: read.source, procedure: read.procedure, facts: read.facts, diagnostics: [] }, loaded.root, loaded.today);
}
