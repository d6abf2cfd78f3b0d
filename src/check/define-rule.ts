// What a rule is: its metadata (id, summary, default severity, docs, source) and its check.
import type { Diagnostic, RelatedPlace, Severity, SourceRange } from '../parse/diagnostic.ts';
import type { ParsedSource, PathKey } from '../parse/read-source.ts';
import type { Procedure } from '../model/procedure.ts';
import type { SchemaIssue } from '../model/validate.ts';
import type { ProcedureFacts } from '../analysis/procedure-facts.ts';
import type { PlantRegister } from '../model/register.ts';

export type RuleCategory = 'syntax' | 'structure' | 'sequence' | 'conditions' | 'limits' | 'document-control' | 'safety' | 'writing' | 'history';

export interface RuleMeta {
  /** Permanent kebab-case id; also the file name. */
  id: string;
  /** One line: what the rule reports. */
  summary: string;
  category: RuleCategory;
  defaultSeverity: Severity;
  /** Markdown: why the rule exists and how to fix what it reports. */
  docs: string;
  /** Published source the rule rests on, when there is one. */
  source?: string;
  examples?: { good: string; bad: string };
  /**
   * The rule reads today's date (`today` of its context); check judges it also at the build date. A rule that sets
   * it must not be in a category that takes part in call expansion (tests/check/dated-rules.test.ts holds both).
   */
  dated?: true;
  /**
   * The rule also runs on a caller with its calls expanded, whatever its category (call expansion takes the
   * sequence, condition and limit rules by category): a rule that holds a kind of procedure to more than each
   * called procedure asks of itself, so that steps run through a call are held to it too (the emergency rules).
   */
  inCallExpansion?: true;
}

export interface Report {
  /** Where: a YAML path (value or key), or an explicit range. */
  path?: readonly PathKey[];
  part?: 'key' | 'value';
  range?: SourceRange;
  message: string;
  hint?: string;
  /** Overrides the rule's default severity for this one report (the configuration still wins). */
  severity?: Severity;
  related?: Array<{ path?: readonly PathKey[]; range?: SourceRange; file?: string; message: string }>;
  trace?: string[];
}

/** The previous committed version of a file, for rules that judge a change (supplied by the caller). */
export interface FileHistory {
  /** The commit (or ref) the previous text was read from. */
  commit: string;
  text: string;
  source: ParsedSource;
  procedure: Procedure | null;
}

export interface FileContext {
  file: string;
  source: ParsedSource;
  /** Null when the front-matter could not be read at all. */
  procedure: Procedure | null;
  schemaIssues: SchemaIssue[];
  /** Parsed conditions, the step graph and other derived facts, computed once and shared. */
  facts: ProcedureFacts | null;
  /** Today's date as YYYY-MM-DD (injected so tests control the clock). */
  today: string;
  /** Why the file could not be read, when it could not. */
  readError?: string;
  /** The previous committed version, when the caller knows it; history rules do nothing without it. */
  history?: FileHistory;
  /** The plant register the procedure was read against, when the plant has one. */
  register?: PlantRegister;
  /** Longest time between two certifications of a procedure in use, in months. */
  certificationIntervalMonths?: number;
  /** The id of every rule the checker runs (what a waiver may name). */
  ruleIds: readonly string[];
  report(report: Report): void;
}

export interface ManualContext {
  files: FileContext[];
  today: string;
  /** Report against one of the files. */
  report(file: FileContext, report: Report): void;
  /** The plant register, when the plant has one. */
  register?: PlantRegister;
  /** Report against a register file (paths are YAML paths in that file). */
  reportInRegister(file: string, report: Report): void;
  /** Set when `files` are only part of the manual: `left` files of the procedures folder were not given. */
  partial?: { folder: string; left: number };
  /**
   * Runs `work`, which reports on `file`, or gives again what it reported when it last ran on the same inputs:
   * the file, the procedures it calls (call after call), what every rule depends on (the Stepwright code, the
   * configuration, the register, the date) and `inputs`, which must name everything else `work` reads from other
   * files. `reads`: other files whose procedures `work` reads (their keys join the key). Without a result cache, or
   * when a file it depends on has no key, `work` simply runs; work that also reports on another file or on the
   * register is not kept, and runs again next time.
   */
  perFile(file: FileContext, inputs: string, work: () => void, reads?: FileContext[]): void;
}

/**
 * Work that a file rule's `check` will need and that can run beside the main thread (the English model's tagging).
 * It never reports and never changes what `check` finds; it only changes when the work is done.
 */
export interface WorkAhead {
  /**
   * Starts the work for one file. The engine calls it for each file it will check, a stretch of files ahead of the
   * one being checked (for a small run, every file before any rule runs).
   */
  prepare(context: FileContext): void;
  /**
   * Whether `check` can run on the file now without waiting for that work. When it cannot, the engine may check the
   * file's other rules first and come back to this one later.
   */
  ready(context: FileContext): boolean;
}

export interface FileRule {
  meta: RuleMeta;
  scope: 'file';
  check(context: FileContext): void;
  /** Work for `check` that can be started ahead, beside the main thread (see WorkAhead). */
  ahead?: WorkAhead;
}

export interface ManualRule {
  meta: RuleMeta;
  scope: 'manual';
  check(context: ManualContext): void;
}

/**
 * A check the engine makes itself, across procedures (call expansion, src/check/call-expansion.ts). The rule
 * entry carries its id, docs, examples and fixtures like any rule; the engine reports under that id.
 */
export interface EnginePass {
  meta: RuleMeta;
  scope: 'engine';
}

export type Rule = FileRule | ManualRule | EnginePass;

export function defineFileRule(meta: RuleMeta, check: (context: FileContext) => void, ahead?: WorkAhead): FileRule {
  return { meta, scope: 'file', check, ...(ahead ? { ahead } : {}) };
}

export function defineEnginePass(meta: RuleMeta): EnginePass {
  return { meta, scope: 'engine' };
}

export function defineManualRule(meta: RuleMeta, check: (context: ManualContext) => void): ManualRule {
  return { meta, scope: 'manual', check };
}

export function toDiagnostic(rule: RuleMeta, severity: Severity, source: ParsedSource, report: Report): Diagnostic {
  const range = report.range ?? (report.path ? source.rangeOf(report.path, report.part) : source.rangeOf([]));
  const related: RelatedPlace[] | undefined = report.related?.map((r) => {
    const at = r.range ?? (r.path ? source.rangeOf(r.path) : source.rangeOf([]));
    return { file: r.file ?? source.file, line: at.line, column: at.column, message: r.message };
  });
  return {
    file: source.file,
    ...range,
    severity,
    rule: rule.id,
    message: report.message,
    ...(report.hint ? { hint: report.hint } : {}),
    ...(related && related.length ? { related } : {}),
    ...(report.trace && report.trace.length ? { trace: report.trace } : {}),
  };
}
