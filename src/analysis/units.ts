// Quantities with units: parsing, dimensions and exact conversions, on a private mathjs instance.
import type { MathJsInstance, Unit } from 'mathjs';
import { closest, distance } from 'fastest-levenshtein';
import { loadMathjs } from './load-mathjs.ts';
import { documentedUnitParts, libraryUnitWords } from './unit-table.ts';

/** A problem with a unit or quantity, as plain data for diagnostics. */
export interface UnitError {
  ok: false;
  message: string;
  hint: string;
}

export type ParsedQuantity = { ok: true; value: number; unit: string } | UnitError;
/** A duration in seconds; a single value has `min === max`. */
export type ParsedDuration = { ok: true; min: number; max: number } | UnitError;

// The library instance is made on first use: commands and files that convert no unit never load it. It is kept
// once per process (on globalThis): the live preview runs the pages from Vite's copy of this module next to the
// command's own, and both must use the one instance that has the units below, defined once.
const instanceSlot = Symbol.for('stepwright.units.mathjs');
/** The library instance with Stepwright's units (for the script that writes unit-table.ts, and its test). */
export function unitLibrary(): MathJsInstance {
  return mathjs();
}
function mathjs(): MathJsInstance {
  const slots = globalThis as unknown as Record<symbol, MathJsInstance | undefined>;
  slots[instanceSlot] ??= defineUnits(loadMathjs());
  return slots[instanceSlot];
}

const psiInPa = (0.45359237 * 9.80665) / 0.0254 ** 2;
// Gauge pressures: the pressure above the standard atmosphere (101.325 kPa, NIST SP 811 B.8), kept as an offset the
// way degC keeps 273.15 K, so a gauge value converts to absolute and a difference converts without the offset.
export const standardAtmospherePa = 101325;
const gaugeUnits: Array<[string, number]> = [['kPag', 1000], ['MPag', 1e6], ['barg', 1e5], ['mbarg', 100], ['psig', psiInPa]];
const absoluteUnits: Array<[string, number]> = [['kPaa', 1000], ['MPaa', 1e6], ['bara', 1e5], ['mbara', 100], ['psia', psiInPa]];

/** Adds and corrects the units a plant writes (exported for the test that compares the library files that hold them). */
export function defineUnits(math: MathJsInstance): MathJsInstance {
  // mathjs rounds mmHg to 133.322 Pa and makes torr an alias of it; NIST SP 811 keeps them apart, so redefine both.
  math.createUnit('mmHg', { definition: '133.322387415 Pa' }, { override: true });
  math.createUnit('Torr', { definition: `${101325 / 760} Pa`, aliases: ['torr'] }, { override: true });
  // mathjs derives psi from a rounded pound-force; use the exact definition (lb × standard gravity / in²).
  math.createUnit('psi', { definition: `${psiInPa} Pa` }, { override: true });
  // Conventional inch of mercury: a column of 25.4 mm at 13.5951 g/cm³ under standard gravity, the same basis as mmHg
  // above, so 1 inHg is exactly 25.4 mmHg = 3386.388640341 Pa (NIST SP 811 Appendix B.8 prints it as 3.386 389 E+03).
  math.createUnit('inHg', { definition: `${133.322387415 * 25.4} Pa` }, { override: true });
  // US liquid gallon, exactly 231 in³ = 3.785411784 L (NIST SP 811 B.8), named as such; and the petroleum barrel of
  // 42 US gallons = 0.158987294928 m³ (SP 811 B.8), never the 31-gallon beer barrel.
  math.createUnit('USgal', { definition: '3.785411784 L' }, { override: true });
  math.createUnit('bbl', { definition: '0.158987294928 m^3' }, { override: true });
  math.createUnit('gpm', { definition: '3.785411784 L/min' }, { override: true });
  // The day (NIST SP 811 Table 6: d = 86 400 s); the library spells it only in full.
  math.createUnit('d', { definition: '86400 s' }, { override: true });
  // Revolutions per minute, for agitator and pump speeds.
  math.createUnit('rpm', { definition: `${1 / 60} Hz` }, { override: true });
  // Gauge pressures (see gaugeUnits above): an offset of one standard atmosphere.
  for (const [name, pa] of gaugeUnits) math.createUnit(name, { definition: `${pa} Pa`, offset: standardAtmospherePa / pa }, { override: true });
  for (const [name, pa] of absoluteUnits) math.createUnit(name, { definition: `${pa} Pa` }, { override: true });
  // Ratios the plant writes as units; mathjs has none of them.
  math.createUnit('percent', { definition: '0.01' });
  math.createUnit('ppm', { definition: '1e-6' });
  return math;
}

