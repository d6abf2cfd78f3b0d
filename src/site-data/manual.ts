// The data the site's pages are made from: one check run (the same run as `stepwright check`, through the
// engine) and the manual view built from it. The pages import only from this folder.
//
// `stepwright build` runs the check once, then hands the result to the pages in the same process
// (handOffManual): the pages never check again. Only the dev server without a build (live preview) runs the
// check itself, again after every save.
import { resolve } from 'node:path';
import type { CheckResult, SourceInput } from '../check/run-checks.ts';
import { runCheckRun, type CheckRun } from '../engine/check-run.ts';
import { proceduresFolder } from '../engine/project.ts';
import { displayPath } from '../engine/find-procedure-files.ts';
import { buildManualView, type ManualView } from '../render/manual.ts';
import { formatHuman, summarize } from '../render/format-diagnostics.ts';
import { normalizeBase, pageFolder, rootBase, type SiteBase } from '../render/site-url.ts';
import { procedureStamp, tolerantManualView } from './dev-manual.ts';
import { forgetRuleAnalyses } from '../analysis/rule-memo.ts';
import { livePreviewVariable, siteBaseVariable } from './site-mode.ts';

export { buildDate } from '../engine/check-run.ts';

export interface LoadedManual {
  /** The working folder the procedure file names are relative to. */
  cwd: string;
  /** The environment the manual was loaded with (the result cache folder, git's own settings). */
  env?: Record<string, string | undefined>;
  root: string;
  today: string;
  /** Where the build date came from, shown in the site footer. */
  todaySource: 'STEPWRIGHT_TODAY' | 'last commit' | 'procedure dates';
  inputs: SourceInput[];
  result: CheckResult;
  errors: number;
  /** The whole check run (configuration, skipped files, repository). */
  run: CheckRun;
  /** Where the manual is served ("/" or e.g. "/manual/"); the view's URLs start with it. */
  base: SiteBase;
  /** Present when the check found no errors. */
  view?: ManualView;
  /**
   * Page folders ("procedures/r-101", "tags/k-210", "rules/…") whose pages the build takes from its last output instead
   * of drawing them again, because nothing they are made from has changed (see cli/page-reuse.ts). Their pages are
   * left out of the page lists.
   */
  reusedPages?: ReadonlySet<string>;
  /** Data worked out once per run for every page, whichever copy of the site's modules asks first (see `sharedOn`). */
  shared?: Map<string, unknown>;
}

/**
 * Worked out once per loaded manual, whether the build command or the pages ask first. A build's pages import this
 * folder as it is (site/engine-outside.ts), but the live preview runs them from Vite's own copy of it, where a
 * module's own memo would read git or build views a second time.
 */
export function sharedOn<T>(loaded: Pick<LoadedManual, 'shared'>, name: string, make: () => T): T {
  loaded.shared ??= new Map();
  if (!loaded.shared.has(name)) loaded.shared.set(name, make());
  return loaded.shared.get(name) as T;
}

/** The items whose pages this build draws: all but those whose page folder (a site path, e.g. "/tags/k-210/") it reuses. */
export function pagesToDraw<T>(loaded: Pick<LoadedManual, 'reusedPages'>, items: T[], pathOf: (item: T) => string): T[] {
  const reused = loaded.reusedPages;
  return reused && reused.size > 0 ? items.filter((item) => !reused.has(pageFolder(pathOf(item)))) : items;
}

export interface LoadOptions {
  cwd: string;
  env: Record<string, string | undefined>;
  /** Read git history for the history rules (default true), as `stepwright check` does. */
  history?: boolean;
  /** Where the manual is served (default "/"). */
  base?: SiteBase;
}

/** The procedures folder of a build (`stepwright build` hands its choice to the pages in $STEPWRIGHT_PROCEDURES and $STEPWRIGHT_CONFIG). */
export function manualFolder(options: { cwd: string; env: Record<string, string | undefined> }): string {
  // Named as the check names its files (relative inside the working folder, else absolute): the pages take a
  // procedure's area from its path under this folder, the same whether the folder was given relative or absolute.
  return displayPath(resolve(options.cwd, proceduresFolder(options, { config: options.env.STEPWRIGHT_CONFIG || undefined })), options.cwd);
}

