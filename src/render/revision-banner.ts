// The banner over one committed revision's page (procedures/<id>/rev/<n>/). It says which revision replaced it only
// when a later revision of the same procedure did take effect; a revision that was itself marked superseded or
// retired, with nothing after it, is not said to have a newer revision.
import type { Banner } from './manual.ts';
import { hasTakenEffect } from '../analysis/document-control.ts';

/** Superseded and retired revisions took effect; an effective one once its effective date is reached (given `today`). */
function tookEffect(r: { status: string; effective?: string }, today: string | undefined): boolean {
  if (r.status === 'superseded' || r.status === 'retired') return true;
  return r.status === 'effective' && (today === undefined || hasTakenEffect(r, today));
}

export interface RevisionBannerInput {
  /** The revision the page shows. */
  entry: { revision: number; status: string; superseded: boolean };
  /** Every committed revision of the procedure (any order). */
  revisions: ReadonlyArray<{ revision: number; status: string; effective?: string }>;
  /** The procedure as its file reads now, and its own page. */
  current: { id: string; revision: number; status: string; effective?: string; url: string; owner?: string };
  /** The build date: a revision whose effective date is later has not taken effect. */
  today?: string;
}

export interface RevisionBanner extends Banner {
  link: { href: string; text: string };
}

export function revisionBanner({ entry, revisions, current, today }: RevisionBannerInput): RevisionBanner {
  const n = entry.revision;
  const later = [...revisions.filter((r) => r.revision > n), ...(current.revision > n ? [current] : [])]
    .filter((r) => tookEffect(r, today))
    .map((r) => r.revision);
  const replacedBy = later.length ? Math.min(...later) : undefined;
  const ended = current.status === 'superseded' || current.status === 'retired';
  const whole = ended ? ` The procedure itself is now ${current.status}: its page says so and must not be used either.` : '';
  if (replacedBy !== undefined) {
    return {
      tone: 'stop', title: `SUPERSEDED — REVISION ${n} — DO NOT USE`,
      text: `This is an earlier revision, kept for the record. A newer revision of ${current.id}, revision ${replacedBy}, took effect and replaces this one.${whole}`,
      link: { href: current.url, text: ended ? `Go to the page of ${current.id}` : `Go to the current ${current.id}` },
    };
  }
  if (entry.status === 'retired') {
    return {
      tone: 'stop', title: `RETIRED — REVISION ${n} — DO NOT USE`,
      text: `This revision is retired and must not be used: the procedure no longer applies to the plant.`,
      link: { href: current.url, text: `Go to the page of ${current.id}` },
    };
  }
  if (entry.status === 'superseded' || entry.superseded) {
    return {
      tone: 'stop', title: `SUPERSEDED — REVISION ${n} — DO NOT USE`,
      text: `This revision is superseded and must not be used. No later revision of ${current.id} took effect in this manual, and the manual does not record which document replaces it: ask ${current.owner?.trim() ? `the procedure owner (${current.owner.trim()})` : 'the procedure owner'} for the procedure in force.`,
      link: { href: current.url, text: `Go to the page of ${current.id}` },
    };
  }
  if (n < current.revision) {
    return {
      tone: 'hold', title: `RECORD COPY OF REVISION ${n}, STILL IN FORCE`,
      text: `Revision ${current.revision} is ${current.status}${current.effective && today && current.effective > today ? ` from ${current.effective}` : ''} and has not taken effect. Until it does, this revision applies.`,
      link: { href: current.url, text: `See revision ${current.revision}` },
    };
  }
  return {
    tone: 'hold', title: `RECORD COPY OF REVISION ${n}`,
    text: `This is the committed text of revision ${n}. Operate from the procedure page, which shows the status in force.`,
    link: { href: current.url, text: 'Go to the procedure page' },
  };
}