/**
 * The documented units (docs/format.md, "Units"), and nothing else: a unit the library happens to read (C is the
 * coulomb, mt the millitonne, ton the short ton) is refused with a suggestion instead of being given a surprise
 * meaning. A compound is two of these joined by one '/', e.g. kg/h, m3/h, degC/min.
 */
export const documentedUnits = [
  'degC', 'degF', 'K',
  'Pa', 'kPa', 'MPa', 'bar', 'mbar', 'psi', 'atm', 'mmHg', 'Torr', 'inHg',
  'kPag', 'MPag', 'barg', 'mbarg', 'psig', 'kPaa', 'MPaa', 'bara', 'mbara', 'psia',
  'mg', 'g', 'kg', 't', 'lb',
  'mL', 'L', 'm3', 'USgal', 'bbl',
  's', 'min', 'h', 'd',
  'percent', '%', 'ppm',
  'mm', 'm', 'kW', 'rpm', 'A', 'V', 'gpm',
] as const;

const documented = new Set<string>(documentedUnits);
const gaugeSet = new Set(gaugeUnits.map(([n]) => n));
const absoluteSet = new Set(absoluteUnits.map(([n]) => n));

/** Common spellings that are not units here, with what to write instead. */
const insteadOf: Record<string, string> = {
  C: 'degC', F: 'degF', '°C': 'degC', '°F': 'degF', celsius: 'degC', Celsius: 'degC', fahrenheit: 'degF', Fahrenheit: 'degF', degK: 'K', kelvin: 'K',
  mt: 't', MT: 't', tonne: 't', tonnes: 't', ton: 't', tons: 't', T: 't',
  gal: 'USgal', gallon: 'USgal', gallons: 'USgal', GPM: 'gpm', USgpm: 'gpm', bbls: 'bbl', BBL: 'bbl',
  l: 'L', ltr: 'L', litre: 'L', liter: 'L', ml: 'mL', 'm^3': 'm3', 'm³': 'm3', cum: 'm3',
  sec: 's', secs: 's', mins: 'min', hr: 'h', hrs: 'h', hour: 'h', hours: 'h', day: 'd', days: 'd',
  kpa: 'kPa', KPa: 'kPa', kpag: 'kPag', kPa_g: 'kPag', 'kPa(g)': 'kPag', 'kPa(a)': 'kPaa', BarG: 'barg', bar_g: 'barg', 'bar(g)': 'barg', 'bar(a)': 'bara',
  PSI: 'psi', PSIG: 'psig', PSIA: 'psia', 'psi(g)': 'psig', mmhg: 'mmHg', inhg: 'inHg', torr: 'Torr', mbar_g: 'mbarg',
  pct: 'percent', lbs: 'lb', RPM: 'rpm', kw: 'kW',
};

/** Units people write in procedures; used for "did you mean" hints. */
export const commonUnits = [
  ...documentedUnits, 'mg/g', 'kg/h', 't/h', 'L/min', 'L/h', 'm3/h', 'USgal/min', 'degC/min', 'degC/h',
] as const;

const tonHint = 'Stepwright reads no "ton": short, long and metric tons differ. Write t for the metric tonne (1000 kg), or lb.';

