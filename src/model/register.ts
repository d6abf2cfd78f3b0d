// The plant register as every later stage sees it: entries by id, each with the file and YAML path it came from.
import type { PathKey, ParsedSource } from '../parse/read-source.ts';
import type { Diagnostic } from '../parse/diagnostic.ts';
import { registerFileSchema, registerSections, type RegisterSection } from './register-schema.ts';

export interface RegisterPlace {
  /** The register file, as shown in diagnostics. */
  file: string;
  path: PathKey[];
}

export interface RegisterArea extends RegisterPlace {
  section: 'areas';
  id: string;
  name: string;
  description?: string;
}

/** A hazard the register states about an item, for every procedure that handles it. */
export interface RegisterHazard {
  level: 'danger' | 'warning' | 'caution' | 'notice';
  hazard: string;
  consequence?: string;
  avoid?: string;
  /** When the hazard is present, as a condition. */
  when?: RegisterQuantity;
  path: PathKey[];
}

export interface RegisterEquipment extends RegisterPlace {
  section: 'equipment';
  id: string;
  text: string;
  type?: string;
  area?: string;
  /** Equipment the item delivers into (a charge valve or pump feeding a vessel). */
  feeds: string[];
  hazards: RegisterHazard[];
}

export interface RegisterQuantity {
  value: string;
  path: PathKey[];
}

export interface RegisterSignal extends RegisterPlace {
  section: 'signals';
  id: string;
  text: string;
  unit?: string;
  range?: [number, number];
  values?: Array<string | number | boolean>;
  equipment?: string;
  limits?: {
    low?: RegisterQuantity;
    high?: RegisterQuantity;
    consequence?: string;
    correction?: string;
    path: PathKey[];
  };
  alarms?: { low?: RegisterQuantity; high?: RegisterQuantity };
  /** Step parameter names that set this signal. */
  params: string[];
}

export interface RegisterSafetyFunction extends RegisterPlace {
  section: 'safety-functions';
  id: string;
  text?: string;
  tripsWhen?: RegisterQuantity;
  starts?: string;
  closes: string[];
  opens: string[];
  stops: string[];
  keepsRunning: string[];
  action?: string;
  latches?: boolean;
  reset?: string;
  bypass?: { allowed: boolean; procedure?: string };
  proofTest?: string;
}

export interface RegisterReliefDevice extends RegisterPlace {
  section: 'relief-devices';
  id: string;
  text?: string;
  setPressure: RegisterQuantity;
  signal?: string;
  protects: string[];
  dischargesTo?: string;
}

export interface RegisterChemical extends RegisterPlace {
  section: 'chemicals';
  id: string;
  name: string;
  hazardStatements: string[];
  exposureLimits: string[];
  firstAid?: string;
  sds?: string;
  hazards: RegisterHazard[];
}

export type RegisterEntry =
  | RegisterArea | RegisterEquipment | RegisterSignal | RegisterSafetyFunction | RegisterReliefDevice | RegisterChemical;

export interface RegisterSource {
  file: string;
  source: ParsedSource;
}

export interface PlantRegister {
  /** The register folder as shown to people (relative to where the command runs). */
  folder: string;
  sources: RegisterSource[];
  areas: Map<string, RegisterArea>;
  equipment: Map<string, RegisterEquipment>;
  signals: Map<string, RegisterSignal>;
  safetyFunctions: Map<string, RegisterSafetyFunction>;
  reliefDevices: Map<string, RegisterReliefDevice>;
  chemicals: Map<string, RegisterChemical>;
  /** Every entry by id; ids are unique across sections (a second one is reported and left out). */
  entries: Map<string, RegisterEntry>;
  /** Reading and shape problems of the register files (YAML syntax, unknown keys, duplicate ids). */
  diagnostics: Diagnostic[];
}

type Data = Record<string, unknown>;

