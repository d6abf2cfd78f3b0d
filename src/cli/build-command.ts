// `stepwright build [folder]`: checks the procedures, builds the manual with Astro and indexes it with
// pagefind in a temporary folder, then swaps it into place: a failed or killed build leaves the last good site.
import { cpSync, existsSync, mkdirSync, readdirSync, renameSync, rmSync } from 'node:fs';
import { basename, dirname, join, relative, resolve, sep } from 'node:path';
import { parseArgs } from 'node:util';
import { clearHandOff, formatCheckFailure, handOffManual, loadManual } from '../site-data/manual.ts';
import { livePreviewVariable, siteBaseVariable } from '../site-data/site-mode.ts';
import { UsageError, useColour, type CliIo } from './io.ts';
import { defaultOutputFolder, proceduresFolder } from './project.ts';
import { siteBase } from '../engine/project.ts';
import { linksOutsideBase, pageFolder, pagePath, type SiteBase } from '../render/site-url.ts';
import { finishPages, type FinishedPage } from './index-site.ts';
import { isAlive, publishSite, recoverSite, startRetiring, versionsFolder } from './publish-site.ts';
import { foreignLink, outputPlaceProblem, type GuardedPlace } from './output-place.ts';
import { findConfigFile, projectRoot } from '../engine/project.ts';
import { findRegisterFolder } from '../engine/load-register.ts';
import { readPrivateKey, writeSiteManifest } from './site-manifest.ts';
import { siteConfig } from '../site/astro-config.ts';
import { offlineReport } from './offline-report.ts';
import { writeOfflineCopy, type OfflineCopySummary } from './write-offline-copy.ts';
import { GitError } from '../history/git.ts';
import { stopModelThread } from '../analysis/prose/model-thread.ts';
import { buildProgress } from './progress.ts';
import { compactHeap } from './compact-heap.ts';
import { linkPackages, packagesHolder, packagesReachableFrom } from './package-links.ts';
import { buildHelp } from './command-help.ts';
import { resultCacheFolder } from '../engine/cache-folder.ts';
import { pageKeys } from '../site-data/page-keys.ts';
import { closeSearchIndexer, startSearchFeed, type SearchFeed } from './search-feed.ts';
import { copyReusedPages, pageCodeStamp, pageRecordPath, planReuse, readPageRecord, recordedPages, ReusedPageChanged, reusedPagesAltered, writePageRecord, type ReusePlan } from './page-reuse.ts';

export { buildHelp };

export interface BuildOutcome {
  pages: number;
  seconds: number;
  outDir: string;
}

