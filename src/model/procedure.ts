// The typed procedure every later stage works on: identity, safety content and the step sequence.
import type { PathKey } from '../parse/read-source.ts';
import type { Root } from 'mdast';
import type { hazardLevels, kinds, statuses } from './schema.ts';
import type { RegisterEntry } from './register.ts';

export type Kind = (typeof kinds)[number];
export type Status = (typeof statuses)[number];
export type HazardLevel = (typeof hazardLevels)[number];

/** A value from the front-matter with the YAML path where it was written. */
export interface Located<T> {
  value: T;
  path: PathKey[];
}

export interface Approval {
  role: string;
  name: string;
  date: string;
  meaning: string;
  path: PathKey[];
}

/** Where a declaration came from when the plant register supplied it rather than the procedure itself. */
export interface FromRegister {
  /** The register entry's id (a signal, a safety function or a relief device). */
  id: string;
  file: string;
  path: PathKey[];
}

export interface Signal {
  /** Set when the plant register supplied this declaration. */
  from?: FromRegister;
  name: string;
  text: string;
  unit?: string;
  range?: [number, number];
  values?: Array<string | number | boolean>;
  path: PathKey[];
}

export interface Limit {
  from?: FromRegister;
  signal: string;
  low?: Located<string>;
  high?: Located<string>;
  consequence?: string;
  correction?: string;
  path: PathKey[];
}

export interface Interlock {
  from?: FromRegister;
  tag: string;
  tripsWhen: Located<string>;
  action: string;
  /** True when the trip stays in force until a step resets it. */
  latches: boolean;
  /** Outputs the trip forces while in force. */
  holds: StateEntry[];
  /**
   * Outputs a plant-register function forces (its `closes`, `opens`, `stops`, and those of the function it
   * `starts`) that could not be taken as held outputs of this procedure, and why; `via` names the started function.
   */
  unheld?: UnheldOutput[];
  /** The plant-register function whose latch this trip shares (the function it `starts`, when that latches). */
  latchesThrough?: string;
  path: PathKey[];
}

/** An output a register safety function forces that is not mapped onto an enumerated signal of the procedure. */
export interface UnheldOutput {
  signal: string;
  /** The state the register gives it: closed, open or stopped. */
  state: string;
  why: 'not-declared' | 'no-values' | 'no-matching-value';
  via?: string;
}

/** A signal and the value a step, trip or line-up gives it. */
export interface StateEntry {
  signal: string;
  value: string;
  path: PathKey[];
}

/**
 * A lasting action (the action qualifiers of IEC 61131-3 SFC, in our own words): `stored` lasts until another
 * step changes it (S, and R when it puts the signal back); `step` only while the step is active (N);
 * `limited` at most `duration` and never past the step (L); `delayed` takes effect after `duration`, then
 * lasts like `stored` (SD) or only while the step is active when `whileActive` (D).
 */
export interface StateAction extends StateEntry {
  lasts: 'stored' | 'step' | 'limited' | 'delayed';
  duration?: Located<string>;
  whileActive?: boolean;
}

export interface Hazard {
  level: HazardLevel;
  hazard: string;
  consequence?: string;
  avoid?: string;
  at: Located<string>[];
  /** When the hazard is present, as a condition over the signals. */
  when?: Located<string>;
  path: PathKey[];
}

export interface Setpoint {
  signal: string;
  quantity: string;
  path: PathKey[];
}

export interface Step {
  kind: 'step';
  id: string;
  actions: string[];
  phase?: string;
  set: Setpoint[];
  /** A hold test's acceptance criterion (`max-drop`): the most each signal may fall during the step. */
  maxDrop?: Setpoint[];
  params: Array<{ name: string; value: string | number | boolean; path: PathKey[] }>;
  until?: Located<string>;
  confirm?: Located<string>;
  expect?: Located<string>;
  signOff?: string;
  note?: string;
  /** Rules waived on this step, each with its written reason. */
  waivers?: Waiver[];
  /** Lasting actions: states the step puts equipment in. */
  state?: StateAction[];
  /** A condition the step relies on. */
  needs?: Located<string>;
  /** Interlocks the step trips on purpose, and latched interlocks it resets. */
  trips?: Located<string>[];
  resets?: Located<string>[];
  performer?: string;
  verify?: { kind: 'independent' | 'peer-check' | 'second-person' | string; role: string; path: PathKey[] };
  timeLimit?: { max: Located<string>; then: string; goto?: Located<string>; path: PathKey[] };
  /** What to do when the expected result does not come: actions, a jump, or both. */
  ifNot?: { actions: string[]; goto?: Located<string>; path: PathKey[] };
  path: PathKey[];
  /** Extra keys added beyond the core contract, kept as written for later stages. */
  extra: Record<string, unknown>;
}

export interface Waiver {
  rule: string;
  reason?: string;
  path: PathKey[];
}

export interface ParallelBranch {
  name: string;
  items: SequenceItem[];
  path: PathKey[];
}

export interface ParallelBlock {
  kind: 'parallel';
  branches: ParallelBranch[];
  path: PathKey[];
}

export interface ChooseBranch {
  when?: Located<string>;
  otherwise: boolean;
  items?: SequenceItem[];
  goto?: Located<string>;
  path: PathKey[];
  /** Extra keys added beyond the core contract (e.g. loop counts). */
  extra: Record<string, unknown>;
}

export interface ChooseBlock {
  kind: 'choose';
  branches: ChooseBranch[];
  path: PathKey[];
}

export type SequenceItem = Step | ParallelBlock | ChooseBlock;

/** An annual certification that the procedure is current and accurate (separate from revision approvals). */
export interface Certification {
  name: string;
  role: string;
  date: string;
  path: PathKey[];
}

/** A register entry the procedure uses: named under `uses`, or named in a condition, setpoint or equipment list. */
export interface RegisterUse {
  id: string;
  /** Where the procedure names it: the `uses` item, or the first place it is mentioned. */
  path: PathKey[];
  explicit: boolean;
  entry?: RegisterEntry;
}

export interface Procedure {
  file: string;
  id: string;
  title: string;
  kind: Kind | string;
  revision: number;
  status: Status | string;
  effective?: string;
  reviewBy?: string;
  owner?: string;
  author?: string;
  change?: string;
  approvals: Approval[];
  equipment: string[];
  ppe: string[];
  signals: Record<string, Signal>;
  limits: Limit[];
  interlocks: Interlock[];
  hazards: Hazard[];
  /** Emergency shutdown: the conditions that require it (`conditions-requiring`). */
  shutdownConditions: string[];
  /** Emergency shutdown: who initiates it and who is in charge. */
  responsible?: string;
  /** Conditions that must hold before the first step (the line-up). */
  lineUp: Located<string>[];
  /** Procedures that must have been completed first. */
  requires: Located<string>[];
  steps: SequenceItem[];
  /** Register ids listed under `uses`, as written. */
  uses: Located<string>[];
  /** Annual certifications (`certifications`), oldest first as written. */
  certifications: Certification[];
  /** Temporary procedures: the last day the procedure may be used (`expires`). */
  expires?: string;
  /** Temporary procedures: ids of the procedures this one modifies while in force (`modifies`). */
  modifies: Located<string>[];
  /** Filled when the procedure was read against a plant register: every entry it uses. */
  registerUses?: RegisterUse[];
  /** Step parameter names that set a register signal (the register signal's `params`), by parameter name. */
  paramSignals?: Record<string, string>;
  body: Root;
  bodyText: string;
  /** The front-matter as plain data, for diffs and exports. */
  data: Record<string, unknown>;
}
