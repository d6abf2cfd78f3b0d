// Live preview support for `stepwright dev`: notices saved procedure files, and builds the manual even when
// the procedures have check errors, so the pages can show the errors instead of failing.
import { statSync } from 'node:fs';
import type { CheckedFile } from '../check/run-checks.ts';
import { buildManualView, type ManualView } from '../render/manual.ts';
import { findProcedureFiles } from '../engine/find-procedure-files.ts';

/** Changes whenever a procedure file is added, removed or saved. */
export function procedureStamp(root: string, cwd: string): string {
  return findProcedureFiles([root], cwd).map((f) => {
    try {
      const s = statSync(f.absolute);
      return `${f.file}:${s.mtimeMs}:${s.size}`;
    } catch {
      return `${f.file}:gone`;
    }
  }).join('\n');
}

/** Every readable procedure; when one of them cannot be drawn, the ones without errors. */
export function tolerantManualView(input: { files: CheckedFile[]; root: string; today: string; base?: string }): ManualView {
  try {
    return buildManualView(input);
  } catch {
    return buildManualView({ ...input, files: input.files.filter((f) => !f.diagnostics.some((d) => d.severity === 'error')) });
  }
}