export async function runBuild(argv: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args: argv,
    allowPositionals: true,
    options: {
      out: { type: 'string' }, 'no-index': { type: 'boolean', default: false }, 'sign-key': { type: 'string' },
      help: { type: 'boolean', short: 'h' },
      procedures: { type: 'string' }, config: { type: 'string' }, base: { type: 'string' },
    },
    strict: true,
  });
  if (values.help) {
    io.stdout.write(buildHelp);
    return 0;
  }
  const started = performance.now();
  const progress = buildProgress(io.stderr);
  if (positionals.length > 1 || (positionals.length && values.procedures)) throw new UsageError('Give one procedures folder.');
  const folder = positionals[0] ?? proceduresFolder(io, values);
  if (values.config && !existsSync(resolve(io.cwd, values.config))) throw new UsageError(`The configuration file '${values.config}' does not exist.`);
  const config = values.config ? resolve(io.cwd, values.config) : '';
  const base = siteBase(io, values);
  const env = { ...io.env, STEPWRIGHT_PROCEDURES: folder, STEPWRIGHT_CONFIG: config };
  const outDir = resolve(io.cwd, values.out ?? defaultOutputFolder(io, values));
  // The output path is checked before anything is read, and again once the register's place is known.
  const placeProblem = (register?: string) => outputPlaceProblem(outDir, io.cwd, guardedPlaces(io.cwd, folder, config, register));
  const early = placeProblem();
  if (early) throw new UsageError(early);
  // The same check run as `stepwright check` (configuration, waivers, history, call expansion): whatever fails
  // the check stops the build here, with the same report.
  progress.phase('checking procedures');
  let loaded;
  try {
    loaded = await loadManual({ cwd: io.cwd, env, base });
  } catch (error) {
    if (!(error instanceof GitError)) throw error;
    progress.fail();
    io.stderr.write(`stepwright build: ${error.message}\n`);
    return 2;
  } finally {
    // The English model's thread (started for a check with no cache to answer from) has done its part: the pages
    // never read prose with it, and its memory is the build's.
    stopModelThread();
  }
  const late = placeProblem(loaded.run.register?.folder);
  if (late) throw new UsageError(late);
  const linkedElsewhere = foreignLink(outDir);
  // What each procedure's pages are made from, kept next to the result cache: a rebuild draws only what changed.
  const cacheFolder = resultCacheFolder(io);
  const recordFile = cacheFolder ? pageRecordPath(cacheFolder, outDir) : undefined;
  // What the check made and dropped is given back before the pages are built on top of it (see compact-heap.ts). A
  // rebuild (a record of the last build's pages exists) first learns how many pages it will draw: one that keeps
  // nearly all of them builds little on top of the heap, and is spared the collection (about a second at 2,000).
  const rebuilding = recordFile !== undefined && existsSync(recordFile);
  if (loaded.view && !rebuilding) compactHeap();
  progress.done(`${loaded.inputs.length} checked`);
  if (loaded.run.diagnostics.length > 0) io.stdout.write(formatCheckFailure(loaded, useColour(io, io.stdout)));
  // A build killed while publishing can leave the output path without a site: put the newest back first.
  const recovered = recoverSite(outDir);
  if (recovered) io.stderr.write(`stepwright build: ${recovered}.\n`);
  const signKeyPath = values['sign-key'] ?? (io.env.STEPWRIGHT_SIGNING_KEY?.trim() || undefined);
  let privateKey: ReturnType<typeof readPrivateKey> | undefined;
  if (signKeyPath) {
    try {
      privateKey = readPrivateKey(resolve(io.cwd, signKeyPath));
    } catch (error) {
      io.stderr.write(`stepwright build: the signing key ${signKeyPath} could not be read: ${(error as Error).message}\n`);
      return 1;
    }
  }
  if (loaded.errors > 0 || !loaded.view) {
    io.stderr.write(`stepwright build: stopped, the procedures have ${loaded.errors} error${loaded.errors === 1 ? '' : 's'}. ${existsSync(outDir) ? `The last good site in ${relative(io.cwd, outDir) || '.'}/ is unchanged.` : 'No site was written.'}\n`);
    return 1;
  }

  const tmp = `${outDir}.tmp-${process.pid}`;
  let offline: OfflineCopySummary | undefined;
  let keys: Map<string, string> | undefined;
  let plan: ReusePlan | undefined;
  let keptProcedures = 0;
  let pages: Map<string, FinishedPage> | undefined;
  let feed: SearchFeed | undefined;
  // Astro keeps its intermediate files inside the output folder only when that folder is inside the
  // project; elsewhere it would share <project>/.astro with any other build running at the same time.
  const scratch = join(io.cwd, '.stepwright');
  // Astro's prerender modules in the working folder import the site's packages from there upward; run through
  // npx, nothing is installed above the user's folders, so the build works in our scratch folder, which gets a
  // link to them.
  const unreachable = packagesHolder() !== undefined && !packagesReachableFrom(dirname(tmp));
  const work = isInside(outDir, io.cwd) && !unreachable ? tmp : join(scratch, `site.tmp-${process.pid}`);
  const cacheDir = join(scratch, `astro-cache.tmp-${process.pid}`);
  if (unreachable) {
    mkdirSync(scratch, { recursive: true });
    linkPackages(scratch);
  }
  removeStaleTemporaries(outDir);
  removeStaleTemporaries(join(scratch, 'site'));
  removeStaleTemporaries(join(scratch, 'astro-cache'));
  let retiring: Promise<void> | undefined;
  try {
    // The pages read the same folder and the same build date as the check above.
    process.env.STEPWRIGHT_PROCEDURES = folder;
    process.env.STEPWRIGHT_CONFIG = config;
    process.env.STEPWRIGHT_TODAY = loaded.today;
    process.env.STEPWRIGHT_TODAY_SOURCE = loaded.todaySource;
    process.env[siteBaseVariable] = base;
    delete process.env[livePreviewVariable];
    process.env.ASTRO_TELEMETRY_DISABLED = '1';
    // A published manual is a production build even when started from a test runner (NODE_ENV=test
    // would turn on development-only parts of the pages).
    process.env.NODE_ENV = 'production';
    // Vite reads DEV, PROD, MODE … from the environment into import.meta.env; a stray DEV=1 in a shell
    // (or a test runner's) must not put development-only parts into the published manual.
    for (const key of ['DEV', 'PROD', 'MODE', 'SSR', 'BASE_URL', 'SITE', 'ASSETS_PREFIX']) delete process.env[key];
    // The pages take this run instead of checking again (same process, keyed by folder and date).
    handOffManual(loaded);
    if (recordFile && cacheFolder) {
      keys = await pageKeys(loaded, pageCodeStamp(cacheFolder));
      plan = planReuse(readPageRecord(recordFile, outDir), keys, outDir);
    }
    loaded.reusedPages = new Set(plan?.reused.keys() ?? []);
    keptProcedures = plan ? keptProcedureCount(plan, loaded.view.procedures) : 0;
    if (rebuilding && keptProcedures < keptMostly * loaded.view.procedures.length) compactHeap();
    progress.phase('building pages');
    const { build } = await import('astro');
    // Each page is finished as it is drawn, and the search index gets the pages meanwhile (search-feed.ts).
    const drawnAgain = plan && keys ? [...keys.keys()].filter((folder) => !plan!.reused.has(folder)) : undefined;
    feed = await startSearchFeed({ index: !values['no-index'], lastSite: outDir, taken: plan ? recordedPages(plan) : undefined, mayDraw: drawnAgain });
    // No type generation (`sync`): it writes into the site's folder, which lies inside the installed package.
    await build(siteConfig({ outDir: work, cacheDir, procedures: resolve(io.cwd, folder), mode: 'production', base, drawn: feed }), { sync: false } as Parameters<typeof build>[1]);
    // Settles once the indexer has every page sent; the final pass reads the pages meanwhile.
    const sent = feed.finish();
    const taken = plan ? copyReusedPages(plan, outDir, work) : new Map();
    progress.done(`${loaded.view.procedures.length} procedures${keptProcedures ? `, ${keptProcedures} kept from the last build` : ''}`);
    // Under a sub-path, a link that leaves it is a broken page on the plant's server: the build stops.
    const leaving = await linksLeavingBase(work, base);
    if (leaving.length) {
      throw new Error(`pages link outside the base ${base}:\n${leaving.slice(0, 20).map((l) => `  ${l}`).join('\n')}${leaving.length > 20 ? `\n  … and ${leaving.length - 20} more` : ''}\n`);
    }
    // One pass over the pages: each is as it was finished when drawn (tags, ids and dates never break across
    // lines), or is finished now; the search index is written, or made again when it was not sent these pages.
    if (!values['no-index']) progress.phase('indexing for search');
    pages = await finishPages(work, { index: !values['no-index'], finished: plan ? recordedPages(plan) : undefined, early: { drawn: feed.drawnPages, sent } });
    if (!values['no-index']) progress.done();
    const altered = plan ? reusedPagesAltered(plan, work, pages, taken) : [];
    if (altered.length) throw new ReusedPageChanged(altered);
    // Old versions of the site go on a thread of their own while the offline copy and the manifest are written, and
    // not before: removing a version's names changes the change time of the pages it shares with the newer ones,
    // which the checks above compare with the record. Done before publishing, which removes any that became old
    // enough meanwhile, and before the record of this build's pages is written.
    retiring = startRetiring(outDir);
    progress.phase('writing the offline copy');
    // Last, so the offline copy's list and version cover the pages and the search index.
    // The build date, not the wall clock: the same sources give the same bytes.
    const places = loaded.view.procedures.map((p) => ({ slug: p.slug, area: p.area, kind: p.kind }));
    offline = await writeOfflineCopy(work, { now: new Date(`${loaded.today}T00:00:00Z`), places, previousSite: outDir, publishedUnder: base, known: pages });
    // Very last: the SHA-256 of every file, signed when a key is given.
    writeSiteManifest(work, { privateKey, known: offline.hashes });
    await retiring;
    if (work !== tmp) moveFolder(work, tmp);
    const published = publishSite(tmp, outDir);
    if (linkedElsewhere) io.stderr.write(`stepwright build: ${relative(io.cwd, outDir) || '.'} was a link to ${relative(io.cwd, linkedElsewhere) || '.'}; it now links to the new manual in ${relative(io.cwd, versionsFolder(outDir))}/, and what it linked to is left as it was.\n`);
    // The record describes this build's own version folder: another build publishing meanwhile cannot slip its
    // files under this build's keys.
    if (recordFile && keys) writePageRecord(recordFile, outDir, keys, pages, published);
    progress.done();
  } catch (error) {
    progress.fail();
    if (error instanceof ReusedPageChanged && recordFile) rmSync(recordFile, { force: true });
    rmSync(work, { recursive: true, force: true });
    rmSync(tmp, { recursive: true, force: true });
    io.stderr.write(`stepwright build: the site could not be built: ${(error as Error)?.message ?? String(error)}\n${existsSync(outDir) ? `The last good site in ${relative(io.cwd, outDir) || '.'}/ is unchanged.\n` : ''}`);
    return 1;
  } finally {
    if (feed && !values['no-index']) await closeSearchIndexer();
    clearHandOff();
    rmSync(cacheDir, { recursive: true, force: true });
    await retiring;
  }
  const seconds = (performance.now() - started) / 1000;
  const tagPages = loaded.view.tags.reduce((n, t) => n + t.parts.length, 0);
  const tagWords = tagPages === loaded.view.tags.length ? `${tagPages} tag pages` : `${loaded.view.tags.length} tags on ${tagPages} pages`;
  io.stdout.write(`Built ${loaded.view.procedures.length} procedures, ${tagWords} into ${relative(io.cwd, outDir) || '.'}/ in ${seconds.toFixed(1)} s (review marks for ${loaded.today}, from ${loaded.todaySource}).\n`);
  // The pages say so too; the log says it where the person who set up the build reads.
  if (loaded.run.repo?.shallow) io.stdout.write(shallowBuildNote);
  if (plan?.hadRecord && keys) io.stdout.write(reuseReport(plan, keptProcedures, loaded.view.procedures.length, keys.size));
  if (offline) io.stdout.write(offlineReport(offline));
  return 0;
}

