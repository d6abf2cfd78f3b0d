// The whole operator manual as view models: checked procedures in, everything the pages print out.
// Pure: the caller reads the files and decides the build date.
import type { CheckedFile } from '../check/run-checks.ts';
import type { Approval, HazardLevel, Interlock, Procedure } from '../model/procedure.ts';
import { kinds } from '../model/schema.ts';
import { effectiveLater } from '../analysis/document-control.ts';
import { areaName, type AreaSource } from './area-names.ts';
import { renderBodyHtml } from './body-html.ts';
import { conditionInWords } from './condition-words.ts';
import { emergencyKinds, emergencyLead, type EmergencyLead } from './emergency-lead.ts';
import { chartLayoutPrintParts } from './chart-print.ts';
import { chartLayoutToSvg } from './chart-svg.ts';
import { layoutChart } from './chart-layout.ts';
import { hazardRank, signalWordColours } from './signal-words.ts';
import { numberSteps, type StepNumbers } from './step-numbers.ts';
import { buildStepTable, type TableRow } from './step-table.ts';
import { tagUsesIn, type TagRole, type TagUse } from './where-used.ts';
import { holdsWords, latchingWords, tripLatching, type TripSource } from './trip-latching.ts';
import { limitAlarms, splitQuantity, type AlarmSource } from './limit-alarms.ts';
import { pagePath, rootBase, siteUrl, type SiteBase } from './site-url.ts';
import { procedureIdsOf, tagPartLinks, type TagPartLink } from './tag-parts.ts';

export interface ManualInput {
  files: CheckedFile[];
  /** The procedures folder as the files' paths begin (e.g. `procedures`), for area names. */
  root: string;
  /** The build date, YYYY-MM-DD, for review marks. */
  today: string;
  /** The plant register, when there is one: area names, trips' latching and reset, and alarms come from it. */
  register?: PlantSource;
  /** Where the manual is served ("/" or e.g. "/manual/"); every URL in the view starts with it. */
  base?: SiteBase;
}

/** What the procedure pages need of a plant register. */
export type PlantSource = AreaSource & TripSource & AlarmSource;

/** An interlock as the "Interlocks and safety systems" table shows it. */
export interface InterlockView {
  tag: string;
  tripsWhen: string;
  tripsWhenWords?: string;
  action: string;
  tagUrl: string;
  /** Whether the trip latches, only where a source states it (render/trip-latching.ts). */
  latches?: boolean;
  /** That in one sentence: "Latches through ESD-210: it stays tripped until it is reset." */
  latching?: string;
  /** The register's reset instruction, and the function it belongs to when that is one the trip starts. */
  reset?: { text: string; through?: string };
  /** The outputs it holds while in force, in one sentence: "Holds XV-2001 closed until reset." */
  holds?: string;
}

/** An operating limit as the "Operating limits" table shows it, with the register's alarms on the signal. */
export interface LimitView {
  signal: string;
  text?: string;
  low?: string;
  high?: string;
  unit?: string;
  /** The register's alarms, as the number in `unit` when they are written in it, else as written. */
  alarmLow?: string;
  alarmHigh?: string;
  consequence?: string;
  correction?: string;
}

export interface Banner {
  /** `stop` for statuses that must not be used, `hold` for not yet usable. */
  tone: 'stop' | 'hold';
  title: string;
  text: string;
  /** Where to go instead, only when the manual knows it for certain. */
  link?: { href: string; text: string };
}

export interface ReviewMark {
  state: 'ok' | 'due-soon' | 'overdue' | 'none';
  text: string;
}

