// Reports a level problem (a limit, alarm, trip or relief set pressure out of order) where it was written: in a
// register file or in a procedure, with the other level as a related place.
import { levelsForProcedure, levelsInRegister, type Level, type LevelPlace } from '../analysis/signal-levels.ts';
import type { PlantRegister } from '../model/register.ts';
import type { FileContext, ManualContext, Report } from './define-rule.ts';

/** The related-place entry for a level, with its range read from the right file. */
export function relatedOf(level: Level | LevelPlace, message: string, register: PlantRegister | undefined): NonNullable<Report['related']>[number] {
  const at = 'at' in level ? level.at : level;
  if (!at.inRegister) return { path: at.path, message };
  const range = register?.sources.find((s) => s.file === at.file)?.source.rangeOf(at.path);
  return { file: at.file, ...(range ? { range } : {}), message };
}

/** Sends a report to the file the place is in: a register file, or the procedure `file` (when given). */
export function reportAtPlace(ctx: ManualContext, place: LevelPlace, file: FileContext | undefined, report: Omit<Report, 'path' | 'range'>): void {
  if (place.inRegister) ctx.reportInRegister(place.file, { ...report, path: place.path });
  else if (file) ctx.report(file, { ...report, path: place.path });
}

/**
 * Runs a level check over the register (each problem once, in the register file) and over every procedure
 * (problems that involve at least one level the procedure writes itself, reported there).
 */
export function checkLevels(
  ctx: ManualContext,
  find: (levels: Level[], signal: string, where: { register?: PlantRegister; file?: FileContext }) => Array<{ level: Level; against?: Level }>,
  report: (problem: { level: Level; against?: Level }, file: FileContext | undefined) => void,
): void {
  const registerLevels = ctx.register ? levelsInRegister(ctx.register) : undefined;
  for (const [signal, levels] of registerLevels ?? []) {
    for (const problem of find(levels, signal, { register: ctx.register })) report(problem, undefined);
  }
  for (const file of ctx.files) {
    if (!file.procedure) continue;
    for (const [signal, levels] of levelsForProcedure(file.procedure, registerLevels)) {
      for (const problem of find(levels, signal, { register: ctx.register, file })) {
        if (problem.level.at.inRegister && (problem.against?.at.inRegister ?? true)) continue;
        report(problem, file);
      }
    }
  }
}

export function capitalize(s: string): string {
  return s ? s[0].toUpperCase() + s.slice(1) : s;
}
