// The register pages' data: the plant register the check read, one page model per entry with where it is used,
// and each entry's history from git (read once per site build).
import { resolve } from 'node:path';
import { registerPlace } from '../engine/register-place.ts';
import { openRepository } from '../engine/repository.ts';
import { registerHistory, revisedSince, type RegisterEntryRevision } from '../history/register-history.ts';
import { buildRegisterView, type RegisterView } from '../render/register-view.ts';
import { siteUrl } from '../render/site-url.ts';
import { sharedOn, siteManual, type LoadedManual } from './manual.ts';
import { historiesOf } from './history.ts';

export interface SiteRegister {
  view: RegisterView;
  /** Entry id → its revisions, newest first. */
  history: Map<string, RegisterEntryRevision[]>;
  /** Said on every register page when the history could not be read (no git, folder outside the repository). */
  historyNotice?: string;
  /** Number of commits that changed the register. */
  commits: number;
  uncommitted: boolean;
  /**
   * Entry id → for its newest change, each procedure that uses it and whether that procedure has had a new
   * revision since (committed in the same commit or later; for an uncommitted change, a new revision in the working copy).
   */
  impact: Map<string, Array<{ id: string; revised: boolean }>>;
}

let cached: { key: string; data: Promise<SiteRegister | undefined> } | undefined;

/** The plant register for the site, or undefined when the plant has none. */
export function siteRegister(): Promise<SiteRegister | undefined> {
  const key = `${process.env.STEPWRIGHT_CHECK_RUN ?? ''}\u0000${process.cwd()}\u0000${process.env.STEPWRIGHT_PROCEDURES ?? ''}\u0000${process.env.STEPWRIGHT_TODAY ?? ''}`;
  if (!cached || cached.key !== key) cached = { key, data: load() };
  return cached.data;
}

async function load(): Promise<SiteRegister | undefined> {
  const { loaded } = await siteManual();
  return registerOf(loaded);
}

/** The register's pages' data for this loaded manual, worked out once whoever asks first. */
export function registerOf(loaded: LoadedManual): Promise<SiteRegister | undefined> {
  return sharedOn(loaded, 'register', () => readRegister(loaded));
}

async function readRegister(loaded: LoadedManual): Promise<SiteRegister | undefined> {
  const manual = loaded.view!;
  const register = loaded.run.register;
  if (!register) return undefined;
  const view = buildRegisterView(register, loaded.result.files, manual, { href: (path) => siteUrl(loaded.base, path) });
  const absolute = resolve(loaded.cwd, register.folder);
  const repo = loaded.run.repo ?? openRepository({ cwd: loaded.cwd, env: process.env }, absolute);
  if (!repo) {
    return { view, history: new Map(), commits: 0, uncommitted: false, impact: new Map(), historyNotice: 'This manual was built outside a git checkout, so the register\'s earlier versions are not available.' };
  }
  const place = registerPlace(repo, absolute, loaded.cwd);
  if (place.folder === '..' || place.folder.startsWith('../')) {
    return { view, history: new Map(), commits: 0, uncommitted: false, impact: new Map(), historyNotice: `The register folder is outside the git repository at ${repo.root}, so its earlier versions are not available.` };
  }
  const history = await registerHistory(place, register);
  const procedureHistories = await historiesOf(loaded);
  const impact = new Map<string, Array<{ id: string; revised: boolean }>>();
  for (const entry of view.entries) {
    const newest = history.byEntry.get(entry.id)?.[0];
    if (!newest || newest.change === 'added') continue;
    impact.set(entry.id, entry.usedBy.map((u) => ({ id: u.procedure.id, revised: revisedSince(procedureHistories.get(u.procedure.id), newest) })));
  }
  return {
    view, history: history.byEntry, commits: history.commits, uncommitted: history.uncommitted, impact,
    ...(repo.shallow ? { historyNotice: 'This manual was built from a shallow clone: register changes older than the clone are not shown.' } : {}),
  };
}

