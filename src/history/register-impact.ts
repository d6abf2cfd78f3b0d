// Change impact of a register change: which entries changed between two versions of the register, and every
// procedure that uses each of them, with whether that procedure's revision moved with the change.
import type { Procedure } from '../model/procedure.ts';
import type { PlantRegister, RegisterEntry } from '../model/register.ts';

export interface RegisterEntryChange {
  id: string;
  section: RegisterEntry['section'];
  change: 'added' | 'removed' | 'changed';
  /** Register file the entry is (or was) defined in. */
  file: string;
  /** Keys whose value changed, e.g. "trips-when: TI-210 >= 255 degC → TI-210 >= 265 degC". */
  details: string[];
  /** Every procedure that uses the entry, directly or through a trip that starts it. */
  procedures: Array<{ id: string; file: string; revisionChanged: boolean }>;
}

/** The entry as plain data without its place, so a move between files is not a change. */
function plain(entry: RegisterEntry): Record<string, unknown> {
  return JSON.parse(JSON.stringify(entry, (key, value) => (key === 'file' || key === 'path' ? undefined : value))) as Record<string, unknown>;
}

function show(value: unknown): string {
  if (value === undefined) return '(none)';
  if (value !== null && typeof value === 'object' && 'value' in (value as Record<string, unknown>) && Object.keys(value as object).length === 1) {
    return String((value as { value: unknown }).value);
  }
  return typeof value === 'string' ? value : JSON.stringify(value);
}

function details(before: Record<string, unknown>, after: Record<string, unknown>): string[] {
  const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])].filter((k) => k !== 'id' && k !== 'section');
  return keys.flatMap((k) => (JSON.stringify(before[k]) === JSON.stringify(after[k]) ? [] : [`${k.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}: ${show(before[k])} → ${show(after[k])}`]));
}

/** Every register id a procedure relies on: what it uses, and the safety functions those trips start. */
export function usedIds(procedure: Procedure, register: PlantRegister | undefined): Set<string> {
  const ids = new Set((procedure.registerUses ?? []).map((u) => u.id));
  const queue = [...ids];
  while (queue.length) {
    const fn = register?.safetyFunctions.get(queue.pop()!);
    if (fn?.starts && !ids.has(fn.starts)) {
      ids.add(fn.starts);
      queue.push(fn.starts);
    }
  }
  return ids;
}

/**
 * Compares the register at the base with the register now. `procedures` are the procedures now, read against the
 * new register (and, for a removed entry, also against the old one); `revisionChanged(file)` says whether the
 * procedure's revision differs from the base.
 */
export function registerImpact(
  before: PlantRegister | undefined,
  after: PlantRegister | undefined,
  procedures: Array<{ now: Procedure; atBase?: Procedure }>,
  revisionChanged: (procedure: Procedure) => boolean,
): RegisterEntryChange[] {
  const ids = [...new Set([...(before?.entries.keys() ?? []), ...(after?.entries.keys() ?? [])])].sort();
  const changes: RegisterEntryChange[] = [];
  for (const id of ids) {
    const old = before?.entries.get(id);
    const now = after?.entries.get(id);
    const a = old ? plain(old) : undefined;
    const b = now ? plain(now) : undefined;
    if (a && b && JSON.stringify(a) === JSON.stringify(b)) continue;
    const entry = (now ?? old)!;
    const users = procedures.filter((p) => usedIds(p.now, after).has(id) || (p.atBase ? usedIds(p.atBase, before).has(id) : false));
    changes.push({
      id,
      section: entry.section,
      change: !old ? 'added' : !now ? 'removed' : 'changed',
      file: entry.file,
      details: a && b ? details(a, b) : [],
      procedures: users.map((p) => ({ id: p.now.id, file: p.now.file, revisionChanged: revisionChanged(p.now) }))
        .sort((x, y) => x.id.localeCompare(y.id)),
    });
  }
  return changes;
}