const dimensionNames: Record<string, string> = {
  '': 'ratio',
  'temperature': 'temperature',
  'mass·length^-1·time^-2': 'pressure',
  'mass': 'mass',
  'length^3': 'volume',
  'length': 'length',
  'time': 'time',
  'mass·time^-1': 'mass flow',
  'length^3·time^-1': 'volume flow',
  // Keys list the base dimensions in the order of baseNames below (time before temperature).
  'time^-1·temperature': 'temperature rate',
  'time^-1': 'frequency',
  'mass·length^2·time^-3': 'power',
  'current': 'electric current',
  'time·current': 'electric charge',
  'mass·length^2·time^-3·current^-1': 'electric potential',
};

const baseNames = ['mass', 'length', 'time', 'current', 'temperature', 'luminous intensity', 'amount', 'angle', 'bit'];

export interface UnitFacts {
  /** Stable key for the physical dimension, e.g. "pressure" or "mass·length^-2". */
  dimension: string;
  /** Factor to SI base for differences (no offset). */
  scale: number;
  /** Added before scaling for absolute values: 273.15 for degC, 459.67 for degF, 0 otherwise. */
  offset: number;
}

/** What mathjs really keeps per unit part (its type file calls `prefix` a string). */
interface MathjsUnitPart {
  unit: { value: number; offset: number };
  prefix: { value: number };
  power: number;
}

const factsCache = new Map<string, UnitFacts | UnitError>();

/** Spellings mathjs cannot read but plant people write. */
export function normalizeUnit(unit: string): string {
  return unit.replaceAll('%', 'percent');
}

function unitError(message: string, hint: string): UnitError {
  return { ok: false, message, hint };
}

/** The spelling to write instead of `unit`, from the table of common spellings (own keys only: never "valueOf"). */
function insteadFor(unit: string): string | undefined {
  return Object.hasOwn(insteadOf, unit) ? insteadOf[unit] : undefined;
}

/** The signal a quantity is written for: a unit suggestion must fit it. */
export interface UnitFit {
  /** The signal's unit. */
  unit: string;
  /** The signal's name, for the hint. */
  name?: string;
}

/**
 * The documented unit meant by a spelling Stepwright does not read, or null: a known other spelling (C, °C, bar(g)),
 * a unit written apart (bar g, kPa (g), deg C), a compound of such, a unit in the wrong case, or a near typing slip.
 */
export function unitSpellingFor(written: string, options: { near?: boolean } = {}): string | null {
  const unit = written.trim();
  if (documented.has(unit)) return null;
  const instead = insteadFor(unit);
  if (instead) return instead;
  // Written apart: "bar g", "kPa (g)", "deg C", "psi_a": one word is meant.
  const joined = unit.replace(/\s+/g, '');
  if (joined !== unit) return documented.has(joined) ? joined : unitSpellingFor(joined, { near: false });
  const marked = /^(.+?)[(_]([gGaA])\)?$/.exec(unit);
  if (marked && documented.has(`${marked[1]}${marked[2].toLowerCase()}`)) return `${marked[1]}${marked[2].toLowerCase()}`;
  if (unit.includes('/')) {
    const parts = unit.split('/').map((p) => (documented.has(p) ? p : insteadFor(p) ?? null));
    if (parts.length === 2 && parts.every(Boolean)) return parts.join('/');
  }
  if (options.near === false) return null;
  const exact = commonUnits.find((u) => u.toLowerCase() === unit.toLowerCase());
  if (exact) return exact;
  const near = closest(unit, commonUnits);
  if (distance(unit, near) <= Math.max(1, Math.floor(unit.length / 3))) return near;
  return null;
}

/**
 * The one hint for a unit Stepwright does not read, wherever a quantity is written (a condition, a limit, a setpoint,
 * the register). With `fit`, a suggestion is only made in the signal's dimension; a spelling that means a unit of
 * another dimension is said not to fit the signal.
 */
