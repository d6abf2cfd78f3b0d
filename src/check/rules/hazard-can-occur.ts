// Reports a step at which a hazard's condition can hold, over any path through the procedure (calls expanded),
// for the procedure's own hazards and for hazards other procedures state about the same signals.
import { inlineCalls, callSitesOf } from '../../analysis/inline-calls.ts';
import { parseCondition, namesIn } from '../../analysis/conditions/parse.ts';
import { analyseState } from '../../analysis/state/analyse-state.ts';
import { stateInputOf } from '../../analysis/state/state-input.ts';
import { stepsWhere } from '../../analysis/state/state-findings.ts';
import { compileStepGraph } from '../../analysis/step-graph.ts';
import { unitDimension } from '../../analysis/units.ts';
import { conditionPressureNote } from '../../analysis/condition-pressure-note.ts';
import type { Hazard, Procedure, Signal } from '../../model/procedure.ts';
import { defineManualRule, type FileContext } from '../define-rule.ts';
import { showPath } from '../state-path.ts';
import { emergencyKinds } from '../../model/kinds.ts';

export default defineManualRule(
  {
    id: 'hazard-can-occur',
    summary: 'A hazard\'s condition can hold at a step on some path through the procedure.',
    category: 'safety',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(ii) and (iii): consequences of deviation, steps to avoid it, precautions',
    docs: `A hazard may say when it is present: \`when: M-210 == running and LI-210 < 20 percent\`. Stepwright works
out which values every signal, valve and trip can have at each step over every path (sequences, decisions,
parallel branches, loops and called procedures), and reports each step at which the condition can be true,
with the path of steps that leads there. Hazards that another procedure states about the same signals apply
too (in \`emergency\` and \`emergency-shutdown\` procedures, except another procedure's NOTICE: damage to equipment
is accepted there to protect people): a caution in the shutdown procedure about opening the cooling valve when hot holds in the batch procedure.

Fix it by changing the steps, not the hazard: add the step that brings the plant to a safe state first
(cool to below 200 degC before opening the cooling valve; check the level before starting the agitator), or
make the transition of the step before guarantee it (\`until: LI-210 >= 20 percent\`).`,
    examples: {
      bad: "hazards: [{ when: 'M-210 == running and LI-210 < 20 percent' }]\nsteps: start M-210 with the kettle empty",
      good: 'a step with until: LI-210 >= 20 percent comes before the step that starts M-210',
    },
  },
  (ctx) => {
    // A register hazard whose condition cannot be read is checked nowhere: say so where it is written.
    for (const entry of ctx.register ? [...ctx.register.equipment.values(), ...ctx.register.chemicals.values()] : []) {
      for (const h of entry.hazards) {
        if (!h.when) continue;
        const parsed = parseCondition(h.when.value);
        if (parsed.ok) continue;
        ctx.reportInRegister(entry.file, {
          path: h.when.path,
          severity: 'warning',
          message: `The condition of ${entry.id}'s hazard '${h.hazard}' cannot be read (${parsed.error.message}), so no procedure is checked against it.`,
          hint: parsed.error.hint,
        });
      }
    }
    const byId = new Map<string, FileContext>();
    for (const f of ctx.files) if (f.procedure?.id && !byId.has(f.procedure.id)) byId.set(f.procedure.id, f);
    const withCondition = ctx.files.flatMap((f) => (f.procedure ? f.procedure.hazards.filter((h) => h.when?.value.trim()).map((h) => ({ file: f, hazard: h })) : []));
    // Other procedures' hazards, grouped by their condition and by how their owner declares the signals it names:
    // whether a hazard applies to a procedure depends on nothing else, so each group is judged once per procedure
    // instead of every hazard of the manual being judged for every procedure.
    const groups = foreignGroups(withCondition);
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
      ctx.perFile(file, inputs, () => judge(file, procedure, expanded, own, ownTexts, foreign, registerHazards));
    }

    function judge(
      file: FileContext, procedure: Procedure, expanded: Procedure, own: Array<{ hazard: Hazard; from: string | undefined }>,
      ownTexts: Set<string>, foreign: Array<{ hazard: Hazard; from: string }>, registerHazards: Array<{ hazard: Hazard; from: string }>,
    ): void {
      const facts = file.facts;
      if (!facts) return;
      const fromRegister = registerHazards.filter((r) => undeclaredIn(r.hazard, expanded).length === 0);
      for (const r of registerHazards) {
        const missing = undeclaredIn(r.hazard, expanded);
        if (!missing.length) continue;
        ctx.report(file, {
          path: r.hazard.path,
          severity: 'info',
          message: `Hazard '${r.hazard.hazard}' (stated in ${r.from}) was not checked here: its condition names ${missing.join(', ')}, which this procedure does not declare.`,
          hint: `Declare ${missing.join(', ')} (or list ${missing.length > 1 ? 'them' : 'it'} under 'uses') so that the hazard is checked at every step.`,
        });
      }
      const all = [...own, ...foreign, ...fromRegister];
      if (!all.length) return;
      const shared = expanded === procedure && !foreign.length && !fromRegister.length;
      const graph = shared ? facts.graph : compileStepGraph(expanded);
      const analysis = shared
        ? facts.state
        : analyseState(stateInputOf(expanded, graph), all.map((h) => h.hazard.when!.value));
      if (!analysis.complete && !shared) {
        ctx.report(file, {
          path: ['steps'],
          part: 'key',
          severity: 'warning',
          message: `Hazard conditions were checked only in part: ${[...new Set(analysis.gaps)].slice(0, 2).join('; ')}.`,
          hint: 'Correct the conditions named here; until then a step where a hazard can be present may not be reported.',
        });
      }
      const reported = new Set<string>();
      for (const { hazard, from } of all) {
        const region = analysis.regionOf(hazard.when!.value);
        if (!region) continue;
        for (const finding of stepsWhere(analysis, graph, region)) {
          const key = `${hazard.when!.value}|${finding.step.id}`;
          if (reported.has(key)) continue;
          reported.add(key);
          const source = from ? ` (stated in ${from})` : '';
          const when = parseCondition(hazard.when!.value);
          const note = when.ok ? conditionPressureNote([when.condition], (n) => expanded.signals[n]?.unit) : '';
          ctx.report(file, {
            path: [...finding.step.path, 'step'],
            message: `Hazard '${hazard.hazard}'${source} can be present at step '${finding.step.id}': ${hazard.when!.value} can hold there (${finding.values})${note}. Path: ${showPath(finding.path)}.`,
            hint: 'Add or move a step so that the plant is safe before this one (or make the step before guarantee it with its until), or change what this step does.',
            related: from ? undefined : [{ path: hazard.when!.path, message: 'the hazard\'s condition' }],
            trace: finding.path,
          });
        }
      }
    }
  },
);

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
function undeclaredIn(hazard: Hazard, here: Procedure): string[] {
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
