// Document-control facts: the last certification of a procedure, the latest allowed review date, and which
// temporary procedures are in force over which procedures.
import type { Procedure } from '../model/procedure.ts';

/** Adds whole months to a YYYY-MM-DD date; the day is clamped to the month's end (2026-08-31 + 6 → 2027-02-28). */
export function addMonths(date: string, months: number): string {
  const [y, m, d] = date.split('-').map(Number);
  const total = y * 12 + (m - 1) + months;
  const year = Math.floor(total / 12);
  const month = (total % 12) + 1;
  const last = new Date(Date.UTC(year, month, 0)).getUTCDate();
  return `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}-${String(Math.min(d, last)).padStart(2, '0')}`;
}

const isDate = (s: string | undefined): s is string => Boolean(s && /^\d{4}-\d{2}-\d{2}$/.test(s));

/**
 * The date the procedure was last confirmed current and accurate: its newest certification, or, before the first
 * one, the day the revision took effect (approval of a revision is a review of its whole text). With `today`,
 * certifications dated later are left out.
 */
export function lastCertification(p: Procedure, today?: string): { date: string; by: 'certification' | 'effective' } | undefined {
  // A certification dated after today has not happened: it cannot move the next one out (certification-in-future).
  const certified = p.certifications.map((c) => c.date).filter(isDate).filter((d) => !today || d <= today).sort().at(-1);
  const effective = isDate(p.effective) ? p.effective : undefined;
  if (certified && (!effective || certified >= effective)) return { date: certified, by: 'certification' };
  return effective ? { date: effective, by: 'effective' } : undefined;
}

export interface TemporaryInForce {
  id: string;
  title: string;
  file: string;
  expires?: string;
}

/**
 * Whether a revision has taken effect on `today`: its status is approved or effective and its effective date (when
 * it has a readable one) is not after `today`. An effective status with a later date is not in force yet, just like
 * an approved one: the date decides, the status only says the revision is released. Every "in force" decision (the
 * manual's page, the history, the rules) goes through here. Source: common practice (a procedure applies from its
 * effective date).
 */
export function hasTakenEffect(p: { status?: unknown; effective?: unknown }, today: string): boolean {
  const status = String(p.status);
  if (status !== 'approved' && status !== 'effective') return false;
  const effective = typeof p.effective === 'string' ? p.effective : undefined;
  return !isDate(effective) || effective <= today;
}

/** An approved or effective revision whose effective date is after `today` (so it is not in force yet). */
export function effectiveLater(p: { status?: unknown; effective?: unknown }, today: string): string | undefined {
  const status = String(p.status);
  if (status !== 'approved' && status !== 'effective') return undefined;
  return typeof p.effective === 'string' && isDate(p.effective) && p.effective > today ? p.effective : undefined;
}

/**
 * For each procedure id, the temporary procedures in force that modify it: approved or effective, kind temporary,
 * in force on `today` (effective date reached) and not past their end date. The site shows them on the modified procedure's page.
 */
export function temporaryProceduresInForce(procedures: Procedure[], today: string): Map<string, TemporaryInForce[]> {
  const out = new Map<string, TemporaryInForce[]>();
  for (const p of procedures) {
    if (p.kind !== 'temporary' || !hasTakenEffect(p, today)) continue;
    if (p.expires && p.expires < today) continue;
    for (const target of p.modifies) {
      const list = out.get(target.value) ?? [];
      list.push({ id: p.id, title: p.title, file: p.file, ...(p.expires ? { expires: p.expires } : {}) });
      out.set(target.value, list);
    }
  }
  return out;
}

/**
 * Whether a procedure may be used on `today`, and if not, why not (in words for a message): superseded or retired,
 * not yet approved and effective, effective only from a later date, or a temporary procedure past its end date.
 */
export function notInForce(p: Pick<Procedure, 'status' | 'effective' | 'kind' | 'expires'>, today: string): string | undefined {
  const status = String(p.status);
  if (status === 'superseded' || status === 'retired') return status;
  if (status !== 'effective' && status !== 'approved') return `'${status}', not yet in force`;
  if (!hasTakenEffect(p, today)) return `in force only from ${p.effective}`;
  if (p.kind === 'temporary' && p.expires && p.expires < today) return `a temporary procedure that expired on ${p.expires}`;
  return undefined;
}
