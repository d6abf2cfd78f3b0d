// The procedures a procedure requires to be completed before it starts, by id, with where each is written.
import type { Procedure } from '../model/procedure.ts';
import type { FileContext } from './define-rule.ts';

export interface RequiresSite {
  id: string;
  path: readonly (string | number)[];
}

export function requiresOf(procedure: Procedure): RequiresSite[] {
  return (procedure.requires ?? []).filter((r) => r.value.trim()).map((r) => ({ id: r.value.trim(), path: r.path }));
}

/** The first file for each procedure id (a duplicate id is reported by its own rule). */
export function filesById(files: FileContext[]): Map<string, FileContext> {
  const byId = new Map<string, FileContext>();
  for (const f of files) if (f.procedure?.id && !byId.has(f.procedure.id)) byId.set(f.procedure.id, f);
  return byId;
}
