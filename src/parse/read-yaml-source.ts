// Reads a plain YAML file (a register file) with the same hardened reader as a procedure's front-matter:
// positions for every value, nesting and alias limits, one plain diagnostic for bad syntax.
import type { Diagnostic, SourceRange } from './diagnostic.ts';
import { readSource, type ParsedSource, type PathKey } from './read-source.ts';

const documentMarker = /^(---|\.\.\.)[ \t]*(#.*)?\r?$/m;

export function readYamlSource(file: string, text: string): ParsedSource {
  const clean = text.startsWith('\uFEFF') ? text.slice(1) : text;
  // The file is read as the front-matter of a one-line-longer text; every position moves back by that line.
  const marker = documentMarker.exec(clean);
  const wrapped = readSource(file, `---\n${marker ? '' : clean}\n---\n`);
  const back = (r: SourceRange): SourceRange => ({ ...r, line: Math.max(1, r.line - 1), endLine: Math.max(1, r.endLine - 1) });
  const diagnostics: Diagnostic[] = wrapped.diagnostics.map((d) => ({ ...back(d), file, severity: d.severity, rule: d.rule, message: d.message.replace('The front-matter', 'The file'), ...(d.hint ? { hint: d.hint } : {}) }));
  if (marker) {
    const line = clean.slice(0, marker.index).split('\n').length;
    diagnostics.push({
      file, line, column: 1, endLine: line, endColumn: marker[0].length + 1, severity: 'error', rule: 'yaml-syntax',
      message: `The file holds a document marker '${marker[1]}', so it is more than one YAML document; it was not read.`,
      hint: 'Keep one YAML document per file: remove the --- or ... line, or split the file in two.',
    });
  }
  return {
    file: wrapped.file, data: wrapped.data, body: wrapped.body, bodyText: wrapped.bodyText, bodyStartLine: wrapped.bodyStartLine,
    text,
    diagnostics,
    // The document is read only if asked for (a spread would read it at once).
    get doc() { return wrapped.doc; },
    release: () => wrapped.release(),
    rangeOf: (path: readonly PathKey[], part?: 'key' | 'value') => back(wrapped.rangeOf(path, part)),
    rangeInScalar: (path: readonly PathKey[], from: number, to: number) => back(wrapped.rangeInScalar(path, from, to)),
  };
}
