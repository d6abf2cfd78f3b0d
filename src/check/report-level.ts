// Reports a level problem (a limit, alarm, trip or relief set pressure out of order) where it was written: in a
// register file or in a procedure, with the other level as a related place.
import { levelsForProcedure, levelsInRegister, tripsNotAnalysed, type Level, type LevelPlace, type TripNotAnalysed } from '../analysis/signal-levels.ts';
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

/**
 * Says, as info, which trips a level check could not judge: those whose conditions could not be read as values, and
 * those that act on a signal only together with another condition (no level of their own on it). The register's
 * once, in the register file, and each procedure's own where it declares them. `wanted` picks the trips that matter
 * to the rule; `what` names what was not compared ("with the operating limits and alarms").
 */
export function reportTripsNotAnalysed(ctx: ManualContext, what: string, wanted: (trip: TripNotAnalysed) => boolean = () => true): void {
  const say = (trip: TripNotAnalysed, file: FileContext | undefined) => {
    if (!wanted(trip)) return;
    if (trip.onlyWith) {
      const signals = trip.onlyWith.join(' and ');
      reportAtPlace(ctx, trip.at, file, {
        severity: 'info',
        message: `Trip ${trip.owner} (${trip.condition}) acts on ${signals} only when the rest of its condition holds as well, so it has no level of its own there and was not compared ${what}.`,
        hint: 'A trip that acts only in one mode (a cleaning line-up, a burner lit) is judged against the levels of that mode by hand; give the mode its own limits in the procedure that runs it.',
      });
      return;
    }
    reportAtPlace(ctx, trip.at, file, {
      severity: 'info',
      message: `Trip ${trip.owner} (${trip.condition}) was not compared ${what}: its condition could not be read as a set of values (${trip.reason}).`,
      hint: trip.reason === 'too many cases'
        ? 'Split the trip condition into simpler trips, or compare its levels by hand.'
        : 'Correct the trip condition as the other diagnostics on it say (declared signals compared with quantities in their units); until then compare its levels by hand.',
    });
  };
  if (ctx.register) for (const trip of tripsNotAnalysed({ register: ctx.register })) say(trip, undefined);
  for (const file of ctx.files) {
    if (!file.procedure) continue;
    for (const trip of tripsNotAnalysed({ procedure: file.procedure })) say(trip, file);
  }
}

export function capitalize(s: string): string {
  return s ? s[0].toUpperCase() + s.slice(1) : s;
}