/**
 * A rebuild that keeps at least this share of the procedures' pages from the last build skips compacting the heap
 * (it draws few pages on top of it; see compact-heap.ts).
 */
const keptMostly = 0.9;

/** How many of the procedures' page folders the plan takes from the last build. */
function keptProcedureCount(plan: ReusePlan, procedures: Array<{ slug: string }>): number {
  return procedures.filter((p) => plan.reused.has(pageFolder(pagePath.procedure(p.slug)))).length;
}

/** One line on what the build took from the last one: `kept` of the `procedures`, and the other page folders. */
function reuseReport(plan: ReusePlan, kept: number, procedures: number, folders: number): string {
  return `Pages: ${kept} procedure${kept === 1 ? '' : 's'} unchanged since the last build kept, ${procedures - kept} drawn; ${plan.reused.size - kept} of ${folders - procedures} tag, register and rule pages kept.\n`;
}

/** Moves a folder by renaming it; copies it only when the two places are on different file systems. */
function moveFolder(from: string, to: string): void {
  // The output folder may be new, in a folder that does not exist yet (--out reports/2026/site).
  mkdirSync(dirname(to), { recursive: true });
  try {
    renameSync(from, to);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EXDEV') throw error;
    cpSync(from, to, { recursive: true });
    rmSync(from, { recursive: true, force: true });
  }
}

