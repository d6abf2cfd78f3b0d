// The one shape every problem report takes, from the YAML reader to the CLI and the site.

export type Severity = 'error' | 'warning' | 'info';

export interface SourceRange {
  line: number;
  column: number;
  endLine: number;
  endColumn: number;
}

export interface RelatedPlace {
  file: string;
  line: number;
  column: number;
  message: string;
}

export interface Diagnostic extends SourceRange {
  file: string;
  severity: Severity;
  rule: string;
  message: string;
  hint?: string;
  related?: RelatedPlace[];
  /** A counterexample in the plant's words, e.g. the steps taken before a deadlock. */
  trace?: string[];
}

export const severityOrder: Record<Severity, number> = { error: 0, warning: 1, info: 2 };

export function compareDiagnostics(a: Diagnostic, b: Diagnostic): number {
  return (
    a.file.localeCompare(b.file) ||
    a.line - b.line ||
    a.column - b.column ||
    severityOrder[a.severity] - severityOrder[b.severity] ||
    a.rule.localeCompare(b.rule)
  );
}

export const startOfFile: SourceRange = { line: 1, column: 1, endLine: 1, endColumn: 1 };
