// Prints diagnostics for people (with a code frame and hint) or as JSON for tools.
import { codeFrameColumns } from '@babel/code-frame';
import pc from 'picocolors';
import type { Diagnostic } from '../parse/diagnostic.ts';

export function formatJson(diagnostics: Diagnostic[]): string {
  return `${JSON.stringify(
    diagnostics.map((d) => ({
      file: d.file, line: d.line, column: d.column, endLine: d.endLine, endColumn: d.endColumn,
      severity: d.severity, rule: d.rule, message: d.message, hint: d.hint ?? null,
      ...(d.related ? { related: d.related } : {}), ...(d.trace ? { trace: d.trace } : {}),
    })),
    null,
    2,
  )}\n`;
}

export function formatHuman(diagnostics: Diagnostic[], texts: Map<string, string>, colour: boolean): string {
  const c = pc.createColors(colour);
  const paint = { error: c.red, warning: c.yellow, info: c.cyan } as const;
  const lines: string[] = [];
  for (const d of diagnostics) {
    lines.push(`${c.bold(`${d.file}:${d.line}:${d.column}`)} ${paint[d.severity](d.severity)} ${c.dim(d.rule)} ${d.message}`);
    const text = texts.get(d.file);
    if (text !== undefined) {
      const end = d.endLine === d.line && d.endColumn > d.column ? { line: d.endLine, column: d.endColumn } : undefined;
      const frame = codeFrameColumns(text, { start: { line: d.line, column: d.column }, end }, { highlightCode: false, linesAbove: 1, linesBelow: 1 });
      lines.push(frame.split('\n').map((l) => `  ${l}`).join('\n'));
    }
    for (const step of d.trace ?? []) lines.push(`  ${c.dim('trace:')} ${step}`);
    for (const r of d.related ?? []) lines.push(`  ${c.dim('see')} ${r.file}:${r.line}:${r.column} ${r.message}`);
    if (d.hint) lines.push(`  ${c.green('hint:')} ${d.hint}`);
    lines.push('');
  }
  return lines.length ? `${lines.join('\n')}\n` : '';
}

export function summarize(diagnostics: Diagnostic[], fileCount: number): string {
  const count = (s: Diagnostic['severity']) => diagnostics.filter((d) => d.severity === s).length;
  const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;
  return `${plural(fileCount, 'file')} checked: ${plural(count('error'), 'error')}, ${plural(count('warning'), 'warning')}, ${count('info')} info.\n`;
}