export const shallowBuildNote = "History: this is a shallow clone, so the revision pages, redlines and audit trail show only the commits it holds. " +
  "Fetch the full history with 'git fetch --unshallow' (in GitHub Actions: actions/checkout with 'fetch-depth: 0').\n";

/**
 * What the output path must neither be nor hold: the working folder, the repository, the procedures (nor lie inside
 * them), the configuration file and the register (nor lie inside it). `register`: its folder as the check found it
 * (relative to the working folder); before the check, the register folder found by the usual rules.
 */
function guardedPlaces(cwd: string, folder: string, config: string, register?: string): GuardedPlace[] {
  const places: GuardedPlace[] = [
    { path: resolve(cwd), what: 'the folder the command runs in' },
    { path: resolve(cwd, folder), what: 'the procedures folder', notInside: true },
  ];
  const root = projectRoot(cwd);
  if (existsSync(join(root, '.git'))) {
    places.push({ path: root, what: 'the git repository' }, { path: join(root, '.git'), what: "git's own folder", notInside: true });
  }
  const configFile = config || findConfigFile(cwd);
  if (configFile) places.push({ path: configFile, what: 'the configuration file' });
  const registerFolder = register !== undefined && register !== '' ? resolve(cwd, register) : findRegisterFolder(cwd, configFile, undefined, folder)?.absolute;
  if (registerFolder) places.push({ path: registerFolder, what: 'the plant register', notInside: true });
  return places;
}

