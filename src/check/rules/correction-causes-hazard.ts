// Reports a limit's correction that tells the operator to put equipment in a state that, at the limit, makes one of
// the procedure's own (or the register's) conditional hazards true.
import { parseCondition } from '../../analysis/conditions/parse.ts';
import { evaluateCondition, type KnownValue } from '../../analysis/evaluate-condition.ts';
import { parseQuantity, toBase } from '../../analysis/units.ts';
import type { Procedure } from '../../model/procedure.ts';
import type { PlantRegister } from '../../model/register.ts';
import { defineManualRule, type Report } from '../define-rule.ts';

/** Verbs of a correction and the value each gives an enumerated signal, in the order they are tried. */
const verbs: Array<{ verb: RegExp; values: string[] }> = [
  { verb: /^open(s|ing)?$/i, values: ['open', 'opened'] },
  { verb: /^close(s|d)?$|^closing$/i, values: ['closed', 'close', 'shut'] },
  { verb: /^start(s|ing)?$/i, values: ['running', 'on', 'started', 'true'] },
  { verb: /^stop(s|ping)?$/i, values: ['stopped', 'off', 'false'] },
];

/** Words that make a clause conditional or a prohibition: such a clause is not an instruction to do it now. */
const qualified = /\b(only|once|when|after|until|unless|if|below|above|not|never|before)\b/i;

export default defineManualRule(
  {
    id: 'correction-causes-hazard',
    summary: "A limit's correction tells the operator to do what one of the hazards forbids at that limit.",
    category: 'safety',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(ii)(B): steps required to correct or avoid deviation; common practice: the correction of a deviation must not create another hazard',
    docs: `A limit's \`correction\` is what the operator does when the signal leaves its limits. If that action, at the
limit, makes a hazard's \`when\` condition true, the procedure tells the operator to cause the hazard it warns of:
"switch the jacket to cooling oil" at 245 degC, while a NOTICE says cooling oil into a jacket above 200 degC cracks
its welds.

The rule reads each clause of the correction (split at \`;\`, \`,\` and *and*) for *open*, *close*, *start* or *stop*
followed by an enumerated signal that has a matching value (\`XV-2105: { values: [open, closed] }\`). It then takes
the signal at its limit (the high limit for a high deviation, the low limit for a low one) together with that
state, and evaluates every hazard condition of the procedure and every register hazard about the equipment acted
on. A condition that is then certainly true is reported. Clauses with *only*, *once*, *when*, *after*, *until*,
*if*, *not*, *never*, *below*, *above* or *before* are conditions or prohibitions and are not read as instructions;
corrections that name no tag (as "switch to cooling oil") and hazard conditions that need other signals are not
judged. Limits of the plant register are checked in the register, with the register's enumerated signals and its
equipment (a \`valve\` opens and closes; a \`pump\`, \`agitator\`, \`fan\` or \`compressor\` starts and stops) and
every conditional hazard the register states.

Fix the correction so that it takes the plant away from the limit without the hazard (close the heating first and
open the cooling only once the hazard's condition has cleared), and say so in its words.`,
    examples: {
      bad: 'limits:\n  TI-210: { high: 245 degC, correction: Open cooling-oil valve XV-2105 }\nhazards:\n  - { level: notice, when: XV-2105 == open and TI-210 > 200 degC, ... }',
      good: 'limits:\n  TI-210: { high: 245 degC, correction: Close hot-oil valve XV-2101; open XV-2105 only once TI-210 reads 200 degC or less }',
    },
  },
  (ctx) => {
    for (const file of ctx.files) {
      const p = file.procedure;
      if (!p) continue;
      for (const limit of p.limits) {
        if (limit.from || !limit.correction) continue;
        const sides = [limit.high?.value, limit.low?.value];
        for (const f of findings(limit.signal, sides, limit.correction, p.signals, hazardsAbout(p, ctx.register))) {
          ctx.report(file, { path: [...limit.path, 'correction'], ...f });
        }
      }
    }
    const register = ctx.register;
    if (!register) return;
    const signals = registerSignals(register);
    const hazards = [...register.equipment.values(), ...register.chemicals.values()].flatMap((e) => e.hazards.flatMap((h) => (h.when
      ? [{ text: h.hazard, when: h.when.value, related: { file: e.file, ...registerRange(register, e.file, h.path), message: `hazard of ${e.id} in the plant register` } }]
      : [])));
    for (const signal of register.signals.values()) {
      const limits = signal.limits;
      if (!limits?.correction) continue;
      for (const f of findings(signal.id, [limits.high?.value, limits.low?.value], limits.correction, signals, hazards)) {
        ctx.reportInRegister(signal.file, { path: [...limits.path, 'correction'], ...f });
      }
    }
  },
);