export function unitHint(written: string, fit?: UnitFit): string {
  const unit = written.trim();
  const fitDimension = fit ? unitDimension(fit.unit) : null;
  const signal = fit?.name ?? 'the signal';
  if (['ton', 'tons', 'T'].includes(unit) && (!fitDimension || fitDimension === 'mass')) return tonHint;
  const meant = unitSpellingFor(unit);
  const meantDimension = meant ? unitDimension(meant) : null;
  if (meant && (!fitDimension || meantDimension === fitDimension)) {
    if (/[\s()_]/.test(unit)) return `Write ${meant}: a unit is one word, without spaces or brackets (barg, kPag, psig, degC).`;
    if (!insteadFor(unit) && meant.toLowerCase() === unit.toLowerCase()) return `Did you mean ${meant}? Units are case-sensitive.`;
    return `Did you mean ${meant}?`;
  }
  if (fit && fitDimension) {
    const instead = meant && meantDimension ? ` ('${unit}' would be ${meant}, a unit of ${meantDimension}, which does not fit ${signal})` : '';
    return `${capitalizeFirst(signal)} is a ${fitDimension} in ${fit.unit}: write the value in ${fit.unit} or another ${fitDimension} unit${instead}.`;
  }
  return 'Write a unit such as degC, kPa, mmHg, kg, m3/h, min or %.';
}

function capitalizeFirst(s: string): string {
  return s ? s[0].toUpperCase() + s.slice(1) : s;
}

function dimensionKey(dimensions: readonly number[]): string {
  const parts: string[] = [];
  dimensions.forEach((power, i) => {
    if (power === 0) return;
    parts.push(power === 1 ? baseNames[i] : `${baseNames[i]}^${power}`);
  });
  const key = parts.join('·');
  return dimensionNames[key] ?? key;
}

function describe(unit: string): UnitFacts | UnitError {
  const cached = factsCache.get(unit);
  if (cached) return cached;
  const facts = readUnit(unit);
  // Procedures use a few dozen units; only garbage input could grow the cache without end.
  if (factsCache.size > 5000) factsCache.clear();
  factsCache.set(unit, facts);
  return facts;
}

/** A unit's dimension, scale and offset, or why it is not a unit (exported for the test that compares it with the library). */
export function readUnit(unit: string): UnitFacts | UnitError {
  const trimmed = unit.trim();
  if (trimmed === '') return unitError('The unit is missing.', 'Write a unit such as degC, kPa, kg or min.');
  if (/\s/.test(trimmed)) return unitError(`The unit '${trimmed}' contains a space.`, unitSpellingFor(trimmed) ? unitHint(trimmed) : 'Write the unit without spaces, e.g. m3/h.');
  if (/^[\d.+-]/.test(trimmed)) return unitError(`'${trimmed}' is not a unit.`, 'Write a unit such as degC, kPa, kg or min.');
  const parts = normalizeUnit(trimmed).split('/');
  if (parts.length > 2 || !parts.every((p) => documented.has(p))) {
    return unitError(`'${trimmed}' is not a unit Stepwright knows.`, unitHint(trimmed));
  }
  return fromTable(parts) ?? readWithLibrary(trimmed);
}

/**
 * The facts of a documented unit or a compound of two, from the table the library's own readings were written to
 * (unit-table.ts): the same arithmetic on the same numbers as readWithLibrary, without loading the library.
 * Undefined when the table lacks a part (then the library is asked).
 */
function fromTable(parts: string[]): UnitFacts | undefined {
  const read = parts.map((p) => documentedUnitParts[p]);
  if (read.some((r) => r === undefined)) return undefined;
  const dimensions = read[0].dimensions.map((d, i) => (read.length === 1 ? d : d - read[1].dimensions[i]));
  let scale = 1;
  read.forEach((r, i) => { scale *= (r.value * r.prefix) ** (i === 0 ? 1 : -1); });
  // The library applies an offset only to a lone unit to the first power (degC, not degC/min); so do we.
  return { dimension: dimensionKey(dimensions), scale, offset: read.length === 1 ? read[0].offset : 0 };
}

