// Prints diagnostics as GitHub Actions workflow commands, so they show as annotations on the pull request's files.
import type { Diagnostic } from '../parse/diagnostic.ts';

const level = { error: 'error', warning: 'warning', info: 'notice' } as const;

/** `pathOf` maps a file name to a path relative to the repository root, which is what GitHub matches. */
export function formatGithub(diagnostics: Diagnostic[], pathOf: (file: string) => string = (f) => f): string {
  return diagnostics.map((d) => {
    const props = [
      `file=${escapeProperty(pathOf(d.file))}`,
      `line=${d.line}`, `endLine=${d.endLine}`,
      `col=${d.column}`,
      ...(d.endLine === d.line ? [`endColumn=${d.endColumn}`] : []),
      `title=${escapeProperty(d.rule)}`,
    ];
    const message = d.hint ? `${d.message}\n${d.hint}` : d.message;
    return `::${level[d.severity]} ${props.join(',')}::${escapeData(message)}\n`;
  }).join('');
}

// The escapes GitHub's workflow command parser undoes: %, CR and LF in data; also : and , in properties.
function escapeData(text: string): string {
  return text.replace(/%/g, '%25').replace(/\r/g, '%0D').replace(/\n/g, '%0A');
}

function escapeProperty(text: string): string {
  return escapeData(text).replace(/:/g, '%3A').replace(/,/g, '%2C');
}