export interface ProcedureView {
  id: string;
  slug: string;
  url: string;
  file: string;
  /** The area's name as people on site say it (register, else a readable folder name). */
  area: string;
  /** The folder the procedure sits in, the area's stable key. */
  areaId: string;
  title: string;
  kind: string;
  kindLabel: string;
  revision: number;
  status: string;
  current: boolean;
  effective?: string;
  reviewBy?: string;
  review: ReviewMark;
  owner?: string;
  author?: string;
  change?: string;
  approvals: Array<Pick<Approval, 'role' | 'name' | 'date' | 'meaning'>>;
  /** Yearly certifications as current and accurate, newest first; separate from the approvals of the revision. */
  certifications: Array<{ name: string; role: string; date: string }>;
  equipment: string[];
  ppe: string[];
  banner?: Banner;
  hazards: Array<{ level: HazardLevel; word: string; hazard: string; consequence?: string; avoid?: string; steps: Array<{ id: string; number: string }> }>;
  interlocks: InterlockView[];
  limits: LimitView[];
  /**
   * The sequence chart, drawn when a page asks for it: a manual keeps every procedure's view for the whole build,
   * and the drawings are its largest part (two thousand procedures held hundreds of megabytes of SVG).
   */
  chart(): ChartDrawing;
  stepCount: number;
  /**
   * The step table, the body as HTML and the emergency lead are made when a page first reads them (and kept): only
   * the pages of the procedure itself show them, and a rebuild draws the pages of few procedures. They follow from
   * the procedure's text, the code and the view's own interlocks (see withoutDrawnParts).
   */
  readonly rows: TableRow[];
  readonly bodyHtml: string;
  /** Emergency and emergency-shutdown procedures: what to do first, shown before everything else. */
  readonly lead?: EmergencyLead;
  tags: Array<{ tag: string; url: string }>;
  /** The line-up: plant states required at the start, each in plant words where the signals have texts. */
  lineUp: Array<{ condition: string; words?: string }>;
  /** Procedures that must be complete before this one starts (a URL when the manual has the procedure). */
  requires: Array<{ id: string; url?: string; title?: string }>;
}

export interface ChartDrawing {
  svg: string;
  /** The chart cut at transitions into parts that each fit a printed page (empty when it fits one page). */
  printParts: string[];
}

export interface TagView {
  tag: string;
  slug: string;
  url: string;
  roles: TagRole[];
  uses: Array<TagUse & { procedure: Pick<ProcedureView, 'id' | 'title' | 'url' | 'status' | 'revision' | 'current'> }>;
  /** The parts its where-used list is shown in (render/tag-parts.ts): one for all but the most used tags. */
  parts: TagPartLink[];
}

export interface ManualView {
  today: string;
  procedures: ProcedureView[];
  areas: Array<{ area: string; id: string; kinds: Array<{ kind: string; label: string; procedures: ProcedureView[] }> }>;
  tags: TagView[];
}

const kindLabels: Record<string, string> = {
  normal: 'Normal operation', batch: 'Batch', startup: 'Start-up', 'startup-after-turnaround': 'Start-up after turnaround',
  shutdown: 'Shutdown', 'emergency-shutdown': 'Emergency shutdown', emergency: 'Emergency', temporary: 'Temporary',
};

export function kindLabel(kind: string): string {
  return kindLabels[kind] ?? kind;
}

/** URL-safe, file-name-safe, lower-case form of an id or tag (URLs are case-sensitive; people type them in lower case). */
export function slugOf(text: string): string {
  return text.toLowerCase().replace(/[^a-z0-9._-]+/g, '_').replace(/^\.+/, '_') || '_';
}

export function reviewMark(procedure: Pick<Procedure, 'reviewBy' | 'status'>, today: string): ReviewMark {
  if (!procedure.reviewBy) return { state: 'none', text: 'no review date' };
  if (procedure.status === 'superseded' || procedure.status === 'retired') return { state: 'none', text: procedure.reviewBy };
  if (procedure.reviewBy < today) return { state: 'overdue', text: `review overdue since ${procedure.reviewBy}` };
  if (procedure.reviewBy <= addDays(today, 30)) return { state: 'due-soon', text: `review due ${procedure.reviewBy}` };
  return { state: 'ok', text: procedure.reviewBy };
}

/**
 * The banner over a procedure that must not (or not yet) be used. It says only what the manual knows: the format
 * has no key that names the document replacing a superseded one, so the banner names none (a revision page of the
 * same procedure says which revision replaced it, see render/revision-banner.ts).
 */