/** The facts of a unit as the library reads it (exported for the test that compares it with the table). */
export function readWithLibrary(trimmed: string): UnitFacts | UnitError {
  let parsed: Unit;
  // Loaded outside the try: a library that cannot be loaded is a fault to report, not an unknown unit.
  const math = mathjs();
  try {
    parsed = math.unit(normalizeUnit(trimmed));
  } catch {
    return unitError(`'${trimmed}' is not a known unit.`, unitHint(trimmed));
  }
  if (parsed.value !== null) return unitError(`'${trimmed}' is not a unit.`, 'Write a unit such as degC, kPa, kg or min.');
  let scale = 1;
  for (const part of parsed.units as unknown as MathjsUnitPart[]) {
    // mathjs accepts "kdegC"; a prefixed temperature scale is nonsense in a procedure.
    if (part.unit.offset !== 0 && part.prefix.value !== 1) {
      return unitError(`'${trimmed}' is not a known unit.`, unitHint(trimmed));
    }
    scale *= (part.unit.value * part.prefix.value) ** part.power;
  }
  // mathjs applies an offset only to a lone unit to the first power (degC, not degC/min); so do we.
  const [only] = parsed.units as unknown as MathjsUnitPart[];
  const offset = parsed.units.length === 1 && only.power === 1 ? only.unit.offset : 0;
  return { dimension: dimensionKey(parsed.dimensions), scale, offset };
}

export function isKnownUnit(unit: string): boolean {
  return !('ok' in describe(unit));
}

let unitWords: ReadonlySet<string> | undefined;

/** Whether a word in running text reads as some unit (lenient: prose is not held to the documented list). */
export function isUnitWord(word: string): boolean {
  if (isKnownUnit(word)) return true;
  // A word of letters and digits is one unit name to the library: it reads it as a unit exactly when the name, or a
  // prefix and the name, is one of its units (the table lists every such word). Anything else is asked of it.
  const normalized = normalizeUnit(word);
  if (/^[A-Za-z][A-Za-z0-9]*$/.test(normalized)) {
    unitWords ??= new Set(libraryUnitWords);
    return unitWords.has(normalized);
  }
  const math = mathjs();
  try {
    return math.unit(normalized).value === null;
  } catch {
    return false;
  }
}

/** 'gauge' for kPag, barg, psig ...; 'absolute' for every other pressure unit (SI pressures are absolute); null otherwise. */
export function pressureReference(unit: string): 'gauge' | 'absolute' | null {
  const u = unit.trim();
  if (gaugeSet.has(u)) return 'gauge';
  if (absoluteSet.has(u) || unitDimension(u) === 'pressure') return 'absolute';
  return null;
}

/**
 * When a comparison crosses gauge and absolute pressure, the sentence that says how it was converted; otherwise ''.
 * Every message that compares two pressures adds it, so nobody is surprised by a 101.325 kPa shift.
 */
export function pressureConversionNote(a: string | undefined, b: string | undefined): string {
  if (!a || !b) return '';
  const ra = pressureReference(a);
  const rb = pressureReference(b);
  if (!ra || !rb || ra === rb) return '';
  return ` (${a} and ${b} were compared by converting gauge to absolute pressure with the standard atmosphere, 101.325 kPa)`;
}

/** Why a unit is not usable, or null when it is; with `fit`, the hint suggests only units that fit the signal. */
export function checkUnit(unit: string, fit?: UnitFit): UnitError | null {
  const facts = describe(unit);
  if (!('ok' in facts)) return null;
  return fit && unit.trim() !== '' && !/^[\d.+-]/.test(unit.trim()) ? { ...facts, hint: unitHint(unit, fit) } : facts;
}

/** A stable key per physical dimension ("temperature", "pressure", "ratio", ...), or null for an unknown unit. */
export function unitDimension(unit: string): string | null {
  const facts = describe(unit);
  return 'ok' in facts ? null : facts.dimension;
}

