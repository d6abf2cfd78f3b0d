// Reads every procedure's revisions from git once per site build, for the revision, redline and audit pages.
import { isAbsolute, resolve } from 'node:path';
import { readProcedure } from '../read/read-procedure.ts';
import type { Procedure } from '../model/procedure.ts';
import type { PlantRegister } from '../model/register.ts';
import { buildHistoryView, type HistoryView, type RevisionEntry } from '../history/history-view.ts';
import { revisionInForce } from '../history/in-force.ts';
import { readHistories } from '../history/revisions.ts';
import { isVersionRecord, readVersionRecord, recordOf, type VersionRecord } from '../history/version-record.ts';
import { commandCache } from '../engine/command-cache.ts';
import { cacheKey } from '../check/result-cache.ts';
import { buildProcedureView, type ProcedureView } from '../render/manual.ts';
import { sharedOn, siteManual, type LoadedManual } from './manual.ts';
import { openRepository, repoPath } from '../engine/repository.ts';

let cached: { key: string; histories: Promise<Map<string, HistoryView>> } | undefined;

/** Procedure id → its history. Outside a git checkout every history is empty and says why. */
export function siteHistory(): Promise<Map<string, HistoryView>> {
  const key = `${process.env.STEPWRIGHT_CHECK_RUN ?? ''}\u0000${process.cwd()}\u0000${process.env.STEPWRIGHT_PROCEDURES ?? ''}\u0000${process.env.STEPWRIGHT_TODAY ?? ''}`;
  if (!cached || cached.key !== key) cached = { key, histories: loadHistories() };
  return cached.histories;
}

async function loadHistories(): Promise<Map<string, HistoryView>> {
  const { loaded } = await siteManual();
  return historiesOf(loaded);
}

/** Every procedure's history for this loaded manual, read from git once whoever asks first. */
export function historiesOf(loaded: LoadedManual): Promise<Map<string, HistoryView>> {
  return sharedOn(loaded, 'histories', () => readAllHistories(loaded));
}

async function readAllHistories(loaded: LoadedManual): Promise<Map<string, HistoryView>> {
  const view = loaded.view!;
  const io = { cwd: loaded.cwd, env: loaded.env ?? process.env };
  // History comes from the repository that holds the procedures (the check run has opened it already).
  const repo = loaded.run.repo ?? openRepository(io, loaded.root);
  const out = new Map<string, HistoryView>();
  const identity = (p: ProcedureView) => ({ id: p.id, slug: p.slug, currentRevision: p.revision, currentStatus: p.status, currentEffective: p.effective, url: p.url, today: loaded.today });
  if (!repo) {
    for (const p of view.procedures) {
      out.set(p.id, buildHistoryView({ path: p.file, revisions: [], shallow: false, notice: 'This manual was built outside a git checkout, so no earlier revisions are available.' }, identity(p)));
    }
    return out;
  }
  // A committed text the check has already read (usually the last commit's) is not read again; the others are read
  // for their record alone (their front-matter), and in full only should a page be drawn from them.
  const checked = new Map(loaded.result.files.flatMap((f) => (f.source ? [[f.source.text, f.procedure] as const] : [])));
  const read = (path: string, text: string) => (checked.has(text) ? recordOf(checked.get(text)!) : readVersionRecord(path, text));
  // The records of a file's versions are kept in the result cache, by the Stepwright code and every version's name and
  // text: a rebuild reads none of them again, and a new commit reads that one file's versions.
  const cache = commandCache(io, undefined);
  const readVersions = (path: string, versions: ReadonlyArray<{ path: string; text: string }>): Array<VersionRecord | null> => {
    const key = cache && cacheKey([cache.code, 'version-records', path, ...versions.flatMap((v) => [v.path, v.text])]);
    const kept = key === undefined ? undefined : cache!.store.get<unknown>(key);
    if (Array.isArray(kept) && kept.length === versions.length && kept.every((r) => r === null || isVersionRecord(r))) return kept as Array<VersionRecord | null>;
    const records = versions.map((v) => read(v.path, v.text));
    if (key !== undefined) cache!.store.set(key, records);
    return records;
  };
  const texts = new Map(loaded.inputs.flatMap((i) => ('text' in i ? [[i.file, i.text] as const] : [])));
  const all = view.procedures.map((p) => ({ p, path: repoPath(repo, resolve(io.cwd, p.file)), workingText: texts.get(p.file) }));
  // A procedures folder outside the repository has no history in it; git is not asked about it.
  const outside = (path: string) => path === '..' || path.startsWith('../') || isAbsolute(path);
  const files = all.filter((f) => !outside(f.path));
  for (const { p } of all.filter((f) => outside(f.path))) {
    out.set(p.id, buildHistoryView({ path: p.file, revisions: [], shallow: false, notice: `This procedure file is outside the git repository at ${repo.root}, so no earlier revisions are available.` }, identity(p)));
  }
  // One pass over git for every procedure's history.
  const histories = await readHistories(repo.git, files, { read, readVersions });
  await cache?.store.flush();
  for (const { p, path } of files) out.set(p.id, buildHistoryView(histories.get(path)!, identity(p)));
  return out;
}

/** One committed revision of a procedure, with the revision before it: what a revision or redline page shows. */
export interface RevisionPage { p: ProcedureView; entry: RevisionEntry; before?: RevisionEntry; history: HistoryView }

/** Every committed revision of every procedure in the manual, oldest first per procedure. */
export async function siteRevisions(): Promise<RevisionPage[]> {
  const { view } = await siteManual();
  const histories = await siteHistory();
  return view.procedures.flatMap((p) => {
    const history = histories.get(p.id);
    if (!history) return [];
    return history.revisions.map((entry, i) => ({ p, entry, before: history.revisions[i - 1], history }));
  });
}

