// The plant register as pages: one page model per register entry (equipment, signals with their limits and
// alarms, safety functions, relief devices, chemicals, areas) with what it is, the entries it connects to, and
// where it is used (which procedures, and in each the steps that touch it). Pure: the caller supplies the register,
// the checked procedures and the manual view; the entry's history is added by the site's data layer.
import type { CheckedFile } from '../check/run-checks.ts';
import type { Procedure, Step } from '../model/procedure.ts';
import { describeSafetyFunction, type PlantRegister, type RegisterEntry, type RegisterSafetyFunction } from '../model/register.ts';
import { walkSteps } from '../model/walk-steps.ts';
import { conditionInWords } from './condition-words.ts';
import type { ManualView, ProcedureView } from './manual.ts';
import { slugOf } from './manual.ts';
import { numberSteps } from './step-numbers.ts';
import { mentionsTag } from './where-used.ts';
import { staysTrippedWords } from './trip-latching.ts';

export type RegisterSection = RegisterEntry['section'];

/** Section order and headings on the register pages (our own wording). */
export const registerSectionTitles: Record<RegisterSection, { title: string; one: string }> = {
  areas: { title: 'Areas', one: 'Area' },
  equipment: { title: 'Equipment', one: 'Equipment' },
  signals: { title: 'Signals, limits and alarms', one: 'Signal' },
  'safety-functions': { title: 'Interlocks and safety functions', one: 'Safety function' },
  'relief-devices': { title: 'Relief devices', one: 'Relief device' },
  chemicals: { title: 'Chemicals', one: 'Chemical' },
};
const sectionOrder = Object.keys(registerSectionTitles) as RegisterSection[];

/** A piece of a value: text, or text linking to another register entry or page. */
export interface ValuePart { text: string; href?: string }

export interface RegisterFact { label: string; parts: ValuePart[] }

export interface RegisterStepUse { id: string; number: string; action: string; url: string }

export interface RegisterUseView {
  procedure: Pick<ProcedureView, 'id' | 'title' | 'url' | 'status' | 'revision' | 'current'>;
  /** How the procedure comes to use the entry, in words ("named under uses", "through TSHH-210" …). */
  how: string;
  steps: RegisterStepUse[];
}

export interface RegisterEntryView {
  id: string;
  slug: string;
  url: string;
  section: RegisterSection;
  sectionTitle: string;
  kindLabel: string;
  /** The entry's own words (description, name). */
  title: string;
  /** The register file that defines it. */
  file: string;
  facts: RegisterFact[];
  usedBy: RegisterUseView[];
  /** Chemicals: the page keeps the safety data sheet caution. */
  chemical: boolean;
}

export interface RegisterView {
  folder: string;
  sections: Array<{ section: RegisterSection; title: string; entries: RegisterEntryView[] }>;
  entries: RegisterEntryView[];
  /** Entry id → its page URL, for links from procedure pages. */
  urlOf: Map<string, string>;
  /** The register's own page. */
  indexUrl: string;
}

/** The URL of a register entry's page (relative to the manual's root). */
export function registerEntryUrl(id: string, slug = slugOf(id)): string {
  return `/register/${slug}/`;
}

type Readable = CheckedFile & { procedure: Procedure };

export interface RegisterViewOptions {
  /** Turns a path from the manual's root ("/register/k-210/") into the link the site writes (its base added). */
  href?: (path: string) => string;
}

