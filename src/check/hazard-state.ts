// Which hazards apply to each procedure (its own, other procedures' about the same signals, the plant register's)
// and the plant state they are judged in: worked out once per procedure and shared by hazard-can-occur and
// hazard-relies-on-old-reading, so that the state of a procedure with calls or foreign hazards is analysed once.
import { inlineCalls, callSitesOf } from '../analysis/inline-calls.ts';
import { parseCondition, namesIn } from '../analysis/conditions/parse.ts';
import { analyseState, type StateAnalysis } from '../analysis/state/analyse-state.ts';
import { stateInputOf } from '../analysis/state/state-input.ts';
import { compileStepGraph, type StepGraph } from '../analysis/step-graph.ts';
import { unitDimension } from '../analysis/units.ts';
import { RuleMemo } from '../analysis/rule-memo.ts';
import type { Hazard, Procedure, Signal } from '../model/procedure.ts';
import type { FileContext, ManualContext } from './define-rule.ts';
import { emergencyKinds } from '../model/kinds.ts';

export interface HazardJob {
  file: FileContext;
  procedure: Procedure;
  /** The procedure with its calls expanded (the procedure itself when it has none). */
  expanded: Procedure;
  own: Array<{ hazard: Hazard; from: string | undefined }>;
  foreign: Array<{ hazard: Hazard; from: string }>;
  /** Register hazards about what the procedure handles (also those naming signals it does not declare). */
  registerHazards: Array<{ hazard: Hazard; from: string }>;
  /** Everything the findings depend on beyond the file and what it calls (for ctx.perFile). */
  inputs: string;
}

export interface HazardState {
  /** Every hazard judged here, in order: own, other procedures', the register's. */
  all: Array<{ hazard: Hazard; from: string | undefined }>;
  graph: StepGraph;
  analysis: StateAnalysis;
  /** True when this is the procedure's shared analysis (facts.state), whose gaps state-not-analysed reports. */
  shared: boolean;
}

const jobsMemo = new WeakMap<readonly FileContext[], HazardJob[]>();
const stateMemo = new RuleMemo<object, { inputs: string; state: HazardState }>();

/** The hazards that apply to each procedure of the manual, once per check run. */
export function hazardJobs(ctx: ManualContext): HazardJob[] {
  const known = jobsMemo.get(ctx.files);
  if (known) return known;
  const byId = new Map<string, FileContext>();
  for (const f of ctx.files) if (f.procedure?.id && !byId.has(f.procedure.id)) byId.set(f.procedure.id, f);
  const withCondition = ctx.files.flatMap((f) => (f.procedure ? f.procedure.hazards.filter((h) => h.when?.value.trim()).map((h) => ({ file: f, hazard: h })) : []));
  // Other procedures' hazards, grouped by their condition and by how their owner declares the signals it names:
  // whether a hazard applies to a procedure depends on nothing else, so each group is judged once per procedure
  // instead of every hazard of the manual being judged for every procedure.
  const groups = foreignGroups(withCondition);
  const jobs: HazardJob[] = [];
  for (const file of ctx.files) {
    const procedure = file.procedure;
    if (!procedure) continue;
    const hasCalls = callSitesOf(procedure).length > 0;
    const expanded = hasCalls ? inlineCalls(procedure, (id) => byId.get(id)?.procedure ?? undefined).procedure : procedure;
    const own = expanded.hazards.filter((h) => h.when?.value.trim()).map((h) => ({ hazard: h, from: undefined as string | undefined }));
    const ownTexts = new Set(own.map((h) => h.hazard.when!.value));
    // Of several hazards with one condition, the first in file order is the one reported (as before, when all of
    // them were analysed and the later ones' findings dropped as repeats).
    const firstOfText = new Map<string, { hazard: Hazard; from: string; order: number }>();
    for (const group of groups) {
      if (ownTexts.has(group.text) || group.signature !== signatureIn(group.names, expanded)) continue;
      const w = group.members.find((m) => m.file !== file
        // In an emergency, damage to equipment is accepted to protect people: another procedure's NOTICE does not apply.
        && !(emergencyKinds.has(procedure.kind) && m.hazard.level === 'notice'));
      if (!w) continue;
      const known = firstOfText.get(group.text);
      if (!known || known.order > w.order) firstOfText.set(group.text, { hazard: w.hazard, from: w.file.procedure!.id, order: w.order });
    }
    const foreign = [...firstOfText.values()].sort((a, b) => a.order - b.order).map(({ hazard, from }) => ({ hazard, from }));
    // Hazards the plant register states, with a condition, about the equipment and chemicals the procedure handles.
    const registerHazards = registerHazardsOf(procedure)
      .filter((r) => !ownTexts.has(r.hazard.when!.value))
      .filter((r) => !(emergencyKinds.has(procedure.kind) && r.hazard.level === 'notice'));
    // The plant state is analysed again only when the file, a procedure it calls, or another procedure's hazard
    // that applies here has changed: everything else the findings depend on (the register, the configuration, the
    // date, the code) is in every file's key already.
    const inputs = JSON.stringify(foreign.map(({ hazard, from }) => [from, hazard.level, hazard.hazard, hazard.when!.value]));
    jobs.push({ file, procedure, expanded, own, foreign, registerHazards, inputs });
  }
  jobsMemo.set(ctx.files, jobs);
  return jobs;
}