/**
 * The model of a committed revision, read in full from its text (once per build, whichever page asks), against the
 * plant register as the check reads a previous version: a revision that takes its trips, limits and signals from the
 * register shows them, and moving a declaration into the register is not shown as taking it away.
 */
export function committedProcedure(entry: Pick<RevisionEntry, 'path' | 'text'>, register: PlantRegister | undefined): Procedure | null {
  return readCommitted(entry.path, entry.text, register).procedure;
}

/** The same page model as the current procedure page, built from a committed revision's text. */
export async function revisionPageView(entry: RevisionEntry): Promise<ProcedureView | undefined> {
  const { loaded } = await siteManual();
  return revisionView(entry, loaded.root, loaded.today, loaded.base, loaded.run.register);
}

// Committed texts are read once per build, whichever page asks (the procedure page of an earlier revision in force,
// its newer revision's page, the revision and redline pages): keyed by the register read against and the content,
// never by position.
const withoutRegister = {};
const committedReads = new WeakMap<object, Map<string, ReturnType<typeof readProcedure>>>();
const committedViews = new WeakMap<object, Map<string, ProcedureView | undefined>>();
const maxRemembered = 20_000;

function remembered<T>(maps: WeakMap<object, Map<string, T>>, register: PlantRegister | undefined): Map<string, T> {
  const owner = register ?? withoutRegister;
  let map = maps.get(owner);
  if (!map) maps.set(owner, (map = new Map()));
  if (map.size >= maxRemembered) map.clear();
  return map;
}

function readCommitted(path: string, text: string, register: PlantRegister | undefined): ReturnType<typeof readProcedure> {
  const reads = remembered(committedReads, register);
  const key = `${path}\u0000${text}`;
  let read = reads.get(key);
  if (!read) {
    read = readProcedure(path, text, register);
    reads.set(key, read);
  }
  return read;
}

function revisionView(entry: RevisionEntry, root: string, today: string, base: string, register: PlantRegister | undefined): ProcedureView | undefined {
  const views = remembered(committedViews, register);
  const key = `${root}\u0000${today}\u0000${base}\u0000${entry.path}\u0000${entry.text}`;
  if (views.has(key)) return views.get(key);
  const read = readCommitted(entry.path, entry.text, register);
  const view = read.procedure
    ? buildProcedureView({ file: entry.path, source: read.source, procedure: read.procedure, facts: read.facts, diagnostics: [] }, root, today, register, base)
    : undefined;
  views.set(key, view);
  return view;
}

/** What a procedure's own page and the home page show: the revision in force, and a newer one not yet in force. */
export interface InForcePage {
  /** `newest`: the file as it reads now is in force; `earlier`: a committed earlier revision is; `none`: nothing is. */
  state: 'newest' | 'earlier' | 'none';
  /** The page model of the revision in force; for a superseded or retired procedure, its record under a DO NOT USE banner. */
  shown?: ProcedureView;
  /** The newer revision that is not in force yet, with the URL of its own page. */
  newer?: { view: ProcedureView; url: string };
  /** Why nothing is in force, in plain words. */
  reason?: string;
  /** The committed revision shown, when it is an earlier one. */
  entry?: RevisionEntry;
}

let inForceCache: { key: string; pages: Promise<Map<string, InForcePage>> } | undefined;

/** Procedure id → what its page shows; read once per build with the histories. */
export function siteInForce(): Promise<Map<string, InForcePage>> {
  const key = `${process.env.STEPWRIGHT_CHECK_RUN ?? ''}\u0000${process.cwd()}\u0000${process.env.STEPWRIGHT_PROCEDURES ?? ''}\u0000${process.env.STEPWRIGHT_TODAY ?? ''}`;
  if (!inForceCache || inForceCache.key !== key) inForceCache = { key, pages: loadInForce() };
  return inForceCache.pages;
}

async function loadInForce(): Promise<Map<string, InForcePage>> {
  const { loaded, view } = await siteManual();
  const histories = await siteHistory();
  const out = new Map<string, InForcePage>();
  for (const p of view.procedures) out.set(p.id, inForcePage(p, histories.get(p.id), loaded.today, loaded.root, loaded.base, loaded.run.register));
  return out;
}

/** The in-force decision for one procedure, as page models. */
export function inForcePage(p: ProcedureView, history: HistoryView | undefined, today: string, root = 'procedures', base = '/', register?: PlantRegister): InForcePage {
  const decision = revisionInForce({ revision: p.revision, status: p.status, effective: p.effective }, history?.revisions ?? [], today);
  const newer = { view: p, url: `${p.url}next/` };
  if (decision.state === 'newest') return { state: 'newest', shown: p };
  // A superseded or retired procedure keeps its record page under its DO NOT USE banner.
  if (decision.state === 'none' && (p.status === 'retired' || p.status === 'superseded')) return { state: 'none', reason: decision.reason, shown: p };
  if (decision.state === 'none') return { state: 'none', reason: decision.reason, newer };
  const earlier = revisionView(decision.entry, root, today, base, register);
  if (!earlier) {
    return { state: 'none', newer, reason: `Revision ${decision.entry.revision} is in force, but its committed text cannot be read; ask the procedure owner for the controlled copy. Revision ${p.revision} is ${p.status} and not for use.` };
  }
  // The page of the revision in force keeps the procedure's own URL and its tag links.
  return { state: 'earlier', entry: decision.entry, shown: { ...earlier, url: p.url, slug: p.slug, tags: earlier.tags.map((t) => p.tags.find((x) => x.tag === t.tag) ?? t) }, newer };
}