export function statusBanner(procedure: Pick<Procedure, 'status' | 'effective'> & { owner?: string }, today: string): Banner | undefined {
  switch (procedure.status) {
    case 'draft':
      return { tone: 'hold', title: 'DRAFT — NOT FOR USE', text: 'This procedure is a draft. It has not been approved; do not operate the plant from it.' };
    case 'in-review':
      return { tone: 'hold', title: 'IN REVIEW — NOT FOR USE', text: 'This procedure is being reviewed. It has not been approved; do not operate the plant from it.' };
    case 'superseded':
      return {
        tone: 'stop', title: 'SUPERSEDED — DO NOT USE',
        text: `This procedure is superseded and must not be used. This manual does not record which document replaces it: ask ${askOwner(procedure.owner)} for the procedure in force.`,
      };
    case 'retired':
      return { tone: 'stop', title: 'RETIRED — DO NOT USE', text: 'This procedure is retired and must not be used: it no longer applies to the plant.' };
    case 'approved':
    case 'effective':
      // An effective status with a later effective date is not in force yet either (analysis/document-control.ts).
      if (effectiveLater(procedure, today)) {
        const title = procedure.status === 'approved' ? 'APPROVED — NOT YET EFFECTIVE' : `EFFECTIVE FROM ${procedure.effective} — NOT YET IN FORCE`;
        return { tone: 'hold', title, text: `This revision takes effect on ${procedure.effective}. Until then use the revision in force.` };
      }
      return undefined;
    default:
      return undefined;
  }
}

function askOwner(owner: string | undefined): string {
  return owner?.trim() ? `the procedure owner (${owner.trim()})` : 'the procedure owner';
}

