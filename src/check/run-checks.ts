// Runs every rule over a set of procedure sources and returns the diagnostics, sorted by place.
import { compareDiagnostics, type Diagnostic, type Severity } from '../parse/diagnostic.ts';
import { partsFromBytes, partsToBytes, readSource, type ParsedSource, type ReadParts } from '../parse/read-source.ts';
import { startSourceReader, type SourceReader } from '../read/source-reader.ts';
import type { Procedure } from '../model/procedure.ts';
import type { PlantRegister } from '../model/register.ts';
import type { ProcedureFacts } from '../analysis/procedure-facts.ts';
import { forgetRuleAnalysesOf } from '../analysis/rule-memo.ts';
import { readProcedure, type GivenReading } from '../read/read-procedure.ts';
import { toDiagnostic, type FileContext, type FileHistory, type FileRule, type Report, type Rule, type RuleMeta } from './define-rule.ts';
import { expandCalls, takesPartInExpansion, type RawFinding } from './call-expansion.ts';
import { applyWaivers, type WaivedDiagnostic } from './waivers.ts';
import { allRules } from './rules/index.ts';
import { cacheKey, type ResultCache } from './result-cache.ts';
import { isFileSummary, summarise, type FileSummary } from './file-summary.ts';

export type SourceInput = { file: string; text: string } | { file: string; error: string };

/** Decides a rule's severity for one file: 'off' silences it; undefined keeps the rule's choice. */
export type SeverityPolicy = (rule: string, file: string) => Severity | 'off' | undefined;

export interface CheckOptions {
  /** Today's date, YYYY-MM-DD. */
  today: string;
  rules?: Rule[];
  severity?: SeverityPolicy;
  /** The previous committed version of a file (e.g. from git), for the history rules. */
  previous?: (file: string) => { text: string; commit: string } | undefined;
  /** The plant register the procedures are read against; without one, procedures stand alone. */
  register?: PlantRegister;
  /** Longest time between two certifications of a procedure in use, in months (default 12). */
  certificationIntervalMonths?: number;
  /**
   * Set when the inputs are only part of the manual: `left` files of the procedures folder `folder` were not given.
   * Rules about the whole manual (a register entry no procedure uses) then say what they could not judge.
   */
  partial?: { folder: string; left: number };
  /**
   * Per-file results kept between runs. `salt` must name everything the file rules depend on besides the file,
   * the date and its previous version: the Stepwright code (stepwrightStamp()) and the configuration text. `code`
   * names the Stepwright code alone: what a file's reading depends on besides its name and text (`salt` if absent).
   */
  cache?: { store: ResultCache; salt: string; code?: string };
  /** Read a large run's files on a second thread as well (default true); the results are the same either way. */
  readAhead?: boolean;
  /**
   * The result of an earlier run over the same files (another date, other rules): a file whose text is the same is
   * not read again, its reading (source, model, facts) is taken from that run. The findings are the same either way.
   */
  readFrom?: CheckResult;
  /**
   * Told how many files the rules will check, once the cache has answered for the others and before any rule runs
   * (the command line then starts the English model on its own thread when there are some).
   */
  checking?: (files: number) => void;
}

export interface CheckedFile {
  file: string;
  source: ParsedSource | null;
  procedure: Procedure | null;
  facts: ProcedureFacts | null;
  diagnostics: Diagnostic[];
  /** Diagnostics set aside by a step's waiver (with its reason); kept out of `diagnostics`, shown by the site. */
  waived?: WaivedDiagnostic[];
  /**
   * Lets go of what the file's reading keeps for positions (the table of its front-matter's nodes); a position asked
   * for later reads the same text again. A file that was not read is not read for this.
   */
  releaseSource?(): void;
}

export interface CheckResult {
  files: CheckedFile[];
  diagnostics: Diagnostic[];
  /** The register the procedures were read against, with the problems found in its own files. */
  register?: { register: PlantRegister; diagnostics: Diagnostic[] };
  /**
   * With a result cache: a key naming everything the result depends on (the files and their previous versions, the
   * register, the configuration, the rules, the date, the code), for what a caller keeps about it. Absent when a file
   * could not be read.
   */
  key?: string;
}

