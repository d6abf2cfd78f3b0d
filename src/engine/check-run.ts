// The one way to run a check: `check`, `build`, `dev` and `review` all call runCheckRun, so whatever fails
// `check` stops `build` with the same report. It reads the sources (skipping markdown that is not a
// procedure), the configuration and the configuration's own problems, the previous revision of each file
// from git (for the history rules), then runs every rule and the call expansion pass.
import { execFileSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { relative, resolve, sep } from 'node:path';
import type { Diagnostic } from '../parse/diagnostic.ts';
import { compareDiagnostics } from '../parse/diagnostic.ts';
import { checkSources, isDiagnostic, type CheckedFile, type CheckOptions, type CheckResult, type SourceInput } from '../check/run-checks.ts';
import { cacheKey } from '../check/result-cache.ts';
import type { Rule } from '../check/define-rule.ts';
import { allRules } from '../check/rules/index.ts';
import type { PreviousVersion } from '../history/previous-version.ts';
import type { PlantRegister } from '../model/register.ts';
import { findProcedureFiles, readFoundFiles, stdinName, type FileNotRead, type FoundFile } from './find-procedure-files.ts';
import { loadConfig, type CommandConfig } from './load-config.ts';
import { loadRegister } from './load-register.ts';
import { commandCache } from './command-cache.ts';
import { resultCacheHoldsEntries } from './cache-folder.ts';
import { isNotAProcedure, notAProcedureReason } from './not-a-procedure.ts';
import { fixedToday } from './fixed-date.ts';
import { previousFromGit, repoPath as repoRelative, type Repository } from './repository.ts';
import { deletedInForce, deletedProcedureError } from '../history/deleted-procedures.ts';
import { GitError } from '../history/git.ts';
import { procedureIdIn } from '../history/previous-version.ts';
import { proceduresFolder } from './project.ts';
import { readerThreshold, warmSourceReader } from '../read/source-reader.ts';

export type { SourceInput } from '../check/run-checks.ts';

/** Where the date the review marks are judged by comes from. */
export type DateSource = 'STEPWRIGHT_TODAY' | 'clock' | 'last commit' | 'procedure dates';

export interface CheckRunRequest {
  cwd: string;
  env: Record<string, string | undefined>;
  /** Files, folders, globs, or '-' for standard input; default: the procedures folder. */
  paths?: string[];
  /** --procedures: the procedures folder (else $STEPWRIGHT_PROCEDURES, 'procedures' in the config, procedures/). */
  procedures?: string;
  /** An explicit --config file; default: the nearest stepwright.config.yaml up to the top of the repository. */
  config?: string;
  /**
   * What the history rules compare with: the version at a git ref ({ base }, default HEAD), a caller's own
   * lookup (review compares with a merge base it has already read), or nothing (`--no-history`).
   */
  history?: { base?: string } | { previous: (file: string) => PreviousVersion | undefined; repo?: Repository } | false;
  /** 'clock' (check: today's date) or 'build' (build: reproducible, from the last commit or the sources). */
  date?: 'clock' | 'build';
  now?: () => Date;
  /** Keep per-file results in the cache folder between runs (default true; STEPWRIGHT_CACHE=off turns it off). */
  cache?: boolean;
  /** Reads standard input whole, for the path '-'. */
  stdin?: () => Promise<string>;
  /** Told how many files were found, before any is read. */
  sized?: (files: number) => void;
  /** Told how many files the rules will check (those the result cache did not answer for), before any rule runs. */
  checking?: (files: number) => void;
}

export interface SkippedFile {
  file: string;
  reason: string;
  /** Set for a file that is not read at all (in a folder that is not read, a .markdown name): reported as file-not-read. */
  hint?: string;
}

export interface CheckRun {
  /** The procedures folder or the paths given, as the user wrote them. */
  paths: string[];
  inputs: SourceInput[];
  /** Markdown found in a folder that is not a procedure (a README): not checked, reported as info. */
  skipped: SkippedFile[];
  config: CommandConfig;
  repo?: Repository;
  today: string;
  todaySource: DateSource;
  /** Every file's result; `diagnostics` also holds the configuration's problems and the skipped-file notes. */
  result: CheckResult;
  diagnostics: Diagnostic[];
  errors: number;
  /** File → text, for code frames (procedures, the configuration file and the register's files). */
  texts: Map<string, string>;
  /** The plant register the procedures were checked against, when there is one. */
  register?: PlantRegister;
}

/** Thrown when git cannot answer what the user asked (a --base that does not exist); the CLI prints it, exit 2. */
export { GitError } from '../history/git.ts';

export async function runCheckRun(request: CheckRunRequest): Promise<CheckRun> {
  // Paths named on the command line, with --procedures too when both are given; else the one procedures folder.
  const paths = request.paths?.length
    ? [...request.paths, ...(request.procedures ? [request.procedures] : [])]
    : [proceduresFolder(request, { procedures: request.procedures, config: request.config })];
  const notRead: FileNotRead[] = [];
  const found = await findWithStdin(paths, request, notRead);
  request.sized?.(found.length);
  // A large run reads its files on a second thread too (read/source-reader.ts). With no result cache to answer for
  // them, it starts now, to load its code while this thread reads the files, the configuration and the register; a
  // cache may answer for most files, and the thread then starts only for the files it does not answer for.
  const cacheMayAnswer = request.cache !== false && resultCacheHoldsEntries(request);
  if (found.length >= readerThreshold && !cacheMayAnswer) warmSourceReader();
  const partial = request.paths?.length ? manualLeftOut(request, found) : undefined;
  const skipped: SkippedFile[] = [...notRead];
  const inputs: SourceInput[] = [];
  const discoveredFiles = new Set(found.filter((f) => f.discovered).map((f) => f.file));
  for (const input of readFoundFiles(found)) {
    const discovered = discoveredFiles.has(input.file);
    if (discovered && 'text' in input && isNotAProcedure(input.text)) skipped.push({ file: input.file, reason: notAProcedureReason });
    else inputs.push(input);
  }
  // git reads the previous versions in processes of its own while this thread reads the configuration and the
  // register; its answer is awaited before the rules run.
  const history = request.history ?? {};
  const fromGit = history && !('previous' in history)
    ? previousFromGit(inputs.filter((i) => i.file !== stdinName), request, history.base, paths.find((p) => p !== '-'))
    : undefined;
  // Should reading the configuration or the register fail first, git's own failure is not left unhandled.
  fromGit?.catch(() => {});
  const config = loadConfig({ cwd: request.cwd }, request.config);
  const { today, source: todaySource } = request.date === 'build'
    ? buildDate(request, inputs, paths[0])
    : clockDate(request);
  // The plant register named by the configuration (or found next to it): procedures read their declarations from it.
  const register = loadRegister(request.cwd, config.file?.file, config.config.register, paths.find((p) => p !== '-'));

  let previous: ((file: string) => PreviousVersion | undefined) | undefined;
  let repo: Repository | undefined;
  if (history && 'previous' in history) ({ previous, repo } = history);
  else if (fromGit) ({ previous, repo } = await fromGit);
  // A check of whole folders against git also says which procedures in force at the base were deleted since.
  const deletedNotes = repo && fromGit && history && !('previous' in history) && paths.every((p) => p !== '-' && isFolder(resolve(request.cwd, p)))
    ? await deletedSinceBase(repo, history.base ?? 'HEAD', paths, inputs, request.cwd).catch((error: unknown) => {
      // Before the first commit there is no HEAD to compare with, and so nothing deleted since; a --base that cannot
      // be read was reported when the previous versions were read.
      if (history.base === undefined && error instanceof GitError && !error.missingGit) return [];
      throw error;
    })
    : [];
  const cache = request.cache === false ? undefined : commandCache(request, config.file?.text);
  const options = {
    previous, severity: config.policy, register, certificationIntervalMonths: config.config.certificationIntervalMonths,
    ...(partial ? { partial } : {}),
    cache,
  };
  let checked = checkSources(inputs, { ...options, today, checking: request.checking });
  // `build` judges the rules that read the date at the build date, not at today's: a check judges those rules at
  // the build date as well, so that it never passes where the build stops (see onlyAtBuildDate).
  if (request.date !== 'build' && todaySource === 'clock') {
    const build = buildDate(request, inputs, paths.find((p) => p !== '-'));
    if (build.today !== today) checked = withBuildDateErrors(checked, onlyAtBuildDate(inputs, options, checked, build.today), today, build);
  }
  // A large run's entries are written on a thread of their own while the rules check: they are all on disk (or
  // given up on) before the run reports.
  await cache?.store.flush();
  const skippedNotes = skipped.map((s): Diagnostic => s.hint !== undefined ? {
    file: s.file, line: 1, column: 1, endLine: 1, endColumn: 1, severity: 'info', rule: 'file-not-read',
    message: `Not read: ${s.file} (${s.reason}).`,
    hint: s.hint,
  } : ({
    file: s.file, line: 1, column: 1, endLine: 1, endColumn: 1, severity: 'info', rule: 'not-a-procedure',
    message: `Skipped: ${s.file} is not a procedure (${s.reason}).`,
    hint: 'Markdown without front-matter in the procedures folder is left alone. To make it a procedure, start it with a "---" line, the procedure keys and a closing "---".',
  }));
  const diagnostics = [...config.diagnostics, ...checked.diagnostics, ...skippedNotes, ...deletedNotes].sort(compareDiagnostics);
  const texts = new Map(inputs.flatMap((i) => ('text' in i ? [[i.file, i.text] as const] : [])));
  if (config.file) texts.set(config.file.file, config.file.text);
  for (const r of register?.sources ?? []) texts.set(r.file, r.source.text);
  return {
    paths, inputs, skipped, config, repo, today, todaySource, register,
    result: { ...checked, diagnostics },
    diagnostics,
    errors: diagnostics.filter((d) => d.severity === 'error').length,
    texts,
  };
}

function isFolder(path: string): boolean {
  return existsSync(path) && statSync(path).isDirectory();
}

/**
 * An error for each procedure that was approved or effective at the base and is gone now under every name: kept with
 * status retired or superseded, its revisions and audit trail stay readable, and the procedures naming it still
 * point somewhere.
 */
async function deletedSinceBase(repo: Repository, base: string, folders: string[], inputs: SourceInput[], cwd: string): Promise<Diagnostic[]> {
  const idsNow = new Set(inputs.flatMap((i) => ('text' in i ? [procedureIdIn(i.text)] : [])).filter((id): id is string => !!id));
  const found = await deletedInForce(repo.git, base, folders.map((f) => repoRelative(repo, resolve(cwd, f)) || '.'), idsNow);
  return found.map((d) => deletedProcedureError(d, base, relative(cwd, resolve(repo.root, d.path)).split(sep).join('/')));
}

/** The rules that read today's date: the only ones whose findings can differ between the clock and the build date. */
const datedRules: Rule[] = allRules.filter((r) => r.meta.dated);

/**
 * The errors the rules that read the date find at the build date and not at today's date: `stepwright build` stops
 * on them. A finding of the same rule at the same place at today's date is not repeated, and warnings the build does
 * not stop on are left out. The rules run a second time, on the files as the first run read them (no file is read
 * twice); with a result cache, the errors are kept under the first run's key and the build date, so a run in which
 * nothing changed reads one entry. That second run keeps nothing of its own in the cache: its entries would only ever
 * be asked for when that one entry is missing, and running the few dated rules again costs no more than reading them
 * (1,001 procedures, one edited: the same time; about 1,080 fewer entries written by a cold check).
 */
function onlyAtBuildDate(inputs: SourceInput[], options: Omit<CheckOptions, 'today'>, checked: CheckResult, buildToday: string): Diagnostic[] {
  const store = options.cache?.store;
  const key = store && checked.key ? cacheKey(['errors only at the build date', checked.key, buildToday]) : undefined;
  const kept = key ? store!.get<unknown>(key) : undefined;
  if (Array.isArray(kept) && kept.every(isDiagnostic)) return kept;
  const atBuild = checkSources(inputs, { ...options, cache: undefined, today: buildToday, rules: datedRules, readFrom: checked });
  const place = (d: Diagnostic) => `${d.rule}\0${d.file}\0${d.line}\0${d.column}`;
  const seen = new Set(checked.diagnostics.map(place));
  const found = atBuild.diagnostics.filter((d) => d.severity === 'error' && !seen.has(place(d)));
  if (key) store!.set(key, found);
  return found;
}

/** The check's result with the errors found only at the build date, each saying which date it was judged at and why. */
function withBuildDateErrors(checked: CheckResult, found: Diagnostic[], today: string, build: { today: string; source: Exclude<DateSource, 'clock'> }): CheckResult {
  if (!found.length) return checked;
  const added = found.map((d) => buildDateError(d, today, build));
  const byFile = new Map<string, Diagnostic[]>();
  for (const d of added) byFile.set(d.file, [...(byFile.get(d.file) ?? []), d]);
  // A file's result keeps its getters (its source is read only when asked for); only its diagnostics are new.
  const files = checked.files.map((f) => {
    const more = byFile.get(f.file);
    if (!more) return f;
    const copy = Object.defineProperties({}, Object.getOwnPropertyDescriptors(f)) as CheckedFile;
    copy.diagnostics = [...f.diagnostics, ...more].sort(compareDiagnostics);
    return copy;
  });
  const procedureFiles = new Set(checked.files.map((f) => f.file));
  const inRegister = added.filter((d) => !procedureFiles.has(d.file));
  return {
    ...checked,
    files,
    diagnostics: [...checked.diagnostics, ...added].sort(compareDiagnostics),
    ...(checked.register ? { register: { ...checked.register, diagnostics: [...checked.register.diagnostics, ...inRegister].sort(compareDiagnostics) } } : {}),
  };
}

/** A finding at the build date, in words that say why a check made today reports it. */
function buildDateError(d: Diagnostic, today: string, build: { today: string; source: Exclude<DateSource, 'clock'> }): Diagnostic {
  const fromCommit = build.source === 'last commit';
  const from = fromCommit ? 'the last commit' : "the procedures' dates";
  const by = fromCommit ? `the date of the last commit (${build.today})` : `the newest effective or approval date in the procedures (${build.today})`;
  const moves = fromCommit ? 'a new commit moves that date' : 'a later effective or approval date moves it';
  return {
    ...d,
    message: `${d.message.replace(/\.$/, '')} — on ${build.today}, the date the build takes from ${from}, so \`stepwright build\` stops here.`,
    hint: `${d.hint ? `${d.hint} ` : ''}The build dates the manual by ${by}, not by today's date (${today}); ${moves}, or set STEPWRIGHT_TODAY to the date the build should use.`,
  };
}

/**
 * When the paths named are only part of the manual: the procedures folder and how many of its files were left
 * out. Undefined when they cover the folder, or when there is no procedures folder to compare with.
 */
function manualLeftOut(request: CheckRunRequest, found: FoundFile[]): { folder: string; left: number } | undefined {
  const folder = proceduresFolder(request, { procedures: request.procedures, config: request.config });
  const all = findProcedureFiles([folder], request.cwd).filter((f) => !f.missing);
  if (!all.length) return undefined;
  const given = new Set(found.map((f) => f.absolute));
  const left = all.filter((f) => !given.has(f.absolute)).length;
  return left ? { folder, left } : undefined;
}

async function findWithStdin(paths: string[], request: CheckRunRequest, notRead: FileNotRead[]): Promise<FoundFile[]> {
  const named = paths.filter((p) => p !== '-');
  const found = findProcedureFiles(named, request.cwd, notRead);
  if (named.length < paths.length) {
    if (!request.stdin) found.push({ file: stdinName, absolute: stdinName, missing: 'standard input cannot be read here' });
    else found.push({ file: stdinName, absolute: stdinName, text: await request.stdin() });
  }
  return found;
}

function clockDate(request: CheckRunRequest): { today: string; source: DateSource } {
  const fixed = fixedToday(request.env);
  if (fixed) return { today: fixed, source: 'STEPWRIGHT_TODAY' };
  return { today: (request.now?.() ?? new Date()).toISOString().slice(0, 10), source: 'clock' };
}

/** The build date: STEPWRIGHT_TODAY, else the last commit's date, else the newest effective or approval date. */
export function buildDate(options: { cwd: string; env: Record<string, string | undefined> }, inputs: SourceInput[], folder?: string): { today: string; source: Exclude<DateSource, 'clock'> } {
  const fixed = fixedToday(options.env);
  if (fixed) {
    // `stepwright build` hands its own date to the pages and says where it came from.
    const told = options.env.STEPWRIGHT_TODAY_SOURCE;
    const source = told === 'last commit' || told === 'procedure dates' ? told : 'STEPWRIGHT_TODAY';
    return { today: fixed, source };
  }
  try {
    // The repository that holds the procedures, not the one the command was started in.
    const at = resolve(options.cwd, folder ?? proceduresFolder(options, { config: options.env.STEPWRIGHT_CONFIG || undefined }));
    const out = execFileSync('git', ['log', '-1', '--format=%cs'], { cwd: existsSync(at) && statSync(at).isDirectory() ? at : options.cwd, encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim();
    if (/^\d{4}-\d{2}-\d{2}$/.test(out)) return { today: out, source: 'last commit' };
  } catch {
    // Not a git checkout: fall back to the content itself.
  }
  // Dates that have happened (effective and approval dates), never planned ones such as review-by.
  const dates = inputs.flatMap((i) => ('text' in i ? [...i.text.matchAll(/(?<![\w-])(?:effective|date):\s*(\d{4}-\d{2}-\d{2})\b/g)].map((m) => m[1]) : []));
  return { today: dates.sort().at(-1) ?? '1970-01-01', source: 'procedure dates' };
}

/** A file's path as git names it, for annotations (GitHub, SARIF). */
export function pathInRepository(run: Pick<CheckRun, 'repo'>, cwd: string, file: string): string {
  if (!run.repo || file === stdinName) return file;
  return repoRelative(run.repo, resolve(cwd, file));
}
