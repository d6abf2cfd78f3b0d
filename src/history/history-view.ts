// What the site prints about a procedure's past: every revision at a stable URL, its redline against the one
// before, and an audit trail of every commit in order (who, when, why), nothing merged away or rewritten.
import type { Approval } from '../model/procedure.ts';
import { changedAreasBetween, type ContentArea } from '../analysis/document-content.ts';
import { hasTakenEffect } from '../analysis/document-control.ts';
import type { ProcedureHistory, Revision } from './revisions.ts';
import type { VersionRecord } from './version-record.ts';

export interface RevisionEntry {
  revision: number;
  url: string;
  /** Present when there is an earlier revision to compare with. */
  redlineUrl?: string;
  previous?: number;
  status: string;
  effective?: string;
  change?: string;
  approvals: Array<Pick<Approval, 'role' | 'name' | 'date' | 'meaning'>>;
  /** First commit of this revision: who wrote it and when. */
  introduced: { date: string; author: string; commit: string; subject: string };
  /** True once a later revision has taken effect (or this one was superseded or retired): not for use. */
  superseded: boolean;
  /** False when a shallow clone hides the revision's first commits. */
  complete: boolean;
  /** The revision's committed text (its last commit): its pages are drawn from it (site-data/history.ts reads it). */
  text: string;
  path: string;
  /** The ids of the procedures its steps call. */
  calls: string[];
}

export interface AuditEntry {
  date: string;
  author: string;
  email: string;
  commit: string;
  subject: string;
  path: string;
  /** File renamed in this commit, from this path. */
  renamedFrom?: string;
  revision: number | null;
  status: string;
  /** What the commit did, in words: "revision 2 started", "status draft → effective", "content edited in place: limits". */
  events: string[];
  /** Content areas changed while the revision number stayed the same and the revision had been released. */
  editedInPlace: ContentArea[];
  change?: string;
}

export interface HistoryView {
  id: string;
  slug: string;
  currentUrl: string;
  currentRevision: number;
  /** Oldest first; one entry per revision number (the last commit that carried it). */
  revisions: RevisionEntry[];
  audit: AuditEntry[];
  notice?: string;
  /** Uncommitted work, when the site is built from a working copy that differs from the last commit. */
  draft?: { revision: number | null; status: string };
}

const released = new Set(['approved', 'effective', 'superseded', 'retired']);

/**
 * Whether a revision took effect: superseded and retired ones did; an effective one did once its effective date is
 * reached (an effective status with a later date is not in force yet, see analysis/document-control.ts). Without
 * `today` the date is not looked at.
 */
function tookEffect(r: { status?: string; effective?: string }, today: string | undefined): boolean {
  if (r.status === 'superseded' || r.status === 'retired') return true;
  return r.status === 'effective' && (today === undefined || hasTakenEffect(r, today));
}

export function buildHistoryView(
  history: ProcedureHistory,
  identity: { id: string; slug: string; currentRevision: number; currentStatus?: string; currentEffective?: string; url?: string; today?: string },
): HistoryView {
  // Under the procedure's own page, which carries the manual's base (see render/site-url.ts).
  const base = (identity.url ?? `/procedures/${identity.slug}/`).replace(/\/$/, '');
  // A revision number that appears twice (it went down and up again) keeps its last occurrence for its URL.
  const byNumber = new Map<number, Revision>();
  for (const r of history.revisions) if (r.revision !== null) byNumber.set(r.revision, r);
  const numbers = [...byNumber.keys()].sort((a, b) => a - b);
  // A revision stays in force until a later one takes effect: a later draft or revision in review replaces nothing.
  const effectiveRevisions = numbers.filter((n) => tookEffect(byNumber.get(n)!, identity.today));
  if (identity.currentStatus && tookEffect({ status: identity.currentStatus, effective: identity.currentEffective }, identity.today)) effectiveRevisions.push(identity.currentRevision);
  const supersededBefore = Math.max(-Infinity, ...effectiveRevisions);
  const revisions = numbers.map((n, i): RevisionEntry => {
    const r = byNumber.get(n)!;
    const previous = i > 0 ? numbers[i - 1] : undefined;
    return {
      revision: n,
      url: `${base}/rev/${n}/`,
      ...(previous !== undefined ? { redlineUrl: `${base}/rev/${n}/redline/`, previous } : {}),
      status: r.status, effective: r.effective, change: r.change,
      approvals: r.approvals.map(({ role, name, date, meaning }) => ({ role, name, date, meaning })),
      introduced: { date: r.introduced.date, author: r.introduced.author, commit: r.introduced.commit, subject: r.introduced.subject },
      superseded: n < supersededBefore || r.status === 'superseded' || r.status === 'retired',
      complete: r.complete,
      text: r.text, path: r.path, calls: r.record?.calls ?? [],
    };
  });
  return {
    id: identity.id,
    slug: identity.slug,
    currentUrl: `${base}/`,
    currentRevision: identity.currentRevision,
    revisions,
    audit: auditTrail(history),
    ...(history.notice ? { notice: history.notice } : {}),
    ...(history.draft ? { draft: { revision: history.draft.revision, status: history.draft.status } } : {}),
  };
}