/** Every rule's id, for the rules that judge what a procedure names (waivers). */
const allRuleIds: readonly string[] = allRules.map((r) => r.meta.id);

export function checkSources(inputs: SourceInput[], options: CheckOptions): CheckResult {
  const rules = options.rules ?? allRules;
  const files: CheckedFile[] = [];
  const contexts: LazyFileContext[] = [];
  const sink = new Map<FileContext, Diagnostic[]>();
  const store = options.cache?.store;
  // What the rules that call expansion compares with reported on each file alone (files the rules ran on).
  const ownFindings = new Map<FileContext, RawFinding[]>();
  const fileKeys = new Map<FileContext, string>();
  // Every file's key (not only those checked now), for the keys of what depends on several files.
  const keyOf = new Map<FileContext, string>();

  const emit = (context: FileContext, meta: RuleMeta, report: Report) => {
    const chosen = options.severity?.(meta.id, context.file);
    if (chosen === 'off') return;
    const severity = chosen ?? report.severity ?? meta.defaultSeverity;
    sink.get(context)!.push(toDiagnostic(meta, severity, context.source, report));
  };

  // Everything besides the file itself that the file rules read goes into each key.
  const ruleIds = rules.map((r) => `${r.scope}:${r.meta.id}`).join(',');
  const shared = options.cache
    ? cacheKey([options.cache.salt, ruleIds, String(options.certificationIntervalMonths ?? 12), options.register?.folder,
      ...(options.register?.sources ?? []).flatMap((s) => [s.file, s.source.text])])
    : '';
  // Each file's key is taken before anything is read: a file found in the cache is parsed only when a cross-file
  // rule, a waiver or a caller asks for its model.
  const keys: string[] = [];
  const toCheck: LazyFileContext[] = [];
  // A large run's files are read on a thread of their own as well (read/source-reader.ts), in the order below.
  const toRead: Array<{ file: string; text: string }> = [];
  // Files the cache answered for, in order: read only should the cross-file rules run.
  const answered: Array<{ file: string; text: string }> = [];
  let reader: SourceReader | undefined;
  // What reading a file found (its parts: data, markdown tree, reading problems) depends only on its name, its text
  // and the code, so it is kept in the cache too: a file read for the cross-file rules alone (its own results came
  // from the cache) is then taken from there instead of being read again. `kept`: files whose parts the cache holds;
  // `toKeep`: files whose parts are stored once read.
  const kept = new Map<string, string>();
  const toKeep = new Map<string, string>();
  const partsKeyOf = (input: SourceInput) => (store && 'text' in input ? cacheKey([options.cache!.code ?? options.cache!.salt, 'parts', input.file, input.text]) : undefined);
  const keep = (file: string, bytes: Uint8Array) => {
    const key = toKeep.get(file);
    if (key === undefined) return;
    toKeep.delete(file);
    store!.setBytes(key, bytes);
  };
  const partsOf = (file: string): GivenReading | undefined => {
    const key = kept.get(file);
    const bytes = key === undefined ? undefined : store!.getBytes(key);
    const parts = bytes && partsFromBytes(bytes);
    if (parts) return { parts };
    const ahead = reader?.take(file);
    if (ahead) keep(file, ahead.bytes);
    return ahead && { parts: ahead.parts, schemaIssues: ahead.schemaIssues };
  };
  const onRead = (file: string, parts: ReadParts) => {
    if (toKeep.has(file)) keep(file, partsToBytes(parts));
  };
  const setCurrent = new Map<FileContext, (meta: RuleMeta) => void>();
  const earlier = readingsOf(options.readFrom);
  const textOf = new Map<FileContext, string | undefined>();
  for (const input of inputs) {
    const previous = 'text' in input ? options.previous?.(input.file) : undefined;
    const key = store && 'text' in input
      ? cacheKey([shared, input.file, input.text, options.today, previous?.commit, previous?.text])
      : undefined;
    if (key) keys.push(key);
    const known = key ? cachedFile(store!, key) : undefined;
    let current: RuleMeta = rules[0]?.meta;
    // A file the rules will read is read in full at once, so that a fault while reading it is reported as one.
    const context = lazyFileContext(input, previous, options, (report) => {
      if (takesPartInExpansion(current)) ownFindings.get(context)?.push({ rule: current, report });
      emit(context, current, report);
    }, !known, partsOf, onRead, earlier);
    sink.set(context, []);
    textOf.set(context, 'text' in input ? input.text : undefined);
    contexts.push(context);
    if (key) keyOf.set(context, key);
    const partsKey = partsKeyOf(input);
    // Parts already kept are not written again (a changed date or configuration checks every file once more).
    const partsThere = partsKey !== undefined && store!.hasBytes(partsKey);
    const partsKept = !!known && partsThere;
    if (partsKept) kept.set(input.file, partsKey!);
    else if (partsKey !== undefined && !partsThere) toKeep.set(input.file, partsKey);
    // A file read by the earlier run is not read again, on either thread.
    const readBefore = 'text' in input && earlier?.get(input.file)?.text === input.text;
    if (known) {
      if ('text' in input && !partsKept && !readBefore) answered.push({ file: input.file, text: input.text });
      context.summary = known.summary;
      sink.get(context)!.push(...known.diagnostics);
      continue;
    }
    ownFindings.set(context, []);
    setCurrent.set(context, (meta) => (current = meta));
    if (key) fileKeys.set(context, key);
    toCheck.push(context);
    if ('text' in input && !readBefore) toRead.push({ file: input.file, text: input.text });
  }
  // The cross-file rules and the engine's passes read every file; their findings are kept under the keys of all
  // files together, so a run in which no file, register, configuration or date changed reads no file at all.
  const manualKey = store && keys.length === inputs.length ? cacheKey([shared, 'manual', options.today, options.partial ? `${options.partial.folder}\0${options.partial.left}` : '', ...keys]) : undefined;
  const knownManual = manualKey ? cachedManual(store!, manualKey, contexts) : undefined;
  // When they will run, the files the cache answered for are read on the thread as well, after the files the rules
  // check, in the order the passes ask for them (a rebuild after one edit reads every other file only for them).
  if (!knownManual) {
    toRead.push(...answered);
  }
  options.checking?.(toCheck.length);
  reader = startSourceReader(options.readAhead === false ? [] : toRead);
  // Work the rules can start ahead (the English model tags on its own thread) is started for the first files before
  // any rule runs, and then for each file a stretch ahead of the one being checked: it goes on while the rules check,
  // and a large run neither reads every file at once to start it nor holds every file's prose until its rules run.
  // It only ever changes when work is done.
  const fileRules = rules.filter((r): r is FileRule => r.scope === 'file');
  const aheadRules = fileRules.filter((r) => r.ahead);
  let prepared = 0;
  const prepareUpTo = (count: number) => {
    for (; prepared < Math.min(count, toCheck.length); prepared++) {
      for (const rule of aheadRules) {
        try {
          rule.ahead!.prepare(toCheck[prepared]);
        } catch {
          // the rule does the work itself when it checks the file, and reports what goes wrong there
        }
      }
    }
  };
  const runRule = (context: LazyFileContext, rule: FileRule) => {
    setCurrent.get(context)!(rule.meta);
    runGuarded(rule, () => rule.check(context), context, emit);
  };
  const runRules = (context: LazyFileContext, list: FileRule[]) => list.forEach((rule) => runRule(context, rule));
  // `own`: the file's own findings, when its sink holds others too (see `deferred` below).
  const finish = (context: LazyFileContext, own: Diagnostic[] = sink.get(context)!) => {
    context.summary ??= summarise(context.procedure);
    // What only this file's rules read (its prose, sequence, decisions and plant state) is made again should a later
    // pass ask for it: a large run keeps one file's analyses at a time, not every file's until the end.
    forgetRuleAnalysesOf(context.procedure, context.facts);
    const key = fileKeys.get(context);
    if (key) store!.set(key, { diagnostics: own, summary: context.summary } satisfies CachedFile);
  };
  // A rule whose work ahead is not done yet for a file (its phrases not yet tagged) is left for later: the other rules
  // check that file and the next ones meanwhile, instead of waiting. Few files wait so, in the order they came; the
  // findings are the same, sorted as always.
  const waiting: Array<{ context: LazyFileContext; rules: FileRule[] }> = [];
  const ready = (entry: (typeof waiting)[number]) => entry.rules.every((rule) => readyAhead(rule, entry.context));
  toCheck.forEach((context, index) => {
    prepareUpTo(index + preparedAhead);
    const later: FileRule[] = [];
    for (const rule of fileRules) {
      if (rule.ahead && (later.length || !readyAhead(rule, context))) later.push(rule);
      else runRule(context, rule);
    }
    if (later.length) waiting.push({ context, rules: later });
    else finish(context);
    while (waiting.length && (waiting.length > filesWaitingAtMost || ready(waiting[0]))) {
      const entry = waiting.shift()!;
      runRules(entry.context, entry.rules);
      finish(entry.context);
    }
  });
  // Rules still waiting for the English model when the cross-file passes are to run next (a check after an edit:
  // a few files checked, every other file read for the passes) run after those passes, while the model loads and
  // tags on its own thread, instead of the main thread waiting for it first. The passes read the files' summaries,
  // made now; the findings of the rules run later are the files' own, kept apart from what the passes add.
  const deferred: Array<(typeof waiting)[number] & { ownBefore: number }> = [];
  const waitingNow = waiting.splice(0);
  const passesRun = !knownManual;
  for (const entry of waitingNow) {
    if (passesRun && !ready(entry)) {
      entry.context.summary = summarise(entry.context.procedure);
      deferred.push({ ...entry, ownBefore: sink.get(entry.context)!.length });
      continue;
    }
    runRules(entry.context, entry.rules);
    finish(entry.context);
  }

  const registerDiagnostics: Diagnostic[] = [];
  const register = options.register;
  const byName = new Map(contexts.map((c) => [c.file, c]));
  let manualFindings: CachedManual['files'] = [];
  if (knownManual) {
    for (const { file, diagnostic } of knownManual.files) sink.get(byName.get(file)!)!.push(diagnostic);
    registerDiagnostics.push(...knownManual.register);
  } else {
    const before = new Map(contexts.map((c) => [c, sink.get(c)!.length]));
    // The passes read every file, first to last; the thread reads those the cache answered for from the first, and
    // this thread from the last, until they meet.
    if (reader) for (let i = contexts.length - 1; i >= 0; i--) void contexts[i].procedure;
    // A caller's findings with its calls expanded depend on it and the procedures it calls, call after call: kept
    // under the keys of those files, so an edit re-expands only the callers it reaches.
    // Each file's key together with those of the procedures it calls: what a file's findings with its calls expanded
    // depend on (the engine's pass, and the manual rules' work per file).
    const withCallees = store ? calleeKeys(contexts, keyOf, shared) : new Map<FileContext, string>();
    const expansion = new Map(rules.some((r) => r.scope === 'engine') ? [...withCallees].filter(([c]) => (c as LazyFileContext).summary?.calls.length) : []);
    const knownExpansion = new Map<FileContext, Diagnostic[]>();
    for (const [context, key] of expansion) {
      const found = cachedDiagnostics(store!, key, context.file);
      if (found) knownExpansion.set(context, found);
    }
    for (const [context, found] of knownExpansion) sink.get(context)!.push(...found);
    const beforePasses = new Map<FileContext, number>(contexts.map((c) => [c, sink.get(c)!.length]));
    if (runEnginePasses(rules, contexts, ownFindings, emit, (c) => knownExpansion.has(c))) {
      for (const [context, key] of expansion) if (!knownExpansion.has(context)) store!.set(key, sink.get(context)!.slice(beforePasses.get(context)));
    }
    runManualRules(rules, contexts, options, emit, registerDiagnostics, sink, store, store && ((context, parts, reads) => {
      const keys = [withCallees.get(context), ...reads.map((c) => keyOf.get(c))];
      return keys.every((k) => k !== undefined) ? cacheKey(['per-file', ...parts, ...keys]) : undefined;
    }));
    manualFindings = contexts.flatMap((c) => sink.get(c)!.slice(before.get(c)).map((diagnostic) => ({ file: c.file, diagnostic })));
  }
  for (const entry of deferred) {
    const found = sink.get(entry.context)!;
    const passesAfter = found.length;
    runRules(entry.context, entry.rules);
    finish(entry.context, [...found.slice(0, entry.ownBefore), ...found.slice(passesAfter)]);
  }
  // Every file the rules and passes read has been read: anything read later is read on this thread.
  reader?.stop();
  reader = undefined;

  // Waivers are looked up only where there is something to waive and the file has waivers at all; what they set
  // aside is kept with the cross-file findings, so a run that changed nothing does not read those files either.
  const waiverOutcomes: CachedManual['waivers'] = [];
  const knownOutcomes = new Map(knownManual?.waivers.map((w) => [w.file, w]));
  for (const context of contexts) {
    const found = sink.get(context)!.sort(compareDiagnostics);
    let outcome: { kept: Diagnostic[]; waived: WaivedDiagnostic[] } = { kept: found, waived: [] };
    if (found.length && context.summary?.waivers !== false) {
      outcome = knownOutcomes.get(context.file) ?? waiversApplied(context, found, store, keyOf.get(context));
      waiverOutcomes.push({ file: context.file, ...outcome });
    }
    files.push(checkedFile(context, outcome.kept, outcome.waived, textOf.get(context)));
  }
  if (manualKey && !knownManual) store!.set(manualKey, { files: manualFindings, register: registerDiagnostics, waivers: waiverOutcomes } satisfies CachedManual);
  files.sort((a, b) => a.file.localeCompare(b.file));
  registerDiagnostics.sort(compareDiagnostics);
  return {
    files,
    diagnostics: [...files.flatMap((f) => f.diagnostics), ...registerDiagnostics].sort(compareDiagnostics),
    ...(register ? { register: { register, diagnostics: registerDiagnostics } } : {}),
    ...(manualKey ? { key: manualKey } : {}),
  };
}

