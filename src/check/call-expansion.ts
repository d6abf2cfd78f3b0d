// Call expansion, a pass of the check engine. Each procedure is checked on its own first; a procedure with
// `call` steps is then checked once more with every call expanded into the called steps (analysis/inline-calls),
// by the sequence, condition and limit rules (and the rules marked `inCallExpansion`, such as the emergency rules,
// which hold the steps an emergency procedure runs through a call to what they hold its own steps to). What those
// rules find only in the combination is reported at the call step, under the rule id `call-expansion-problem`.
//
// Findings are compared by place, not by wording: a finding's key is its rule id plus the procedure whose own
// text holds it and its YAML path there. Expanded content keeps the callee's paths under the call's path
// (`[...call step, 'call', ...path in the callee]`), so removing call-site prefixes from a path gives the place
// in the file that holds it, and the first prefix names the call step to report at.
import { collectFacts } from '../analysis/procedure-facts.ts';
import { callSitesOf, inlineCalls, type CallSite } from '../analysis/inline-calls.ts';
import type { Procedure } from '../model/procedure.ts';
import type { PathKey } from '../parse/read-source.ts';
import type { Severity, SourceRange } from '../parse/diagnostic.ts';
import type { FileContext, FileRule, Report, RuleMeta } from './define-rule.ts';
import { groupDigits } from '../parse/group-digits.ts';

/** Rule categories whose findings can change when a called procedure runs inside its caller. */
export const expansionCategories: ReadonlySet<string> = new Set(['sequence', 'conditions', 'limits']);

/**
 * Whether a rule runs again on callers with their calls expanded: the rules of `expansionCategories`, and a rule
 * marked `inCallExpansion` (one that holds a caller's kind of procedure to more than a called procedure asks of
 * itself, such as the emergency rules on the steps an emergency procedure runs through a call).
 */
export function takesPartInExpansion(meta: RuleMeta): boolean {
  return expansionCategories.has(meta.category) || meta.inCallExpansion === true;
}

/** One report of a file rule, as the pass compares it: the rule and where it points. */
export interface RawFinding {
  rule: RuleMeta;
  report: Report;
}

type Lookup = (id: string) => Procedure | undefined;

/**
 * Where a path of `procedure` (possibly expanded) really is: the procedure whose own file holds it and the path
 * in that file. A path under a call step's `call` key belongs to the called procedure, call after call.
 */
export function placeOf(procedure: Pick<Procedure, 'id' | 'steps'>, path: readonly PathKey[], lookup: Lookup): { procedure: string; path: readonly PathKey[]; site?: CallSite } {
  const site = callSiteAbove(procedure, path);
  if (!site) return { procedure: procedure.id, path };
  const inner = path.slice(site.path.length);
  const callee = lookup(site.callee);
  const deeper = callee ? placeOf(callee, inner, lookup) : { procedure: site.callee, path: inner };
  return { ...deeper, site };
}

/** The call step of `procedure` whose `call` path is a strict prefix of `path` (the path lies in called content). */
export function callSiteAbove(procedure: Pick<Procedure, 'id' | 'steps'>, path: readonly PathKey[]): CallSite | undefined {
  return callSitesOf(procedure).find((s) => path.length > s.path.length && s.path.every((k, i) => path[i] === k));
}

/**
 * The key two findings share when they are the same problem at the same place: the rule, where the report
 * points and the places it relates to (the limit a setpoint breaks, say), each placed in the file holding it.
 */
export function findingKey(finding: RawFinding, procedure: Pick<Procedure, 'id' | 'steps'>, lookup: Lookup): string {
  const { report } = finding;
  // A report placed by range, or at the whole file, has no path to place: its range and its wording are all
  // that tell it from another finding of the same rule, so both go into the key (two such findings never hide
  // each other; at worst one problem worded two ways is reported twice).
  const place = (path: readonly PathKey[] | undefined, range: SourceRange | undefined, message: string) => {
    if (path) {
      const at = placeOf(procedure, path, lookup);
      return [at.procedure, at.path];
    }
    const where = range ? `${range.line}:${range.column}-${range.endLine}:${range.endColumn}` : '(whole file)';
    return [procedure.id, [where], message];
  };
  const related = (report.related ?? [])
    .map((r) => JSON.stringify(r.file ? [r.file, r.range ?? null, r.path ?? null] : place(r.path, r.range, r.message)))
    .sort();
  return JSON.stringify([finding.rule.id, ...place(report.path, report.range, report.message), report.part ?? 'value', related]);
}

export interface CallExpansionInput {
  files: FileContext[];
  /** The file rules the engine runs (only those that `takesPartInExpansion` take part). */
  rules: FileRule[];
  /** What each file rule reported on a file alone, when the engine ran them (not for results from the cache). */
  ownFindings: Map<FileContext, RawFinding[]>;
  /** Reports a finding of the pass against a file, under the pass's rule id. */
  report(file: FileContext, report: Report): void;
  /** Callers not to expand (their findings are known from an earlier run). */
  skip?: (file: FileContext) => boolean;
}