/** Reads and checks the procedures folder for a site build: the engine's check run, dated by the build date. */
export async function loadManual(options: LoadOptions): Promise<LoadedManual> {
  const root = manualFolder(options);
  const run = await runCheckRun({
    cwd: options.cwd, env: options.env, paths: [root], config: options.env.STEPWRIGHT_CONFIG || undefined,
    date: 'build', history: options.history === false ? false : {},
  });
  // The pages keep every procedure but never read what only the rules did (prose, sequence, decisions, plant
  // state): let that go before the pages are built.
  forgetRuleAnalyses();
  // Nor positions in the front-matters (every diagnostic has its position by now): a file read by the check keeps
  // no table of its nodes through the build (one is made again, the same, if a page ever asks).
  for (const file of run.result.files) file.releaseSource?.();
  const base = options.base ?? rootBase;
  const view = run.errors === 0 ? buildManualView({ files: run.result.files, root, today: run.today, register: run.register, base }) : undefined;
  return {
    cwd: options.cwd, env: options.env, root, today: run.today, todaySource: run.todaySource === 'clock' ? 'STEPWRIGHT_TODAY' : run.todaySource,
    inputs: run.inputs, result: run.result, errors: run.errors, run, base, view,
  };
}

/** Check output exactly as `stepwright check` prints it, for a failed build. */
export function formatCheckFailure(loaded: LoadedManual, colour: boolean): string {
  return formatHuman(loaded.run.diagnostics, loaded.run.texts, colour) + summarize(loaded.run.diagnostics, loaded.inputs.length);
}

// On globalThis, not in a module variable: the live preview runs the pages from Vite's own copy of this module.
const handOffSlot = Symbol.for('stepwright.site-data.manual');
type Slot = { key: string; loaded: Promise<LoadedManual> };
const slots = globalThis as unknown as Record<symbol, Slot | undefined>;
/** Names the build run whose check the pages take, in this process's environment. */
export const runIdVariable = 'STEPWRIGHT_CHECK_RUN';

/** Gives the pages of this process the check run the build has already made; they find it by the run id. */
export function handOffManual(loaded: LoadedManual): void {
  const id = `${process.pid}-${performance.now().toFixed(3)}`;
  slots[handOffSlot] = { key: `run:${id}`, loaded: Promise.resolve(loaded) };
  process.env[runIdVariable] = id;
}

export function clearHandOff(): void {
  slots[handOffSlot] = undefined;
  delete process.env[runIdVariable];
}

/** The manual for the site's pages: the build's hand-off, else one check run per process (per save in dev). */
export async function siteManual(): Promise<{ loaded: LoadedManual; view: ManualView }> {
  // The dev server (live preview) re-reads on every save and shows check errors on the pages instead of failing.
  const dev = process.env[livePreviewVariable] === '1';
  const base = normalizeBase(process.env[siteBaseVariable]);
  const stamp = dev ? procedureStamp(manualFolder({ cwd: process.cwd(), env: process.env }), process.cwd()) : '';
  const handed = process.env[runIdVariable];
  const key = handed ? `run:${handed}` : `${base}\u0000${process.cwd()}\u0000${process.env.STEPWRIGHT_PROCEDURES ?? ''}\u0000${process.env.STEPWRIGHT_CONFIG ?? ''}\u0000${process.env.STEPWRIGHT_TODAY ?? ''}\u0000${stamp}`;
  let slot = slots[handOffSlot];
  if (!slot || slot.key !== key) {
    slot = { key, loaded: loadManual({ cwd: process.cwd(), env: process.env, base }) };
    slots[handOffSlot] = slot;
  }
  const loaded = await slot.loaded;
  if (loaded.base !== base) throw new Error(`The build handed the pages a manual for the base ${loaded.base}, but the pages are built for ${base}.`);
  if (!loaded.view && dev) loaded.view = tolerantManualView({ files: loaded.result.files, root: loaded.root, today: loaded.today, base });
  if (!loaded.view) throw new Error(`The procedures have check errors; the manual was not built.\n\n${formatCheckFailure(loaded, false)}`);
  return { loaded, view: loaded.view };
}