/**
 * Each file's key together with the keys of every procedure it calls, call after call (found by id as the passes find
 * them: the first file with that id), and of the ids no file has; a file that calls nothing has its own key with
 * `shared`. A file missing: a file it depends on could not be read (it has no key).
 */
function calleeKeys(contexts: LazyFileContext[], keyOf: Map<FileContext, string>, shared: string): Map<FileContext, string> {
  const byId = new Map<string, LazyFileContext>();
  for (const c of contexts) if (c.summary?.id && !byId.has(c.summary.id)) byId.set(c.summary.id, c);
  const out = new Map<FileContext, string>();
  for (const context of contexts) {
    if (!context.summary) continue;
    const parts = ['expansion', shared, keyOf.get(context)];
    const seen = new Set<string>();
    const queue = [...context.summary.calls];
    for (let id = queue.shift(); id !== undefined; id = queue.shift()) {
      if (seen.has(id)) continue;
      seen.add(id);
      const callee = byId.get(id);
      parts.push(id, callee ? keyOf.get(callee) ?? 'unkeyed' : 'absent');
      if (callee) queue.push(...callee.summary!.calls);
    }
    // A file with no key (it could not be read) makes every key it is part of unusable.
    if (parts.every((p) => p !== undefined && p !== 'unkeyed')) out.set(context, cacheKey(parts));
  }
  return out;
}