function isInside(path: string, folder: string): boolean {
  return path.startsWith(folder.endsWith(sep) ? folder : folder + sep);
}

/** Removes temporary folders left by builds that were killed (their process is gone). */
export function removeStaleTemporaries(outDir: string): void {
  const parent = dirname(outDir);
  const prefix = `${basename(outDir)}.`;
  let names: string[] = [];
  try {
    names = readdirSync(parent);
  } catch {
    return;
  }
  for (const name of names) {
    const m = new RegExp(`^${prefix.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}(tmp|old|link)-(\\d+)$`).exec(name);
    if (!m || Number(m[2]) === process.pid || isAlive(Number(m[2]))) continue;
    if (m[1] === 'old' && !existsSync(outDir)) {
      // A build died between the two renames: the old site is still the last good one.
      renameSync(join(parent, name), outDir);
      continue;
    }
    rmSync(join(parent, name), { recursive: true, force: true });
  }
}

/** "page: link" for every root-absolute link in the built pages that leaves the base. */
export async function linksLeavingBase(dir: string, base: SiteBase): Promise<string[]> {
  if (base === '/') return [];
  const { readdir, readFile } = await import('node:fs/promises');
  const out: string[] = [];
  for (const entry of await readdir(dir, { recursive: true, withFileTypes: true })) {
    if (!entry.isFile() || !entry.name.endsWith('.html')) continue;
    const file = join(entry.parentPath, entry.name);
    for (const link of linksOutsideBase(await readFile(file, 'utf8'), base)) out.push(`${relative(dir, file).split(sep).join('/')}: ${link}`);
  }
  return out.sort();
}