interface HazardCondition { text: string; when: string; related?: NonNullable<Report['related']>[number] }

/** The hazards a correction makes true at either limit. */
function findings(signal: string, sides: Array<string | undefined>, correction: string, signals: Pick<Procedure, 'signals'>['signals'], hazards: HazardCondition[]): Report[] {
  const out: Report[] = [];
  const actions = actionsIn(correction, { signals });
  if (!actions.length) return out;
  for (const side of sides) {
    if (!side) continue;
    const q = parseQuantity(side);
    const base = q.ok ? toBase(q.value, q.unit) : null;
    if (base === null) continue;
    for (const action of actions) {
      const known = new Map<string, KnownValue>([[signal, { kind: 'number', base }], [action.signal, { kind: 'word', value: action.value }]]);
      for (const hazard of hazards) {
        const parsed = parseCondition(hazard.when);
        if (!parsed.ok || evaluateCondition(parsed.condition, known) !== true) continue;
        out.push({
          message: `The correction for ${signal} at ${side} says to ${action.words}, which makes the hazard '${hazard.text}' true (${hazard.when}).`,
          hint: `Correct the deviation without that state, or do it only once the hazard's condition has cleared, and say so in the correction.`,
          related: hazard.related ? [hazard.related] : undefined,
        });
      }
    }
  }
  return out;
}

/** The register's enumerated signals, and its equipment as the states a valve or a machine can be put in. */
function registerSignals(register: PlantRegister): Pick<Procedure, 'signals'>['signals'] {
  const out: Pick<Procedure, 'signals'>['signals'] = {};
  for (const e of register.equipment.values()) {
    const type = (e.type ?? '').toLowerCase();
    const values = /valve/.test(type) ? ['open', 'closed'] : /pump|agitator|fan|compressor|motor/.test(type) ? ['running', 'stopped'] : undefined;
    if (values) out[e.id] = { name: e.id, text: e.text, values, path: [] };
  }
  for (const s of register.signals.values()) if (s.values?.length) out[s.id] = { name: s.id, text: s.text, values: s.values, path: [] };
  return out;
}

interface Action {
  signal: string;
  value: string;
  words: string;
}

/** The unconditional open/close/start/stop instructions of a correction that name an enumerated signal. */
export function actionsIn(correction: string, p: Pick<Procedure, 'signals'>): Action[] {
  const out: Action[] = [];
  for (const clause of correction.split(/;|,|\band\b|\.\s/i)) {
    if (qualified.test(clause)) continue;
    const words = clause.trim().split(/\s+/);
    words.forEach((word, i) => {
      const verb = verbs.find((v) => v.verb.test(word));
      if (!verb) return;
      for (const later of words.slice(i + 1)) {
        const tag = later.replace(/[^A-Za-z0-9-]+$/, '');
        const signal = p.signals[tag];
        if (!signal?.values) continue;
        const value = verb.values.find((v) => signal.values!.map(String).includes(v));
        if (value) out.push({ signal: tag, value, words: clause.trim().replace(/^\w/, (c) => c.toLowerCase()) });
        break;
      }
    });
  }
  return out;
}

function hazardsAbout(p: Procedure, register: PlantRegister | undefined): HazardCondition[] {
  const out: HazardCondition[] = [];
  const seen = new Set<string>();
  for (const h of p.hazards) {
    if (!h.when?.value.trim() || seen.has(h.when.value)) continue;
    seen.add(h.when.value);
    out.push({ text: h.hazard, when: h.when.value });
  }
  // Register hazards about the equipment the procedure names (the same ones hazard-can-occur applies).
  for (const id of p.equipment) {
    const entry = register?.equipment.get(id);
    for (const h of entry?.hazards ?? []) {
      if (!h.when || seen.has(h.when.value)) continue;
      seen.add(h.when.value);
      out.push({ text: h.hazard, when: h.when.value, related: { file: entry!.file, ...registerRange(register, entry!.file, h.path), message: `hazard of ${id} in the plant register` } });
    }
  }
  return out;
}

/** Where a register entry is written, so that a related place points into the register file. */
function registerRange(register: PlantRegister | undefined, file: string, path: readonly (string | number)[]) {
  const range = register?.sources.find((x) => x.file === file)?.source.rangeOf(path);
  return range ? { range } : {};
}