/**
 * The engine's own passes: call expansion checks each caller with its calls expanded (except the callers `known`
 * holds the findings of). False when a pass could not finish.
 */
function runEnginePasses(
  rules: Rule[], contexts: FileContext[], ownFindings: Map<FileContext, RawFinding[]>,
  emit: (c: FileContext, m: RuleMeta, r: Report) => void, known: (c: FileContext) => boolean,
): boolean {
  let finished = true;
  for (const pass of rules) {
    if (pass.scope !== 'engine') continue;
    try {
      expandCalls({
        files: contexts, rules: rules.filter((r): r is FileRule => r.scope === 'file'), ownFindings, skip: known,
        report: (ctx, report) => emit(ctx, pass.meta, report),
      });
    } catch (error) {
      finished = false;
      if (contexts[0]) {
        emit(contexts[0], pass.meta, {
          severity: 'error',
          message: `The check '${pass.meta.id}' could not finish (${(error as Error)?.message ?? String(error)}); calls were not checked together with their callers.`,
          hint: 'This is a fault in Stepwright, not in the procedures; other rules still ran. Please report it with the files.',
        });
      }
    }
  }
  return finished;
}

function runManualRules(
  rules: Rule[], contexts: FileContext[], options: CheckOptions,
  emit: (c: FileContext, m: RuleMeta, r: Report) => void, registerDiagnostics: Diagnostic[],
  sink: Map<FileContext, Diagnostic[]>, store?: ResultCache,
  perFileKey?: (context: FileContext, parts: string[], reads: FileContext[]) => string | undefined,
): void {
  const register = options.register;
  /** A rule's work for one file, run or given again from the cache (see ManualContext.perFile). */
  const perFile = (meta: RuleMeta) => (context: FileContext, inputs: string, work: () => void, reads: FileContext[] = []) => {
    const key = perFileKey?.(context, [meta.id, inputs], reads);
    const found = key === undefined ? undefined : cachedDiagnostics(store!, key, context.file);
    const diagnostics = sink.get(context)!;
    if (found) {
      diagnostics.push(...found);
      return;
    }
    const before = diagnostics.length;
    const outer = working;
    working = { file: context, strayed: false };
    try {
      work();
      // What the work reported elsewhere (another file, the register) would not be given again with this file's
      // findings: such work is not kept, and runs again next time.
      if (key !== undefined && !working.strayed) store!.set(key, diagnostics.slice(before));
    } finally {
      if (outer && working.strayed) outer.strayed = true;
      working = outer;
    }
  };
  /** The file whose work perFile is running, and whether that work has reported anywhere else. */
  let working: { file: FileContext; strayed: boolean } | undefined;
  const noteReport = (file: FileContext | string) => {
    if (working && file !== working.file) working.strayed = true;
  };
  const reportInRegister = (meta: RuleMeta) => (file: string, report: Report) => {
    noteReport(file);
    const chosen = options.severity?.(meta.id, file);
    if (chosen === 'off') return;
    const source = register?.sources.find((s) => s.file === file)?.source ?? readSource(file, '');
    registerDiagnostics.push({ ...toDiagnostic(meta, chosen ?? report.severity ?? meta.defaultSeverity, source, report), file });
  };
  for (const rule of rules) {
    if (rule.scope !== 'manual') continue;
    const inRegister = reportInRegister(rule.meta);
    try {
      rule.check({
        files: contexts, today: options.today, register, reportInRegister: inRegister, ...(options.partial ? { partial: options.partial } : {}),
        report: (ctx, report) => {
          noteReport(ctx);
          emit(ctx, rule.meta, report);
        },
        perFile: perFile(rule.meta),
      });
    } catch (error) {
      // A rule that fails must say so; with no procedure to point at, the report goes to the register or the first file.
      const report: Report = {
        severity: 'error',
        message: `Rule '${rule.meta.id}' could not finish (${(error as Error)?.message ?? String(error)}).`,
        hint: 'This is a fault in Stepwright, not in the procedures; other rules still ran. Please report it with the files.',
      };
      if (contexts[0]) emit(contexts[0], rule.meta, report);
      else if (register?.sources[0]) inRegister(register.sources[0].file, report);
    }
  }
}

