// Reports one interlock described differently in two procedures (when the plant register does not define it).
import { conditionKey, sameWording, wording } from '../../analysis/register-consistency.ts';
import { parseCondition } from '../../analysis/conditions/parse.ts';
import { conditionPressureNote } from '../../analysis/condition-pressure-note.ts';
import type { Interlock } from '../../model/procedure.ts';
import { defineManualRule, type FileContext } from '../define-rule.ts';

export default defineManualRule(
  {
    id: 'interlock-inconsistent',
    summary: 'The same interlock (by tag) is described differently in two procedures: trip condition, action or latching.',
    category: 'safety',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(d)(3)(i) and (f)(1)(iv): one set of process safety information; safety systems and their functions',
    docs: `An interlock is one piece of equipment, whichever procedure mentions it. When two procedures declare the
same tag with a different trip condition (compared by meaning: \`TI-220 >= 320 degC\` and \`TI-220 >= 608 degF\`
agree), a different action or a different latching, at least one of them tells the operator something false.
Each declaration that differs from the one most procedures use is reported, with the other as a related place.
The lasting fix is to define the interlock once in the plant register and list it under \`uses\`; interlocks the
register defines are compared with it by \`register-conflict\` instead.`,
    examples: {
      bad: '# a.md\ninterlocks:\n  - { tag: TSHH-220, trips-when: TI-220 >= 320 degC, action: Stops burner B-220 }\n# b.md\ninterlocks:\n  - { tag: TSHH-220, trips-when: TI-220 >= 330 degC, action: Stops burner B-220 }',
      good: 'uses: [TSHH-220]   # in both, with TSHH-220 defined once in the register',
    },
  },
  (ctx) => {
    const byTag = new Map<string, Array<{ file: FileContext; interlock: Interlock }>>();
    for (const file of ctx.files) {
      for (const interlock of file.procedure?.interlocks ?? []) {
        if (interlock.from || ctx.register?.entries.has(interlock.tag)) continue;
        const list = byTag.get(interlock.tag) ?? [];
        list.push({ file, interlock });
        byTag.set(interlock.tag, list);
      }
    }
    for (const [tag, uses] of byTag) {
      if (uses.length < 2) continue;
      // The description most procedures use is the reference; on a tie, the first file's. Two declarations agree
      // exactly when their descriptions (see description()) are equal, so they are counted, not compared in pairs.
      const count = new Map<string, number>();
      const keys = uses.map((u) => description(u.interlock));
      for (const key of keys) count.set(key, (count.get(key) ?? 0) + 1);
      let reference = uses[0];
      let best = count.get(keys[0])!;
      keys.forEach((key, i) => {
        if (count.get(key)! > best) [reference, best] = [uses[i], count.get(key)!];
      });
      for (const use of uses) {
        const found = differences(use.interlock, reference.interlock);
        if (!found.length) continue;
        const at = reference.file.source.rangeOf(reference.interlock.path, 'key');
        ctx.report(use.file, {
          path: use.interlock.path,
          part: 'key',
          message: `Interlock ${tag} is described differently in ${reference.file.procedure?.id ?? reference.file.file}: ${found.join('; ')}.`,
          hint: `Describe ${tag} once: define it in the plant register and list it under 'uses' in both procedures, or make the two declarations agree.`,
          related: [{ file: reference.file.file, range: at, message: `${tag} in ${reference.file.procedure?.id ?? reference.file.file}` }],
        });
      }
    }
  },
);

/**
 * What differences() compares, as one string: the trip condition's canonical key (its text when it cannot be read;
 * equal texts always have equal keys), the action as a reader reads it, and the latching.
 */
function description(interlock: Interlock): string {
  const key = conditionKey(interlock.tripsWhen.value);
  const trip = key === null ? `text:${interlock.tripsWhen.value.trim()}` : `key:${key}`;
  return `${trip}\u0000${wording(interlock.action)}\u0000${interlock.latches}`;
}

function differences(here: Interlock, there: Interlock): string[] {
  const out: string[] = [];
  const a = conditionKey(here.tripsWhen.value);
  const b = conditionKey(there.tripsWhen.value);
  if (a === null || b === null ? here.tripsWhen.value.trim() !== there.tripsWhen.value.trim() : a !== b) {
    const parsed = [here, there].flatMap((i) => {
      const r = parseCondition(i.tripsWhen.value);
      return r.ok ? [r.condition] : [];
    });
    out.push(`it trips when '${here.tripsWhen.value}' here, when '${there.tripsWhen.value}' there${conditionPressureNote(parsed, () => undefined)}`);
  }
  if (!sameWording(here.action, there.action)) out.push(`the action is '${here.action}' here, '${there.action}' there`);
  if (here.latches !== there.latches) out.push(`it ${here.latches ? 'latches' : 'does not latch'} here, ${there.latches ? 'latches' : 'does not latch'} there`);
  return out;
}