/** The plant state the job's hazards are judged in (undefined without facts, or without a hazard to judge). */
export function hazardStateOf(job: HazardJob): HazardState | undefined {
  const facts = job.file.facts;
  if (!facts) return undefined;
  const key = facts as object;
  const known = stateMemo.get(key);
  if (known && known.inputs === job.inputs) return known.state;
  const { procedure, expanded, own, foreign } = job;
  const fromRegister = job.registerHazards.filter((r) => undeclaredIn(r.hazard, expanded).length === 0);
  const all = [...own, ...foreign, ...fromRegister];
  if (!all.length) return undefined;
  const shared = expanded === procedure && !foreign.length && !fromRegister.length;
  const graph = shared ? facts.graph : compileStepGraph(expanded);
  const analysis = shared ? facts.state : analyseState(stateInputOf(expanded, graph), all.map((h) => h.hazard.when!.value));
  const state = { all, graph, analysis, shared };
  stateMemo.set(key, { inputs: job.inputs, state });
  return state;
}

/** Conditional hazards of register entries (equipment, chemicals) the procedure handles, once per condition. */
function registerHazardsOf(procedure: Procedure): Array<{ hazard: Hazard; from: string }> {
  const out: Array<{ hazard: Hazard; from: string }> = [];
  const seen = new Set<string>();
  for (const use of procedure.registerUses ?? []) {
    const entry = use.entry;
    if (!entry || (entry.section !== 'equipment' && entry.section !== 'chemicals')) continue;
    for (const h of entry.hazards) {
      if (!h.when?.value.trim() || seen.has(h.when.value)) continue;
      seen.add(h.when.value);
      out.push({
        hazard: { level: h.level, hazard: h.hazard, consequence: h.consequence, avoid: h.avoid, at: [], when: { value: h.when.value, path: use.path }, path: use.path },
        from: `the plant register for ${entry.id}`,
      });
    }
  }
  return out;
}

/** The signals a register hazard's condition names that the procedure does not declare (nor reads from the register). */
export function undeclaredIn(hazard: Hazard, here: Procedure): string[] {
  const parsed = parseCondition(hazard.when!.value);
  if (!parsed.ok) return [];
  const names = [...new Set(namesIn(parsed.condition).map((n) => n.name))].filter((n) => n !== 'elapsed' && n !== 'done');
  return names.filter((n) => here.signals[n] === undefined);
}

interface ForeignGroup {
  text: string;
  /** The signals the condition names (besides elapsed and done). */
  names: string[];
  /** How the owner declares those signals (see signatureIn). */
  signature: string;
  /** The hazards of the group, with their place in file order. */
  members: Array<{ file: FileContext; hazard: Hazard; order: number }>;
}

/**
 * A hazard of another procedure applies when every signal its condition names is declared here alike: with units
 * of the same dimension, or (without units) with the same set of values. Hazards are grouped by condition text and
 * by the owner's declarations of the named signals; conditions that cannot be read or name no signal apply nowhere.
 */
function foreignGroups(withCondition: Array<{ file: FileContext; hazard: Hazard }>): ForeignGroup[] {
  const namesOf = new Map<string, string[] | null>();
  const groups = new Map<string, ForeignGroup>();
  withCondition.forEach(({ file, hazard }, order) => {
    const text = hazard.when!.value;
    let names = namesOf.get(text);
    if (names === undefined) {
      const parsed = parseCondition(text);
      names = parsed.ok ? [...new Set(namesIn(parsed.condition).map((n) => n.name))].filter((n) => n !== 'elapsed' && n !== 'done') : null;
      if (names && !names.length) names = null;
      namesOf.set(text, names);
    }
    if (!names) return;
    const signature = signatureIn(names, file.procedure!);
    if (signature === null) return;
    const key = `${text}\u0000${signature}`;
    const group = groups.get(key) ?? { text, names, signature, members: [] };
    group.members.push({ file, hazard, order });
    groups.set(key, group);
  });
  return [...groups.values()];
}

/** How a procedure declares the named signals, as one comparable string; null when one of them is not declared comparably. */
function signatureIn(names: string[], procedure: Procedure): string | null {
  const parts: string[] = [];
  for (const name of names) {
    const part = signalSignature(procedure.signals[name]);
    if (part === null) return null;
    parts.push(part);
  }
  return parts.join('\u0001');
}

function signalSignature(signal: Signal | undefined): string | null {
  if (!signal) return null;
  if (signal.unit) return `unit:${unitDimension(signal.unit)}`;
  const values = (signal.values ?? []).map(String).sort().join('|');
  return values === '' ? null : `values:${values}`;
}