/** A file's context whose source, model and facts are read on first use (and once). */
interface LazyFileContext extends FileContext {
  summary?: FileSummary;
  releaseSource(): void;
  /** The file's reading (read now, if it was not yet). */
  reading(): Reading;
}

type Reading = ReturnType<typeof readProcedure> & { readError?: string };

/** What each checked file was read from and how to get its reading, for a later run over the same files (readFrom). */
const readingOfFile = new WeakMap<CheckedFile, { text: string | undefined; reading: () => Reading }>();

function readingsOf(result: CheckResult | undefined): Map<string, { text: string | undefined; reading: () => Reading }> | undefined {
  if (!result) return undefined;
  const out = new Map<string, { text: string | undefined; reading: () => Reading }>();
  for (const f of result.files) {
    const entry = readingOfFile.get(f);
    if (entry && !out.has(f.file)) out.set(f.file, entry);
  }
  return out;
}

/** How many files ahead of the one being checked have their work ahead started (all of a small run at once). */
const preparedAhead = 64;

/** How many files' rules may wait for work ahead at a time (each keeps its analyses until its rules are done). */
const filesWaitingAtMost = 16;

/** Whether the rule can check the file now without waiting; a rule whose question fails says so when it checks. */
function readyAhead(rule: FileRule, context: FileContext): boolean {
  try {
    return rule.ahead?.ready(context) ?? true;
  } catch {
    return true;
  }
}

