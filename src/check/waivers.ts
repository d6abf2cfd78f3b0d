// Applies step waivers: a diagnostic inside a step that waives its rule (with a reason) is set aside, not lost.
import type { Diagnostic } from '../parse/diagnostic.ts';
import type { ParsedSource, PathKey } from '../parse/read-source.ts';
import type { Procedure, Step } from '../model/procedure.ts';
import { walkSteps } from '../model/walk-steps.ts';

/** Rules no waiver can silence: the ones about waivers, and those that mean the file was not read. */
export const unwaivableRules = new Set(['waiver-without-reason', 'waiver-unknown-rule', 'unreadable-file', 'yaml-syntax', 'missing-front-matter']);

export interface StepWaiver {
  step: string;
  rule: string;
  reason: string;
  /** Where the waiver is written. */
  line: number;
  column: number;
}

export interface WaivedDiagnostic {
  diagnostic: Diagnostic;
  waiver: StepWaiver;
}

/** The waivers of one step that the checker honours: a rule that may be waived, and a written reason. */
export function honouredWaivers(step: Step): Array<{ rule: string; reason: string; path: PathKey[] }> {
  return (step.waivers ?? [])
    .filter((w) => w.reason?.trim() && w.rule && !unwaivableRules.has(w.rule))
    .map((w) => ({ rule: w.rule, reason: w.reason!.trim(), path: w.path }));
}

/** Every valid waiver (with a reason) in a procedure, for the site to show beside its step. */
export function stepWaivers(procedure: Procedure, source: ParsedSource): StepWaiver[] {
  return walkSteps(procedure.steps).flatMap(({ step }) =>
    honouredWaivers(step).map((w) => {
      const at = source.rangeOf(w.path);
      return { step: step.id, rule: w.rule, reason: w.reason, line: at.line, column: at.column };
    }),
  );
}

/** Splits one file's diagnostics into those kept and those waived by the step they point into. */
export function applyWaivers(procedure: Procedure | null, source: ParsedSource | null, diagnostics: Diagnostic[]): { kept: Diagnostic[]; waived: WaivedDiagnostic[] } {
  if (!procedure || !source) return { kept: diagnostics, waived: [] };
  const scopes = walkSteps(procedure.steps).flatMap(({ step }) => {
    const waivers = stepWaivers({ ...procedure, steps: [step] }, source);
    return waivers.length ? [{ range: source.rangeOf(step.path), waivers }] : [];
  });
  if (!scopes.length) return { kept: diagnostics, waived: [] };
  const kept: Diagnostic[] = [];
  const waived: WaivedDiagnostic[] = [];
  for (const d of diagnostics) {
    const waiver = unwaivableRules.has(d.rule)
      ? undefined
      : scopes.find((s) => inside(d, s.range))?.waivers.find((w) => w.rule === d.rule);
    if (waiver) waived.push({ diagnostic: d, waiver });
    else kept.push(d);
  }
  return { kept, waived };
}

function inside(d: Diagnostic, r: { line: number; column: number; endLine: number; endColumn: number }): boolean {
  const afterStart = d.line > r.line || (d.line === r.line && d.column >= r.column);
  const beforeEnd = d.line < r.endLine || (d.line === r.endLine && d.column <= r.endColumn);
  return afterStart && beforeEnd;
}