export function buildRegisterView(register: PlantRegister, files: CheckedFile[], manual: ManualView, options: RegisterViewOptions = {}): RegisterView {
  const href = options.href ?? ((path: string) => path);
  const readable = files.filter((f): f is Readable => f.procedure !== null && f.facts !== null);
  const viewOf = new Map(manual.procedures.map((p) => [p.id, p]));
  const tagsById = new Map<string, ManualView['tags'][number]>();
  for (const t of manual.tags) if (!tagsById.has(t.tag)) tagsById.set(t.tag, t);
  const stepPlaces = stepPlacesOnce();
  const mayUse = usersOfEntries(readable, register, viewOf);
  // Slugs are unique across the register (ids differ only by case in a badly kept register).
  const urlOf = new Map<string, string>();
  const slugs = new Map<string, string>();
  const used = new Set<string>();
  for (const id of [...register.entries.keys()].sort()) {
    let slug = slugOf(id);
    for (let n = 2; used.has(slug); n++) slug = `${slugOf(id)}-${n}`;
    used.add(slug);
    slugs.set(id, slug);
    urlOf.set(id, href(registerEntryUrl(id, slug)));
  }
  const link = (id: string): ValuePart => ({ text: id, ...(urlOf.has(id) ? { href: urlOf.get(id) } : {}) });
  const links = (ids: string[]): ValuePart[] => ids.flatMap((id, i) => (i > 0 ? [{ text: ', ' }, link(id)] : [link(id)]));
  const startedBy = (fnId: string) => [...register.safetyFunctions.values()].filter((f) => f.starts === fnId).map((f) => f.id);

  const entries: RegisterEntryView[] = [];
  for (const entry of register.entries.values()) {
    const facts: RegisterFact[] = [];
    const fact = (label: string, value: string | ValuePart[] | undefined) => {
      if (value === undefined || (Array.isArray(value) && value.length === 0) || value === '') return;
      facts.push({ label, parts: typeof value === 'string' ? [{ text: value }] : value });
    };
    let title = entry.id;
    switch (entry.section) {
      case 'areas': {
        title = entry.name;
        fact('Name', entry.name);
        fact('Description', entry.description);
        fact('Equipment in this area', links([...register.equipment.values()].filter((e) => e.area === entry.id).map((e) => e.id)));
        break;
      }
      case 'equipment': {
        title = entry.text;
        fact('Description', entry.text);
        fact('Type', entry.type);
        if (entry.area) fact('Area', [{ text: register.areas.get(entry.area)?.name ?? entry.area, ...(urlOf.has(entry.area) ? { href: urlOf.get(entry.area) } : {}) }]);
        fact('Signals on it', links([...register.signals.values()].filter((s) => s.equipment === entry.id).map((s) => s.id)));
        const acting = [...register.safetyFunctions.values()].filter((f) => [...f.closes, ...f.opens, ...f.stops, ...f.keepsRunning].includes(entry.id));
        fact('Safety functions acting on it', links(acting.map((f) => f.id)));
        fact('Protected by', links([...register.reliefDevices.values()].filter((r) => r.protects.includes(entry.id)).map((r) => r.id)));
        break;
      }
      case 'signals': {
        title = entry.text;
        fact('Description', entry.text);
        fact('Unit', entry.unit);
        if (entry.range) fact('Range', `${entry.range[0]} to ${entry.range[1]}${entry.unit ? ` ${entry.unit}` : ''}`);
        if (entry.values) fact('Values', entry.values.map(String).join(', '));
        if (entry.equipment) fact('Equipment', [link(entry.equipment)]);
        fact('Operating limit, low', entry.limits?.low?.value);
        fact('Operating limit, high', entry.limits?.high?.value);
        fact('Consequence of deviation', entry.limits?.consequence);
        fact('Correction', entry.limits?.correction);
        fact('Alarm, low', entry.alarms?.low?.value);
        fact('Alarm, high', entry.alarms?.high?.value);
        const trips = [...register.safetyFunctions.values()].filter((f) => f.tripsWhen && mentionsTag(f.tripsWhen.value, entry.id));
        fact('Trips on this signal', trips.flatMap((f, i) => [...(i > 0 ? [{ text: '; ' }] : []), link(f.id), { text: ` at ${f.tripsWhen!.value}` }]));
        fact('Relief devices read on it', links([...register.reliefDevices.values()].filter((r) => r.signal === entry.id).map((r) => r.id)));
        break;
      }
      case 'safety-functions': {
        title = entry.text ?? entry.id;
        fact('Description', entry.text);
        if (entry.tripsWhen) {
          const words = conditionInWords(entry.tripsWhen.value, signalTexts(register));
          fact('Trips when', words ? `${words} (${entry.tripsWhen.value})` : entry.tripsWhen.value);
        }
        if (entry.starts) fact('Starts', [link(entry.starts)]);
        fact('Started by', links(startedBy(entry.id)));
        fact('What it does', describeSafetyFunction(entry, register));
        fact('Closes', links(entry.closes));
        fact('Opens', links(entry.opens));
        fact('Stops', links(entry.stops));
        fact('Keeps running', links(entry.keepsRunning));
        if (entry.latches !== undefined) fact('Latches', entry.latches ? `Yes: ${staysTrippedWords}` : 'No');
        fact('Reset', entry.reset);
        if (entry.bypass) {
          fact('Bypass', entry.bypass.allowed
            ? [{ text: 'Allowed only under ' }, ...(entry.bypass.procedure ? [viewOf.has(entry.bypass.procedure) ? { text: entry.bypass.procedure, href: viewOf.get(entry.bypass.procedure)!.url } : { text: entry.bypass.procedure }] : [{ text: 'a written procedure (none named)' }])]
            : 'Not allowed');
        }
        fact('Proof-test interval', entry.proofTest);
        break;
      }
      case 'relief-devices': {
        title = entry.text ?? entry.id;
        fact('Description', entry.text);
        fact('Set pressure', entry.setPressure.value || undefined);
        if (entry.signal) fact('Pressure signal', [link(entry.signal)]);
        fact('Protects', links(entry.protects));
        fact('Discharges to', entry.dischargesTo);
        break;
      }
      case 'chemicals': {
        title = entry.name;
        fact('Name', entry.name);
        fact('GHS hazard statements', entry.hazardStatements.join(', '));
        fact('Exposure limits', entry.exposureLimits.join('; '));
        fact('First aid', entry.firstAid);
        fact('Safety data sheet', entry.sds);
        break;
      }
    }
    entries.push({
      id: entry.id, slug: slugs.get(entry.id)!, url: urlOf.get(entry.id)!, section: entry.section,
      sectionTitle: registerSectionTitles[entry.section].title, kindLabel: registerSectionTitles[entry.section].one,
      title, file: entry.file, facts, usedBy: usesOf(entry, register, mayUse(entry.id), viewOf, tagsById, stepPlaces), chemical: entry.section === 'chemicals',
    });
  }
  entries.sort((a, b) => a.id.localeCompare(b.id));
  const sections = sectionOrder.map((section) => ({ section, title: registerSectionTitles[section].title, entries: entries.filter((e) => e.section === section) }))
    .filter((s) => s.entries.length > 0);
  return { folder: register.folder, sections, entries, urlOf, indexUrl: href('/register/') };
}