function lazyFileContext(
  input: SourceInput, previous: { text: string; commit: string } | undefined, options: CheckOptions, report: (r: Report) => void, full: boolean,
  partsOf?: (file: string) => GivenReading | undefined, onRead?: (file: string, parts: ReadParts) => void,
  earlier?: Map<string, { text: string | undefined; reading: () => Reading }>,
): LazyFileContext {
  let read: Reading | undefined;
  const reading = (): Reading => {
    if (read) return read;
    if ('error' in input) return (read = { ...unreadable(input.file), readError: input.error });
    const before = earlier?.get(input.file);
    try {
      // A file the rules check takes its table of positions as it is read; a file read for its model alone (its check
      // results came from the cache) makes it only if a position is asked for. A file an earlier run over the same
      // text read is taken from that run.
      read = before?.text === input.text
        ? before.reading()
        : readProcedure(input.file, input.text, options.register, partsOf?.(input.file), full ? 'now' : 'when-asked', onRead && ((parts) => onRead(input.file, parts)));
      if (full) void read.facts;
    } catch (error) {
      // Whatever a file holds, the check goes on and the file gets a diagnostic: never a crash of the whole run.
      read = { ...unreadable(input.file), readError: `reading it failed inside Stepwright (${firstLineOf(error)}); this is a fault in Stepwright, please report it with the file` };
    }
    return read;
  };
  let history: FileHistory | undefined | null = null;
  return {
    file: input.file, today: options.today, register: options.register,
    certificationIntervalMonths: options.certificationIntervalMonths ?? 12, ruleIds: allRuleIds,
    get source() { return reading().source; },
    get procedure() { return reading().procedure; },
    get schemaIssues() { return reading().schemaIssues; },
    get facts() { return reading().facts; },
    get readError() { return reading().readError; },
    // The previous version is read only when a rule asks for it; an unchanged file's previous version is the file.
    get history() {
      if (history === null) {
        const current = reading();
        history = !previous || current.readError !== undefined
          ? undefined
          : previous.text === ('text' in input ? input.text : undefined)
            ? { commit: previous.commit, text: previous.text, source: current.source, procedure: current.procedure }
            : readPrevious(input.file, previous, options.register);
      }
      return history;
    },
    report,
    releaseSource() {
      read?.source.release();
    },
    reading,
  };
}

