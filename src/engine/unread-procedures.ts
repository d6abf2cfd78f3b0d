// Files of the manual that yielded no procedure because they could not be read (an unreadable file, a YAML error,
// a bad front-matter): a command that looks a procedure up by its id says that such a file may hold it, naming the
// file and its first problem, instead of saying that no procedure has the id.
import type { Diagnostic } from '../parse/diagnostic.ts';
import type { SourceInput } from '../check/run-checks.ts';
import { isNotAProcedure } from './not-a-procedure.ts';

export interface UnreadFile {
  file: string;
  /** The first error found in it, as `file:line:column message`. */
  problem: string;
  /** True when its raw text has an `id:` line with the id looked for. */
  holdsId: boolean;
}

/**
 * The files among `inputs` that were read as no procedure because of an error, with the first error of each, in
 * the order given; the ones whose raw text names `id` on an `id:` line come first. Markdown that is not meant as a
 * procedure (no front-matter and no procedure keys, e.g. a README) is not counted.
 */
export function unreadFiles(id: string, inputs: SourceInput[], checked: Array<{ file: string; procedure: unknown; diagnostics: Diagnostic[] }>): UnreadFile[] {
  const byFile = new Map(inputs.map((i) => [i.file, i]));
  const idLine = new RegExp(`^\\uFEFF?[ \\t]*id[ \\t]*:[ \\t]*["']?${id.replace(/[.*+?^${}()|[\]\\-]/g, '\\$&')}["']?[ \\t]*(#.*)?$`, 'm');
  const out: UnreadFile[] = [];
  for (const f of checked) {
    if (f.procedure) continue;
    const input = byFile.get(f.file);
    if (input && 'text' in input && isNotAProcedure(input.text)) continue;
    const first = f.diagnostics.filter((d) => d.severity === 'error').sort((a, b) => a.line - b.line || a.column - b.column)[0];
    const problem = first ? `${first.file}:${first.line}:${first.column} ${first.message}` : input && 'error' in input ? `${f.file}: ${input.error}` : `${f.file}: it holds no procedure`;
    out.push({ file: f.file, problem, holdsId: Boolean(input && 'text' in input && idLine.test(input.text)) });
  }
  return [...out.filter((u) => u.holdsId), ...out.filter((u) => !u.holdsId)];
}