export function sameDimension(a: string, b: string): boolean {
  const da = unitDimension(a);
  return da !== null && da === unitDimension(b);
}

/**
 * Drops the last-bit noise of the offset arithmetic (100 degC would be 211.99999999999994 degF), so a setpoint
 * written in one unit and a limit written in another compare equal when they are equal. 15 digits is below
 * what a double holds for sure and far above any plant reading.
 */
function clean(value: number): number {
  return Number.isFinite(value) ? Number(value.toPrecision(15)) : value;
}

function sameKnownDimension(from: string, to: string): [UnitFacts, UnitFacts] | null {
  const a = describe(from);
  const b = describe(to);
  if ('ok' in a || 'ok' in b || a.dimension !== b.dimension) return null;
  return [a, b];
}

/** Converts an absolute value, with the offset for temperature scales (20 degC = 68 degF); null when impossible. */
export function convert(value: number, from: string, to: string): number | null {
  const pair = sameKnownDimension(from, to);
  if (!pair) return null;
  const [a, b] = pair;
  return clean(((value + a.offset) * a.scale) / b.scale - b.offset);
}

/** Converts a difference, without offset (a 10 degC rise is an 18 degF rise); null when impossible. */
export function convertDifference(value: number, from: string, to: string): number | null {
  const pair = sameKnownDimension(from, to);
  if (!pair) return null;
  return clean((value * pair[0].scale) / pair[1].scale);
}

/** The value in SI base units (K, Pa, kg, m^3, s, plain ratio), so numbers in different units compare directly. */
export function toBase(value: number, unit: string): number | null {
  const facts = describe(unit);
  if ('ok' in facts) return null;
  return clean((value + facts.offset) * facts.scale);
}

/** The inverse of toBase. */
export function fromBase(value: number, unit: string): number | null {
  const facts = describe(unit);
  if ('ok' in facts) return null;
  return clean(value / facts.scale - facts.offset);
}

/** A number as people write it: no float noise such as 0.30000000000000004. */
export function formatNumber(value: number): string {
  if (Object.is(value, -0)) return '0';
  return String(Number(value.toPrecision(12)));
}

/** "238 degC", "15 %"; the unit is shown as written. */
export function formatQuantity(value: number, unit: string): string {
  return `${formatNumber(value)} ${unit}`;
}

/**
 * A value converted into another unit, as a reader wants it beside the value written: four significant digits
 * ("about 10.34 barg" for 150 psig), more where fewer would put it level with, or on the other side of, a value it
 * is compared with (`against`, in the same unit): 9.00004 barg against a limit of 9 barg stays 9.00004 barg.
 * "about" says that the figure is rounded.
 */
export function formatConverted(value: number, unit: string, against: ReadonlyArray<number | null | undefined> = []): string {
  if (!Number.isFinite(value)) return formatQuantity(value, unit);
  const exact = Number(value.toPrecision(12));
  const others = against.filter((n): n is number => typeof n === 'number' && Number.isFinite(n));
  for (let digits = 4; digits < 12; digits++) {
    const rounded = Number(value.toPrecision(digits));
    if (rounded === exact) break;
    if (others.every((n) => Math.sign(rounded - n) === Math.sign(exact - n))) return `about ${formatQuantity(rounded, unit)}`;
  }
  return formatQuantity(exact, unit);
}

const numberPattern = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?/;