function checkedFile(context: LazyFileContext, diagnostics: Diagnostic[], waived: WaivedDiagnostic[], text: string | undefined): CheckedFile {
  const checked: CheckedFile = {
    file: context.file, diagnostics, waived,
    get source() { return context.source; },
    get procedure() { return context.procedure; },
    get facts() { return context.facts; },
    releaseSource: () => context.releaseSource(),
  };
  readingOfFile.set(checked, { text, reading: context.reading });
  return checked;
}

interface CachedFile {
  diagnostics: Diagnostic[];
  summary: FileSummary;
}

interface CachedManual {
  files: Array<{ file: string; diagnostic: Diagnostic }>;
  register: Diagnostic[];
  /** Each file's findings split by its step waivers, for the files that waive a rule and have findings. */
  waivers: Array<{ file: string; kept: Diagnostic[]; waived: WaivedDiagnostic[] }>;
}

/** A cached file entry, only when it has the shape this version writes (anything else is read afresh). */
function cachedFile(store: ResultCache, key: string): CachedFile | undefined {
  const value = store.get<Partial<CachedFile>>(key);
  if (!value || !Array.isArray(value.diagnostics) || !value.diagnostics.every(isDiagnostic) || !isFileSummary(value.summary)) return undefined;
  return value as CachedFile;
}

/**
 * A file's findings split by its step waivers. Placing a waiver needs the file's positions (its front-matter read
 * again), so the split is kept under the file's key and the findings: an edit elsewhere does not redo it.
 */
