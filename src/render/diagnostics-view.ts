// Diagnostics of one procedure file arranged for the live preview: a list, and per step the ones that touch it.
import type { Diagnostic } from '../parse/diagnostic.ts';
import type { ParsedSource } from '../parse/read-source.ts';
import type { Procedure } from '../model/procedure.ts';
import { walkSteps } from '../model/walk-steps.ts';

export interface DiagnosticItem {
  /** `file:line:column`, as `stepwright check` prints it. */
  place: string;
  line: number;
  severity: Diagnostic['severity'];
  rule: string;
  message: string;
  hint?: string;
  /** The innermost step whose YAML holds the reported line, if any. */
  stepId?: string;
}

export interface DiagnosticsView {
  file: string;
  counts: { error: number; warning: number; info: number };
  items: DiagnosticItem[];
  /** Step id → the items reported inside that step. */
  byStep: Map<string, DiagnosticItem[]>;
}

export function buildDiagnosticsView(
  file: { file: string; diagnostics: Diagnostic[]; source: ParsedSource | null; procedure: Pick<Procedure, 'steps'> | null },
): DiagnosticsView {
  // Each step's line span in the file; nested steps are narrower, so the narrowest span wins. Only asked for when
  // there is something to place: a position may mean reading the front-matter again (parse/read-source.ts).
  const spans = file.procedure && file.source && file.diagnostics.some((d) => d.file === file.file)
    ? walkSteps(file.procedure.steps).map(({ step }) => ({ id: step.id, ...file.source!.rangeOf(step.path) }))
    : [];
  const stepAt = (line: number) => spans
    .filter((s) => s.id && s.line <= line && line <= s.endLine)
    .sort((a, b) => (a.endLine - a.line) - (b.endLine - b.line))[0]?.id;
  const items = file.diagnostics.map((d): DiagnosticItem => ({
    place: `${d.file}:${d.line}:${d.column}`, line: d.line, severity: d.severity, rule: d.rule, message: d.message,
    ...(d.hint ? { hint: d.hint } : {}), ...(d.file === file.file ? { stepId: stepAt(d.line) } : {}),
  }));
  // Errors first: they stop the build; warnings can wait for review.
  const rank = { error: 0, warning: 1, info: 2 } as const;
  items.sort((a, b) => rank[a.severity] - rank[b.severity] || a.line - b.line);
  const byStep = new Map<string, DiagnosticItem[]>();
  for (const item of items) if (item.stepId) byStep.set(item.stepId, [...(byStep.get(item.stepId) ?? []), item]);
  const counts = { error: 0, warning: 0, info: 0 };
  for (const d of file.diagnostics) counts[d.severity]++;
  return { file: file.file, counts, items, byStep };
}