/** Runs the pass over every procedure that calls others. */
export function expandCalls(input: CallExpansionInput): void {
  const checked = input.rules.filter((r) => takesPartInExpansion(r.meta));
  const byId = new Map<string, FileContext>();
  for (const f of input.files) if (f.procedure?.id && !byId.has(f.procedure.id)) byId.set(f.procedure.id, f);
  const lookup: Lookup = (id) => byId.get(id)?.procedure ?? undefined;
  // What a file reports on its own: from the engine's run when it ran the rules, else run here once.
  const alone = new Map<FileContext, RawFinding[]>();
  const ownOf = (file: FileContext): RawFinding[] => {
    let found = input.ownFindings.get(file) ?? alone.get(file);
    if (!found) {
      found = runRules(file, file.procedure!, file.facts, checked);
      alone.set(file, found);
    }
    return found;
  };

  for (const file of input.files) {
    if (input.skip?.(file) || !file.procedure) continue;
    const sites = callSitesOf(file.procedure);
    if (!sites.length) continue;
    const expanded = inlineCalls(file.procedure, lookup);
    // A call too deep or too large to expand is not checked in combination: say so, with the sizes.
    for (const problem of expanded.problems) {
      if (problem.kind !== 'too-deep' && problem.kind !== 'too-large') continue;
      input.report(file, {
        path: problem.site.path,
        severity: 'warning',
        message: problem.kind === 'too-deep'
          ? `Step '${problem.site.step.id}' calls '${problem.site.callee}' ${problem.depth} calls deep; calls are expanded at most ${problem.limit} deep, so this one was not checked together with its caller.`
          : `Expanding the call of '${problem.site.callee}' at step '${problem.site.step.id}' would give ${problem.steps > 1e15 ? 'more than 10^15' : groupDigits(problem.steps)} steps in all (calls multiplied out); the limit is ${groupDigits(problem.limit)}, so this call was not checked together with its caller.`,
        hint: 'Shared operations that call other shared operations multiply: call each one once, at the level where it is needed, or split the procedure.',
      });
    }
    if (!expanded.inlined.length) continue;
    // What each part reports on its own is already reported in its own file.
    const known = new Set(ownOf(file).map((f) => findingKey(f, file.procedure!, lookup)));
    for (const id of new Set(expanded.inlined)) {
      const callee = byId.get(id);
      if (callee?.procedure) for (const f of ownOf(callee)) known.add(findingKey(f, callee.procedure, lookup));
    }
    const reported = new Set<string>();
    for (const finding of runRules(file, expanded.procedure, collectFacts(expanded.procedure), checked)) {
      const key = findingKey(finding, file.procedure, lookup);
      if (known.has(key) || reported.has(key)) continue;
      reported.add(key);
      input.report(file, combinationReport(finding, file.procedure, expanded.inlined, byId));
    }
  }
}

/** A finding of the expanded procedure as the caller's report: at the call step it came through. */
function combinationReport(finding: RawFinding, caller: Procedure, inlined: string[], filesById: Map<string, FileContext>): Report {
  const { report, rule } = finding;
  const severity: Severity = report.severity ?? rule.defaultSeverity;
  const site = report.path ? callSiteAbove(caller, report.path) : undefined;
  const trace = [`rule ${rule.id}`];
  // Places the finding relates to (its limit, say) stay: those in the caller's own text as they are, those
  // already in another file (a register entry) too, and those in called content are moved to the file of the
  // procedure that holds them, at their place there.
  const related = (report.related ?? []).flatMap((r) => {
    if (r.file || r.range || !r.path || !callSiteAbove(caller, r.path)) return [r];
    const at = placeOf(caller, r.path, (id) => filesById.get(id)?.procedure ?? undefined);
    const holder = filesById.get(at.procedure);
    if (!holder) return [];
    return [{ file: holder.file, range: holder.source.rangeOf(at.path), message: `${r.message} (in ${at.procedure})` }];
  });
  if (site) {
    const inner = placeOf(caller, report.path!, (id) => (id === caller.id ? caller : undefined));
    if (inner.path.length) trace.push(`in ${site.callee} at ${inner.path.join('.')}`);
    return {
      path: site.path, severity, trace, ...(related.length ? { related } : {}),
      message: `With '${site.callee}' run by step '${site.step.id}': ${report.message}`,
      hint: report.hint ?? `Check the caller's limits and signals against '${site.callee}', or change the call.`,
    };
  }
  // In the caller's own text (its limits, a step after a call): reported there, naming the calls expanded.
  const named = [...new Set(inlined)].map((id) => `'${id}'`).join(', ');
  return {
    ...(report.path ? { path: report.path, part: report.part } : {}), severity, trace, ...(related.length ? { related } : {}),
    message: `With ${named} run by this procedure's call${inlined.length === 1 ? '' : 's'}: ${report.message}`,
    hint: report.hint ?? `Check the caller's limits and signals against ${named}, or change the calls.`,
  };
}

/** Runs the rules on one procedure (a file's own, or expanded) in that file's context and keeps their reports. */
function runRules(file: FileContext, procedure: Procedure, facts: FileContext['facts'], rules: FileRule[]): RawFinding[] {
  const out: RawFinding[] = [];
  for (const rule of rules) {
    const context: FileContext = {
      file: file.file, source: file.source, procedure, schemaIssues: [], facts, today: file.today, readError: file.readError,
      register: file.register, certificationIntervalMonths: file.certificationIntervalMonths, ruleIds: file.ruleIds, history: undefined,
      report: (report: Report) => out.push({ rule: rule.meta, report }),
    };
    try {
      rule.check(context);
    } catch {
      // A rule that cannot handle the combination says nothing here; on each file alone it still runs and says so.
    }
  }
  return out;
}
