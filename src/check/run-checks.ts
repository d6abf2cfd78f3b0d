// Runs every rule over a set of procedure sources and returns the diagnostics, sorted by place.
import { compareDiagnostics, type Diagnostic, type Severity } from '../parse/diagnostic.ts';
import { readSource, type ParsedSource } from '../parse/read-source.ts';
import type { Procedure } from '../model/procedure.ts';
import type { PlantRegister } from '../model/register.ts';
import type { ProcedureFacts } from '../analysis/procedure-facts.ts';
import { readProcedure } from '../read/read-procedure.ts';
import { toDiagnostic, type FileContext, type FileHistory, type FileRule, type Report, type Rule, type RuleMeta } from './define-rule.ts';
import { expandCalls, expansionCategories, type RawFinding } from './call-expansion.ts';
import { applyWaivers, type WaivedDiagnostic } from './waivers.ts';
import { allRules } from './rules/index.ts';
import { cacheKey, type ResultCache } from './result-cache.ts';

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
   * Per-file results kept between runs. `salt` must name everything the file rules depend on besides the file,
   * the date and its previous version: the Stepwright code (stepwrightStamp()) and the configuration text.
   */
  cache?: { store: ResultCache; salt: string };
}

export interface CheckedFile {
  file: string;
  source: ParsedSource | null;
  procedure: Procedure | null;
  facts: ProcedureFacts | null;
  diagnostics: Diagnostic[];
  /** Diagnostics set aside by a step's waiver (with its reason); kept out of `diagnostics`, shown by the site. */
  waived?: WaivedDiagnostic[];
}

export interface CheckResult {
  files: CheckedFile[];
  diagnostics: Diagnostic[];
  /** The register the procedures were read against, with the problems found in its own files. */
  register?: { register: PlantRegister; diagnostics: Diagnostic[] };
}

export function checkSources(inputs: SourceInput[], options: CheckOptions): CheckResult {
  const rules = options.rules ?? allRules;
  const files: CheckedFile[] = [];
  const contexts: FileContext[] = [];
  const sink = new Map<FileContext, Diagnostic[]>();
  // What the rules that call expansion compares with reported on each file alone (files the rules ran on).
  const ownFindings = new Map<FileContext, RawFinding[]>();

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
  for (const input of inputs) {
    // An unreadable file still gets a context, so that its one diagnostic goes through the rules like any other.
    let readError = 'error' in input ? input.error : undefined;
    let read: ReturnType<typeof readProcedure>;
    try {
      read = 'text' in input ? readProcedure(input.file, input.text, options.register) : unreadable(input.file);
    } catch (error) {
      // Whatever a file holds, the check goes on and the file gets a diagnostic: never a crash of the whole run.
      readError = `reading it failed inside Stepwright (${firstLineOf(error)}); this is a fault in Stepwright, please report it with the file`;
      read = unreadable(input.file);
    }
    const { source, procedure, schemaIssues, facts } = read;
    let current: RuleMeta = rules[0]?.meta;
    const previous = readError === undefined ? options.previous?.(input.file) : undefined;
    let history: FileHistory | undefined | null = null;
    const context: FileContext = {
      file: input.file, source, procedure, schemaIssues, facts, today: options.today, readError,
      register: options.register, certificationIntervalMonths: options.certificationIntervalMonths ?? 12,
      // The previous version is read only when a rule asks for it: a file found in the cache needs no second parse.
      get history() {
        if (history === null) history = previous ? readPrevious(input.file, previous, options.register) : undefined;
        return history;
      },
      report: (report) => {
        if (expansionCategories.has(current.category)) ownFindings.get(context)?.push({ rule: current, report });
        emit(context, current, report);
      },
    };
    sink.set(context, []);
    contexts.push(context);
    const key = options.cache && 'text' in input
      ? cacheKey([shared, input.file, input.text, options.today, previous?.commit, previous?.text])
      : undefined;
    const known = key ? options.cache!.store.get<Diagnostic[]>(key) : undefined;
    if (Array.isArray(known)) {
      sink.get(context)!.push(...known);
      continue;
    }
    ownFindings.set(context, []);
    for (const rule of rules) {
      if (rule.scope !== 'file') continue;
      current = rule.meta;
      runGuarded(rule, () => rule.check(context), context, emit);
    }
    if (key) options.cache!.store.set(key, sink.get(context));
  }

  const registerDiagnostics: Diagnostic[] = [];
  const register = options.register;
  const reportInRegister = (meta: RuleMeta) => (file: string, report: Report) => {
    const chosen = options.severity?.(meta.id, file);
    if (chosen === 'off') return;
    const source = register?.sources.find((s) => s.file === file)?.source ?? readSource(file, '');
    registerDiagnostics.push({ ...toDiagnostic(meta, chosen ?? report.severity ?? meta.defaultSeverity, source, report), file });
  };
  // The engine's own passes: call expansion checks each caller with its calls expanded.
  for (const pass of rules) {
    if (pass.scope !== 'engine') continue;
    try {
      expandCalls({
        files: contexts, rules: rules.filter((r): r is FileRule => r.scope === 'file'), ownFindings,
        report: (ctx, report) => emit(ctx, pass.meta, report),
      });
    } catch (error) {
      if (contexts[0]) {
        emit(contexts[0], pass.meta, {
          severity: 'error',
          message: `The check '${pass.meta.id}' could not finish (${(error as Error)?.message ?? String(error)}); calls were not checked together with their callers.`,
          hint: 'This is a fault in Stepwright, not in the procedures; other rules still ran. Please report it with the files.',
        });
      }
    }
  }

  for (const rule of rules) {
    if (rule.scope !== 'manual') continue;
    const inRegister = reportInRegister(rule.meta);
    try {
      rule.check({
        files: contexts, today: options.today, register, reportInRegister: inRegister,
        report: (ctx, report) => emit(ctx, rule.meta, report),
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

  for (const context of contexts) {
    const { kept, waived } = applyWaivers(context.procedure, context.source, sink.get(context)!.sort(compareDiagnostics));
    files.push({
      file: context.file, source: context.source, procedure: context.procedure, facts: context.facts,
      diagnostics: kept, waived,
    });
  }
  files.sort((a, b) => a.file.localeCompare(b.file));
  registerDiagnostics.sort(compareDiagnostics);
  return {
    files,
    diagnostics: [...files.flatMap((f) => f.diagnostics), ...registerDiagnostics].sort(compareDiagnostics),
    ...(register ? { register: { register, diagnostics: registerDiagnostics } } : {}),
  };
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