/** Builds the register from read files; never throws, whatever the files hold. */
export function buildRegister(folder: string, sources: RegisterSource[]): PlantRegister {
  const register: PlantRegister = {
    folder, sources, areas: new Map(), equipment: new Map(), signals: new Map(), safetyFunctions: new Map(),
    reliefDevices: new Map(), chemicals: new Map(), entries: new Map(), diagnostics: [],
  };
  for (const { file, source } of sources) {
    register.diagnostics.push(...source.diagnostics.map((d) => ({ ...d, rule: 'register-invalid' })));
    if (source.diagnostics.some((d) => d.severity === 'error')) continue;
    const data = source.data;
    if (data === null || data === undefined) continue;
    if (typeof data !== 'object' || Array.isArray(data)) {
      register.diagnostics.push(diagnostic(source, [], 'register-invalid', 'A register file holds a mapping of sections (areas, equipment, signals, safety-functions, relief-devices, chemicals).', 'Start the file with one of the section names followed by a colon.'));
      continue;
    }
    for (const issue of shapeIssues(data)) register.diagnostics.push(diagnostic(source, issue.path, 'register-invalid', issue.message, issue.hint, issue.part));
    for (const section of registerSections) {
      for (const [id, value] of Object.entries(asRecord((data as Data)[section]))) {
        const entry = buildEntry(section, id, asRecord(value), file, [section, id]);
        const earlier = register.entries.get(id);
        if (earlier) {
          register.diagnostics.push({
            ...diagnostic(source, [section, id], 'register-duplicate-entry',
              `'${id}' is already defined in the register (${earlier.section} in ${earlier.file}).`,
              'Each tag or id is defined once in the whole register; remove or rename one of them.', 'key'),
            related: [{ file: earlier.file, ...pick(sourceOf(register, earlier.file)?.rangeOf(earlier.path, 'key')), message: 'first definition' }],
          });
          continue;
        }
        register.entries.set(id, entry);
        mapOf(register, section).set(id, entry as never);
      }
    }
  }
  return register;
}

export function emptyRegister(folder = ''): PlantRegister {
  return buildRegister(folder, []);
}

function mapOf(register: PlantRegister, section: RegisterSection): Map<string, RegisterEntry> {
  switch (section) {
    case 'areas': return register.areas;
    case 'equipment': return register.equipment;
    case 'signals': return register.signals;
    case 'safety-functions': return register.safetyFunctions;
    case 'relief-devices': return register.reliefDevices;
    case 'chemicals': return register.chemicals;
  }
}

function buildEntry(section: RegisterSection, id: string, d: Data, file: string, path: PathKey[]): RegisterEntry {
  switch (section) {
    case 'areas':
      return { section, id, name: asText(d.name) ?? id, description: asText(d.description), file, path };
    case 'equipment':
      return { section, id, text: asText(d.text) ?? id, type: asText(d.type), area: asText(d.area), feeds: texts(d.feeds), hazards: hazardsOf(d.hazards, [...path, 'hazards']), file, path };
    case 'signals': {
      const range = Array.isArray(d.range) && d.range.length === 2 && d.range.every((n) => typeof n === 'number') ? (d.range as [number, number]) : undefined;
      const values = Array.isArray(d.values) ? (d.values.filter((x) => ['string', 'number', 'boolean'].includes(typeof x)) as RegisterSignal['values']) : undefined;
      const limits = d.limits !== undefined ? asRecord(d.limits) : undefined;
      const alarms = d.alarms !== undefined ? asRecord(d.alarms) : undefined;
      return {
        section, id, text: asText(d.text) ?? id, unit: asText(d.unit), range, values, equipment: asText(d.equipment), file, path,
        limits: limits && {
          low: quantity(limits.low, [...path, 'limits', 'low']),
          high: quantity(limits.high, [...path, 'limits', 'high']),
          consequence: asText(limits.consequence),
          correction: asText(limits.correction),
          path: [...path, 'limits'],
        },
        alarms: alarms && { low: quantity(alarms.low, [...path, 'alarms', 'low']), high: quantity(alarms.high, [...path, 'alarms', 'high']) },
        params: texts(d.params),
      };
    }
    case 'safety-functions': {
      const bypass = d.bypass !== undefined ? asRecord(d.bypass) : undefined;
      return {
        section, id, text: asText(d.text), tripsWhen: quantity(d['trips-when'], [...path, 'trips-when']), starts: asText(d.starts),
        closes: texts(d.closes), opens: texts(d.opens), stops: texts(d.stops), keepsRunning: texts(d['keeps-running']),
        action: asText(d.action), latches: typeof d.latches === 'boolean' ? d.latches : undefined, reset: asText(d.reset),
        bypass: bypass && { allowed: bypass.allowed === true, procedure: asText(bypass.procedure) },
        proofTest: asText(d['proof-test']), file, path,
      };
    }
    case 'relief-devices':
      return {
        section, id, text: asText(d.text), setPressure: quantity(d['set-pressure'], [...path, 'set-pressure']) ?? { value: '', path: [...path, 'set-pressure'] },
        signal: asText(d.signal), protects: texts(d.protects), dischargesTo: asText(d['discharges-to']), file, path,
      };
    case 'chemicals':
      return {
        section, id, name: asText(d.name) ?? id, hazardStatements: texts(d['hazard-statements']), exposureLimits: texts(d['exposure-limits']),
        firstAid: asText(d['first-aid']), sds: asText(d.sds), hazards: hazardsOf(d.hazards, [...path, 'hazards']), file, path,
      };
  }
}

const hazardLevels = new Set(['danger', 'warning', 'caution', 'notice']);