function waiversApplied(context: FileContext, found: Diagnostic[], store: ResultCache | undefined, fileKey: string | undefined): { kept: Diagnostic[]; waived: WaivedDiagnostic[] } {
  const key = store && fileKey ? cacheKey(['waivers', fileKey, JSON.stringify(found)]) : undefined;
  const value = key ? store!.get<{ kept?: unknown; waived?: unknown }>(key) : undefined;
  if (value && Array.isArray(value.kept) && value.kept.every((d) => isDiagnostic(d) && d.file === context.file)
    && Array.isArray(value.waived) && value.waived.every((w) => isWaived(w) && w.diagnostic.file === context.file)) {
    return value as { kept: Diagnostic[]; waived: WaivedDiagnostic[] };
  }
  const outcome = applyWaivers(context.procedure, context.source, found);
  if (key) store!.set(key, outcome);
  return outcome;
}

/** Diagnostics kept for one file, only when every one is a diagnostic of that file. */
function cachedDiagnostics(store: ResultCache, key: string, file: string): Diagnostic[] | undefined {
  const value = store.get<unknown>(key);
  return Array.isArray(value) && value.every((d) => isDiagnostic(d) && d.file === file) ? value as Diagnostic[] : undefined;
}

function cachedManual(store: ResultCache, key: string, contexts: FileContext[]): CachedManual | undefined {
  const value = store.get<Partial<CachedManual>>(key);
  const names = new Set(contexts.map((c) => c.file));
  if (!value || !Array.isArray(value.files) || !Array.isArray(value.register) || !value.register.every(isDiagnostic)) return undefined;
  if (!value.files.every((f) => f && typeof f === 'object' && names.has(f.file) && isDiagnostic(f.diagnostic) && f.diagnostic.file === f.file)) return undefined;
  if (!Array.isArray(value.waivers) || !value.waivers.every((w) => w && typeof w === 'object' && names.has(w.file)
    && Array.isArray(w.kept) && w.kept.every(isDiagnostic) && Array.isArray(w.waived) && w.waived.every(isWaived))) return undefined;
  return value as CachedManual;
}

function isWaived(value: unknown): value is WaivedDiagnostic {
  if (!value || typeof value !== 'object') return false;
  const { diagnostic, waiver } = value as { diagnostic?: unknown; waiver?: Record<string, unknown> };
  return isDiagnostic(diagnostic) && !!waiver && typeof waiver === 'object' && typeof waiver.step === 'string' && typeof waiver.rule === 'string'
    && typeof waiver.reason === 'string' && typeof waiver.line === 'number' && typeof waiver.column === 'number';
}

/** Whether a value read back (from the cache) has the shape of a diagnostic. */
export function isDiagnostic(value: unknown): value is Diagnostic {
  if (!value || typeof value !== 'object') return false;
  const d = value as Record<string, unknown>;
  return typeof d.file === 'string' && typeof d.line === 'number' && typeof d.column === 'number'
    && typeof d.rule === 'string' && typeof d.message === 'string' && ['error', 'warning', 'info'].includes(d.severity as string);
}

function readPrevious(file: string, previous: { text: string; commit: string }, register?: PlantRegister): FileHistory {
  // Read against the same register, so that moving a declaration into the register is not a change of content.
  const { source, procedure } = readProcedure(file, previous.text, register);
  return { commit: previous.commit, text: previous.text, source, procedure };
}

function firstLineOf(error: unknown): string {
  return String((error as Error)?.message ?? error).split('\n')[0].slice(0, 200);
}

function unreadable(file: string) {
  const source = readSource(file, '');
  return { source: { ...source, diagnostics: [] }, procedure: null, schemaIssues: [], facts: null };
}

/** A rule that fails on odd input must not take the whole check down; it becomes one internal diagnostic. */
function runGuarded(rule: Rule, run: () => void, context: FileContext | undefined, emit: (c: FileContext, m: RuleMeta, r: Report) => void): void {
  try {
    run();
  } catch (error) {
    if (!context) return;
    emit(context, rule.meta, {
      severity: 'error',
      message: `Rule '${rule.meta.id}' could not finish on this file (${(error as Error)?.message ?? String(error)}).`,
      hint: 'This is a fault in Stepwright, not in the procedure; other rules still ran. Please report it with the file.',
    });
  }
}

/** Kept for callers written before the reading of a procedure had its own module. */
export { readProcedure } from '../read/read-procedure.ts';