function signalTexts(register: PlantRegister): Record<string, { text: string; unit?: string; values?: Array<string | number | boolean> }> {
  return Object.fromEntries([...register.signals.values()].map((s) => [s.id, { text: s.text, unit: s.unit, values: s.values }]));
}

/**
 * The files that may use each entry (those howUsed can find a use in), in the files' order: the files that name it in
 * their register uses, that are filed in it (an area), or that use a trip starting it, directly or through a chain.
 * A register of hundreds of entries is then not compared with every procedure of a large manual.
 */
function usersOfEntries(files: Readable[], register: PlantRegister, viewOf: Map<string, ProcedureView>): (id: string) => Readable[] {
  const users = new Map<string, Set<number>>();
  const add = (id: string, at: number) => {
    const set = users.get(id);
    if (set) set.add(at);
    else users.set(id, new Set([at]));
  };
  files.forEach((f, at) => {
    const areaId = viewOf.get(f.procedure.id)?.areaId;
    if (areaId !== undefined) add(areaId, at);
    for (const use of f.procedure.registerUses ?? []) {
      add(use.id, at);
      const seen = new Set<string>();
      for (let cur = register.safetyFunctions.get(use.id); cur?.starts && !seen.has(cur.id); cur = register.safetyFunctions.get(cur.starts)) {
        seen.add(cur.id);
        add(cur.starts, at);
      }
    }
  });
  return (id) => [...(users.get(id) ?? [])].sort((a, b) => a - b).map((at) => files[at]);
}

/** Each procedure's step numbers and the order of its steps, worked out once however many entries it uses. */
type StepPlaces = (p: Procedure) => {
  numbers: ReturnType<typeof numberSteps>;
  order: Map<string, number>;
  /** Each step with its words in lower case, in step order (what stepsNaming searches). */
  words: Array<{ step: Step; text: string }>;
};

function stepPlacesOnce(): StepPlaces {
  const known = new WeakMap<Procedure, ReturnType<StepPlaces>>();
  return (p) => {
    let places = known.get(p);
    if (!places) {
      const steps = walkSteps(p.steps).map(({ step }) => step);
      places = {
        numbers: numberSteps(p.steps), order: new Map(steps.map((step, i) => [step.id, i])),
        words: steps.map((step) => ({ step, text: stepWords(step).toLowerCase() })),
      };
      known.set(p, places);
    }
    return places;
  };
}