function addDays(date: string, days: number): string {
  const d = new Date(`${date}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

function areaOf(file: string, root: string): string {
  const norm = file.split('\\').join('/');
  const prefix = root.replace(/\/+$/, '') + '/';
  const rel = norm.startsWith(prefix) ? norm.slice(prefix.length) : norm;
  const parts = rel.split('/');
  return parts.length > 1 ? parts[0] : '(top level)';
}

export function buildProcedureView(file: CheckedFile & { procedure: Procedure }, root: string, today: string, register?: PlantSource, base: SiteBase = rootBase): ProcedureView {
  const p = file.procedure;
  const numbers = numberSteps(p.steps);
  const slug = slugOf(p.id);
  const stepIds = new Set(file.facts?.steps.map((s) => s.step.id) ?? []);
  const hazards = [...p.hazards]
    .map((h, i) => ({ h, i }))
    .sort((a, b) => hazardRank(a.h.level) - hazardRank(b.h.level) || a.i - b.i)
    .map(({ h }) => ({
      level: h.level, word: signalWordColours[h.level]?.word ?? String(h.level).toUpperCase(), hazard: h.hazard, consequence: h.consequence, avoid: h.avoid,
      steps: h.at.filter((a) => stepIds.has(a.value)).map((a) => ({ id: a.value, number: numbers.ofStep.get(a.value) ?? '?' })),
    }));
  const limits = p.limits.map((l): LimitView => {
    const low = splitQuantity(l.low?.value);
    const high = splitQuantity(l.high?.value);
    const signal = p.signals[l.signal];
    const units = new Set([low.unit, high.unit].filter(Boolean));
    const unit = units.size === 1 ? [...units][0] : units.size === 0 ? signal?.unit : undefined;
    return {
      signal: l.signal, text: signal?.text,
      low: unit ? low.value : l.low?.value, high: unit ? high.value : l.high?.value, unit,
      ...limitAlarms(l.signal, unit, p, register),
      consequence: l.consequence, correction: l.correction,
    };
  });
  const interlocks = p.interlocks.map((i) => interlockView(i, p, register, base));
  const resetsByTag = new Map(interlocks.flatMap((i) => (i.reset ? [[i.tag, i.reset] as const] : [])));
  const tagNames = [...new Set([...p.equipment, ...p.interlocks.map((i) => i.tag), ...Object.keys(p.signals)])];
  const steps = file.facts?.steps.length ?? 0;
  let rows: TableRow[] | undefined;
  let bodyHtml: string | undefined;
  let lead: { value?: EmergencyLead } | undefined;
  return {
    id: p.id, slug, url: siteUrl(base, pagePath.procedure(slug)), file: p.file, area: areaName(areaOf(p.file, root), p.equipment, register), areaId: areaOf(p.file, root),
    title: p.title, kind: String(p.kind), kindLabel: kindLabel(String(p.kind)), revision: p.revision, status: String(p.status),
    current: p.status !== 'superseded' && p.status !== 'retired',
    effective: p.effective, reviewBy: p.reviewBy, review: reviewMark(p, today), owner: p.owner, author: p.author, change: p.change,
    approvals: p.approvals.map(({ role, name, date, meaning }) => ({ role, name, date, meaning })),
    certifications: p.certifications.map(({ name, role, date }) => ({ name, role, date })).sort((x, y) => y.date.localeCompare(x.date)),
    equipment: p.equipment, ppe: p.ppe, banner: statusBanner(p, today), hazards,
    interlocks,
    limits,
    chart: () => drawChart(p, numbers, steps),
    stepCount: steps,
    get rows() {
      return (rows ??= buildStepTable(p, numbers, resetsByTag));
    },
    get bodyHtml() {
      return (bodyHtml ??= renderBodyHtml(p.body));
    },
    get lead() {
      return (lead ??= emergencyKinds.has(String(p.kind)) ? { value: emergencyLead(p.body, this.rows, undefined, { conditions: p.shutdownConditions, responsible: p.responsible }) } : {}).value;
    },
    tags: tagNames.map((t) => ({ tag: t, url: siteUrl(base, pagePath.tag(slugOf(t))) })),
    lineUp: p.lineUp.map((l) => ({ condition: l.value, ...withWords(conditionInWords(l.value, p.signals)) })),
    requires: p.requires.map((r) => ({ id: r.value })),
  };
}

/** One row of the interlocks table: the trip, what it does, and whether it latches and how it is reset. */
function interlockView(i: Interlock, p: Procedure, register: TripSource | undefined, base: SiteBase): InterlockView {
  const latching = tripLatching(i, p, register);
  const words = latchingWords(latching);
  const held = holdsWords(i.holds, latching.latches ?? i.latches);
  return {
    tag: i.tag, tripsWhen: i.tripsWhen.value, tripsWhenWords: conditionInWords(i.tripsWhen.value, p.signals), action: i.action, tagUrl: siteUrl(base, pagePath.tag(slugOf(i.tag))),
    ...(latching.latches !== undefined ? { latches: latching.latches } : {}),
    ...(words ? { latching: words } : {}),
    ...(held ? { holds: held } : {}),
    ...(latching.reset ? { reset: { text: latching.reset, ...(latching.resetThrough ? { through: latching.resetThrough } : {}) } } : {}),
  };
}

/** The screen chart and, when a page asks for them (a revision page does not), its print parts, from one layout. */
function drawChart(p: Procedure, numbers: StepNumbers, steps: number): ChartDrawing {
  const layout = layoutChart(p, numbers);
  // The print parts show the screen chart's shapes through windows of their own (the page holds them once).
  const shapesId = `chart-shapes-${slugOf(p.id)}`;
  let printParts: string[] | undefined;
  return {
    svg: chartLayoutToSvg(layout, { title: `Sequence chart of ${p.id}, ${steps} steps`, shapesId }),
    get printParts() {
      return (printParts ??= chartLayoutPrintParts(layout, `Sequence chart of ${p.id}`, undefined, shapesId).map((part) => part.svg));
    },
  };
}

/**
 * The view without its parts drawn on demand (the step table, the body, the lead): what follows from the
 * procedure's text and the code only, which every key of its pages holds already. Reading them here would make them
 * for every procedure of the manual.
 */
export function withoutDrawnParts(view: ProcedureView): Partial<ProcedureView> {
  const out: Record<string, unknown> = {};
  for (const [key, property] of Object.entries(Object.getOwnPropertyDescriptors(view))) if ('value' in property) out[key] = property.value;
  return out as Partial<ProcedureView>;
}

function withWords(words: string | undefined): { words?: string } {
  return words ? { words } : {};
}

export function buildManualView(input: ManualInput): ManualView {
  const readable = input.files.filter((f): f is CheckedFile & { procedure: Procedure } => f.procedure !== null && f.facts !== null);
  const procedures = readable.map((f) => buildProcedureView(f, input.root, input.today, input.register, input.base ?? rootBase)).sort((a, b) => a.id.localeCompare(b.id));
  const byId = new Map(procedures.map((p) => [p.id, p]));

  const areaIds = [...new Set(procedures.map((p) => p.areaId))].sort((a, b) => nameOf(a).localeCompare(nameOf(b)) || a.localeCompare(b));
  const kindOrder = (k: string) => {
    const i = (kinds as readonly string[]).indexOf(k);
    return i === -1 ? kinds.length : i;
  };
  function nameOf(id: string): string {
    return procedures.find((p) => p.areaId === id)?.area ?? id;
  }
  const areas = areaIds.map((id) => {
    const area = nameOf(id);
    const inArea = procedures.filter((p) => p.areaId === id);
    const kindNames = [...new Set(inArea.map((p) => p.kind))].sort((a, b) => kindOrder(a) - kindOrder(b) || a.localeCompare(b));
    return { area, id: slugOf(id), kinds: kindNames.map((kind) => ({ kind, label: kindLabel(kind), procedures: inArea.filter((p) => p.kind === kind) })) };
  });

  const tagMap = new Map<string, TagView>();
  const usedSlugs = new Set<string>();
  for (const f of readable) {
    const view = byId.get(f.procedure.id);
    if (!view) continue;
    const uses = tagUsesIn(f.procedure, f.facts!, numberSteps(f.procedure.steps));
    for (const [tag, list] of uses) {
      let entry = tagMap.get(tag);
      if (!entry) {
        let slug = slugOf(tag);
        for (let n = 2; usedSlugs.has(slug); n++) slug = `${slugOf(tag)}-${n}`;
        usedSlugs.add(slug);
        entry = { tag, slug, url: siteUrl(input.base ?? rootBase, pagePath.tag(slug)), roles: [], uses: [], parts: [] };
        tagMap.set(tag, entry);
      }
      for (const use of list) {
        if (!entry.roles.includes(use.role)) entry.roles.push(use.role);
        entry.uses.push({ ...use, procedure: { id: view.id, title: view.title, url: view.url, status: view.status, revision: view.revision, current: view.current } });
      }
    }
  }
  const roleOrder: TagRole[] = ['equipment', 'interlock', 'signal'];
  const tags = [...tagMap.values()].sort((a, b) => a.tag.localeCompare(b.tag));
  for (const t of tags) {
    t.roles.sort((a, b) => roleOrder.indexOf(a) - roleOrder.indexOf(b));
    t.uses.sort((a, b) => roleOrder.indexOf(a.role) - roleOrder.indexOf(b.role) || a.procedureId.localeCompare(b.procedureId));
    t.parts = tagPartLinks(procedureIdsOf(t.uses).length, (n) => siteUrl(input.base ?? rootBase, pagePath.tagPart(t.slug, n)));
  }
  // Each procedure links its tags to the page that really exists (slugs may carry a suffix).
  for (const p of procedures) p.requires = p.requires.map(({ id }) => (byId.has(id) ? { id, url: byId.get(id)!.url, title: byId.get(id)!.title } : { id }));
  for (const p of procedures) p.tags = p.tags.map(({ tag }) => ({ tag, url: tagMap.get(tag)?.url ?? siteUrl(input.base ?? rootBase, pagePath.tag(slugOf(tag))) }));
  for (const p of procedures) for (const i of p.interlocks) i.tagUrl = tagMap.get(i.tag)?.url ?? i.tagUrl;
  return { today: input.today, procedures, areas, tags };
}