function auditTrail(history: ProcedureHistory): AuditEntry[] {
  const out: AuditEntry[] = [];
  let before: VersionRecord | null = null;
  let beforeRevision: number | null = null;
  let beforeStatus = '';
  for (const r of history.revisions) {
    r.commits.forEach((c, i) => {
      const events: string[] = [];
      const now = r.commitRecords[i] ?? null;
      if (c.renamedFrom) events.push(`file moved from ${c.renamedFrom}`);
      const cut = history.shallow && !c.hasParents;
      if (out.length === 0) events.push(cut ? `earliest commit in this clone (revision ${c.revision ?? '?'})` : `revision ${c.revision ?? '?'} created`);
      else if (c.revision !== beforeRevision) events.push(`revision ${beforeRevision ?? '?'} → ${c.revision ?? '?'}`);
      if (out.length > 0 && c.status !== beforeStatus) events.push(`status ${beforeStatus || '?'} → ${c.status || '?'}`);
      const areas = before && now ? changedAreasBetween(before.content, now.content) : [];
      const inPlace = c.revision === beforeRevision && released.has(beforeStatus) ? areas : [];
      if (areas.length && !inPlace.length && out.length > 0) events.push(`content: ${areas.join(', ')}`);
      if (inPlace.length) events.push(`content edited in place: ${inPlace.join(', ')}`);
      events.push(...signatureEvents(before, now, c.revision === beforeRevision ? undefined : beforeRevision));
      if (!events.length) events.push('document control only');
      out.push({
        date: c.date, author: c.author, email: c.email, commit: c.commit, subject: c.subject, path: c.path,
        ...(c.renamedFrom ? { renamedFrom: c.renamedFrom } : {}),
        revision: c.revision, status: c.status, events, editedInPlace: inPlace, change: now?.change,
      });
      before = now;
      beforeRevision = c.revision;
      beforeStatus = c.status;
    });
  }
  return out;
}

/**
 * Signatures added or removed by a commit: the audit shows when each approval entered the record. When the commit
 * starts a new revision, signatures copied from the old one are named as copies, not as new signatures.
 */
function signatureEvents(before: VersionRecord | null, now: VersionRecord | null, newRevisionAfter?: number | null): string[] {
  if (!now) return [];
  const text = (a: Approval) => `${a.role} ${a.name} (${a.date}, ${a.meaning})`;
  const old = new Set((before?.approvals ?? []).map(text));
  const current = new Set(now.approvals.map(text));
  if (newRevisionAfter !== undefined) {
    return now.approvals.map((a) => (old.has(text(a)) ? `approval copied from revision ${newRevisionAfter ?? '?'}, not a new signature: ${text(a)}` : `signed: ${text(a)}`));
  }
  return [
    ...now.approvals.filter((a) => !old.has(text(a))).map((a) => `signed: ${text(a)}`),
    ...(before?.approvals ?? []).filter((a) => !current.has(text(a))).map((a) => `signature removed: ${text(a)}`),
  ];
}