/** Which procedures use an entry and how; the steps in each that touch it. */
function usesOf(
  entry: RegisterEntry, register: PlantRegister, files: Readable[], viewOf: Map<string, ProcedureView>,
  tagsById: Map<string, ManualView['tags'][number]>, stepPlaces: StepPlaces,
): RegisterUseView[] {
  const out: RegisterUseView[] = [];
  // The tag's uses by procedure, once: a tag that a thousand procedures use is not searched a thousand times.
  const tagSteps = new Map<string, Array<{ id: string; number: string; action: string }>>();
  for (const u of tagsById.get(entry.id)?.uses ?? []) tagSteps.set(u.procedureId, [...(tagSteps.get(u.procedureId) ?? []), ...u.steps]);
  for (const f of files) {
    const p = f.procedure;
    const view = viewOf.get(p.id);
    if (!view) continue;
    const how = howUsed(entry, register, p, view);
    if (!how) continue;
    const steps = new Map((tagSteps.get(p.id) ?? []).map((s) => [s.id, s]));
    // Chemicals, areas and started functions have no tag uses: steps that name them (or what starts them).
    const { numbers, order, words } = stepPlaces(p);
    for (const s of stepsNaming(words, entryNames(entry, register))) if (!steps.has(s.id)) steps.set(s.id, s);
    out.push({
      procedure: { id: view.id, title: view.title, url: view.url, status: view.status, revision: view.revision, current: view.current },
      how,
      steps: [...steps.values()].sort((a, b) => (order.get(a.id) ?? 0) - (order.get(b.id) ?? 0))
        .map((s) => ({ ...s, number: numbers.ofStep.get(s.id) ?? s.number, url: `${view.url}#step-${s.id}` })),
    });
  }
  return out.sort((a, b) => a.procedure.id.localeCompare(b.procedure.id));
}

function howUsed(entry: RegisterEntry, register: PlantRegister, p: Procedure, view: ProcedureView): string | undefined {
  const use = p.registerUses?.find((u) => u.id === entry.id);
  if (use) return use.explicit ? 'Named in its register uses' : entry.section === 'equipment' ? 'In its equipment list' : 'Named in its conditions, setpoints or limits';
  if (entry.section === 'areas') return view.areaId === entry.id ? 'Filed in this area' : undefined;
  if (entry.section === 'safety-functions') {
    const through = startersUsed(entry, register, p);
    if (through.length) return `Through ${through.join(', ')}, which start${through.length === 1 ? 's' : ''} it`;
  }
  return undefined;
}

/** The trips a procedure uses that start this function, directly or through a chain. */
function startersUsed(fn: RegisterSafetyFunction, register: PlantRegister, p: Procedure): string[] {
  const usedIds = new Set((p.registerUses ?? []).map((u) => u.id));
  const out: string[] = [];
  for (const id of usedIds) {
    const seen = new Set<string>();
    let cur = register.safetyFunctions.get(id);
    while (cur?.starts && !seen.has(cur.id)) {
      seen.add(cur.id);
      if (cur.starts === fn.id) {
        out.push(id);
        break;
      }
      cur = register.safetyFunctions.get(cur.starts);
    }
  }
  return out.sort();
}

/** The words a step uses for an entry: its id, and a chemical's name (as a whole word, any case). */
function entryNames(entry: RegisterEntry, register: PlantRegister): string[] {
  if (entry.section === 'chemicals') return [entry.id, entry.id.replace(/-/g, ' '), entry.name.replace(/\s*\(.*\)\s*$/, '')];
  if (entry.section === 'safety-functions') return [entry.id, ...[...register.safetyFunctions.values()].filter((f) => f.starts === entry.id).map((f) => f.id)];
  if (entry.section === 'areas') return [];
  return [entry.id];
}

function stepsNaming(words: ReturnType<StepPlaces>['words'], names: string[]): Array<{ id: string; number: string; action: string }> {
  if (names.length === 0) return [];
  const lower = names.map((n) => n.toLowerCase());
  return words.filter(({ text }) => lower.some((n) => mentionsTag(text, n)))
    .map(({ step: s }) => ({ id: s.id, number: '?', action: s.actions.join('; ') }));
}

function stepWords(s: Step): string {
  return [...s.actions, s.note ?? '', s.until?.value ?? '', s.confirm?.value ?? '', s.expect?.value ?? ''].join('\n');
}