/** A number written in hexadecimal, binary or octal, or with digit separators: said as such, not as a strange unit. */
function otherNotation(text: string): UnitError | null {
  const first = /^\S+/.exec(text)?.[0] ?? '';
  const based = /^([+-]?)0([xob])([0-9a-f_]+)$/i.exec(first);
  if (based) {
    const radix = { x: 16, o: 8, b: 2 }[based[2].toLowerCase() as 'x' | 'o' | 'b'];
    const digits = based[3].replaceAll('_', '');
    const value = Number.parseInt(digits, radix);
    const name = { 16: 'hexadecimal', 8: 'octal', 2: 'binary' }[radix];
    const rest = text.slice(first.length).trim();
    const valid = Number.isFinite(value) && [...digits.toLowerCase()].every((d) => Number.parseInt(d, radix) < radix);
    return unitError(`'${first}' is written in ${name}; quantities are written in decimal.`, valid ? `Write ${based[1] === '-' ? '-' : ''}${value}${rest ? ` ${rest}` : ''}.` : 'Write the number in decimal, e.g. 238 degC.');
  }
  if (/^[+-]?\d[\d_]*_\d/.test(first)) {
    return unitError(`'${first}' groups its digits with '_'; write the digits without separators.`, `Write ${text.replace(/^(\S+)/, (n) => n.replaceAll('_', ''))}.`);
  }
  return null;
}

/** Reads "238 degC", "-5 degC", "15 %", "2.5 m3/h". */
export function parseQuantity(text: string, fit?: UnitFit): ParsedQuantity {
  const trimmed = text.trim();
  if (trimmed === '') return unitError('The quantity is empty.', 'Write a number with its unit, e.g. 238 degC.');
  const match = numberPattern.exec(trimmed);
  if (!match) return unitError(`'${trimmed}' does not start with a number.`, 'Write a number with its unit, e.g. 238 degC.');
  const other = otherNotation(trimmed);
  if (other) return other;
  const rest = trimmed.slice(match[0].length).trim();
  if (/^,\d/.test(rest)) return unitError(`'${trimmed}' uses a comma in the number.`, 'Write decimals with a point, e.g. 2.5 m3/h.');
  if (rest === '') return unitError(`'${trimmed}' has no unit.`, 'Write its unit after the number, as in 238 degC or 600 kg.');
  const problem = checkUnit(rest, fit);
  if (problem) return problem;
  return { ok: true, value: Number(match[0]), unit: rest };
}

/** Longest `expect` of one step: 31 days. Longer is a typing error (1e9 h), and charts and sums stay bounded. */
export const maxDurationSeconds = 31 * 86400;

/** Reads an `expect` duration: "40 min", "2 h", or a range "30..50 min" / "30 min..1 h"; gives seconds. */
export function parseDuration(text: string): ParsedDuration {
  const hint = 'Write a time such as 40 min, 2 h or a range 30..50 min.';
  const parts = text.split('..');
  if (parts.length > 2) return unitError(`'${text.trim()}' has more than one '..'.`, hint);
  const seconds: number[] = [];
  const last = parseQuantity(parts[parts.length - 1]);
  if (!last.ok) return { ...last, hint };
  for (const part of parts) {
    // In "30..50 min" the first number borrows the unit of the second.
    const q = /^\s*[+-]?[\d.]+(?:[eE][+-]?\d+)?\s*$/.test(part) && parts.length === 2 ? parseQuantity(`${part} ${last.unit}`) : parseQuantity(part);
    if (!q.ok) return { ...q, hint };
    if (unitDimension(q.unit) !== 'time') return unitError(`'${q.unit}' is not a unit of time.`, hint);
    if (q.value < 0) return unitError(`A duration cannot be negative ('${part.trim()}').`, hint);
    const inSeconds = toBase(q.value, q.unit) ?? Number.NaN;
    if (!Number.isFinite(inSeconds)) return unitError(`'${part.trim()}' is not a finite time.`, hint);
    if (inSeconds > maxDurationSeconds) {
      return unitError(`'${part.trim()}' is longer than the ${maxDurationSeconds / 86400} days one step may be expected to take.`, 'A step that runs for longer is a campaign: split it into steps, or give the duration of one shift.');
    }
    seconds.push(inSeconds);
  }
  const [min, max = min] = seconds;
  if (min > max) return unitError(`The range '${text.trim()}' runs backwards.`, 'Write the shorter time first, e.g. 30..50 min.');
  return { ok: true, min, max };
}