/** The well-formed hazards of an entry (a malformed one is reported by the shape check and left out here). */
function hazardsOf(value: unknown, path: PathKey[]): RegisterHazard[] {
  if (!Array.isArray(value)) return [];
  return value.flatMap((h, i) => {
    const d = asRecord(h);
    const level = asText(d.level);
    const hazard = asText(d.hazard);
    if (!level || !hazardLevels.has(level) || !hazard) return [];
    return [{
      level: level as RegisterHazard['level'], hazard, consequence: asText(d.consequence), avoid: asText(d.avoid),
      when: quantity(d.when, [...path, i, 'when']), path: [...path, i],
    }];
  });
}

/**
 * What a safety function does, in one sentence built from its outputs, so that every procedure and page says
 * it the same way: "Closes XV-2101 and XV-2102; opens XV-2105; keeps M-210 running; latches until reset."
 */
export function describeSafetyFunction(fn: RegisterSafetyFunction, register?: PlantRegister, seen = new Set<string>()): string {
  const parts: string[] = [];
  if (fn.starts) {
    const started = register?.safetyFunctions.get(fn.starts);
    if (started && !seen.has(started.id)) {
      seen.add(fn.id);
      parts.push(`Starts ${started.text ?? started.id} (${started.id}), which ${lowerFirst(describeSafetyFunction(started, register, seen))}`);
      return parts.join(' ');
    }
    parts.push(`Starts ${fn.starts}`);
  }
  const list = (verb: string, tags: string[]) => {
    if (tags.length) parts.push(`${verb} ${joinAnd(tags)}`);
  };
  list('closes', fn.closes);
  list('opens', fn.opens);
  list('stops', fn.stops);
  if (fn.keepsRunning.length) parts.push(`keeps ${joinAnd(fn.keepsRunning)} running`);
  if (fn.action) parts.push(parts.length ? lowerFirst(fn.action.replace(/\.$/, '')) : fn.action.replace(/\.$/, ''));
  if (fn.latches === true) parts.push('stays tripped until reset');
  const sentence = parts.join('; ');
  return sentence ? `${sentence[0].toUpperCase()}${sentence.slice(1)}.` : 'No action given.';
}

function lowerFirst(s: string): string {
  return s ? `${s[0].toLowerCase()}${s.slice(1)}` : s;
}

function joinAnd(items: string[]): string {
  return items.length <= 1 ? items.join('') : `${items.slice(0, -1).join(', ')} and ${items.at(-1)}`;
}

interface ShapeIssue { path: PathKey[]; message: string; hint: string; part?: 'key' }

/** Problems with the shape of a register file, in plain words, each at its place. */
function shapeIssues(data: unknown): ShapeIssue[] {
  const result = registerFileSchema.safeParse(data);
  if (result.success) return [];
  const out: ShapeIssue[] = [];
  const seen = new Set<string>();
  for (const issue of result.error.issues) {
    const path = issue.path as PathKey[];
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) {
        out.push({ path: [...path, key], part: 'key', message: `Unknown key '${key}' in the register.`, hint: 'See the register reference in docs/register.md for the keys each section holds.' });
      }
      continue;
    }
    const key = path.join('.');
    if (seen.has(key)) continue;
    seen.add(key);
    const where = path.length ? `'${path.map(String).join('.')}'` : 'The register file';
    out.push({ path, message: `${where}: ${issue.message.replace(/^Invalid input: /, '')}.`, hint: 'See the register reference in docs/register.md.' });
  }
  return out;
}

function diagnostic(source: ParsedSource, path: PathKey[], rule: string, message: string, hint: string, part?: 'key' | 'value'): Diagnostic {
  return { file: source.file, ...source.rangeOf(path, part), severity: 'error', rule, message, hint };
}

function sourceOf(register: PlantRegister, file: string): ParsedSource | undefined {
  return register.sources.find((s) => s.file === file)?.source;
}

function pick(range: { line: number; column: number } | undefined): { line: number; column: number } {
  return range ? { line: range.line, column: range.column } : { line: 1, column: 1 };
}

function quantity(value: unknown, path: PathKey[]): RegisterQuantity | undefined {
  if (value === undefined || value === null || typeof value === 'object') return undefined;
  return { value: String(value), path };
}

function texts(value: unknown): string[] {
  return Array.isArray(value) ? value.filter((v) => v !== null && typeof v !== 'object').map(String) : [];
}

function asRecord(value: unknown): Data {
  return value !== null && typeof value === 'object' && !Array.isArray(value) ? (value as Data) : {};
}

function asText(value: unknown): string | undefined {
  if (value === undefined || value === null || typeof value === 'object') return undefined;
  return String(value);
}
