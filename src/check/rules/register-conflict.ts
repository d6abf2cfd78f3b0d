// Reports a procedure's own declaration of a signal, limit or interlock that says something else than the register.
import { conditionKey, sameAmount, sameWording } from '../../analysis/register-consistency.ts';
import { convert, parseQuantity, pressureConversionNote } from '../../analysis/units.ts';
import { parseCondition } from '../../analysis/conditions/parse.ts';
import { conditionPressureNote } from '../../analysis/condition-pressure-note.ts';
import { describeSafetyFunction } from '../../model/register.ts';
import { reliefOf } from '../../model/apply-register.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'register-conflict',
    summary: 'A signal, limit or interlock declared in the procedure differs from its definition in the plant register.',
    category: 'limits',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(d) and (f)(1)(iv): one set of process safety information; safety systems and their functions',
    docs: `When the plant has a register, a signal, operating limit or safety function is defined there once. A
procedure may still declare a one-off signal of its own, but a local declaration of a tag the register defines
must say the same: the same unit and range, the same limits, the same trip condition and the same action. Two
descriptions of one trip (a high-high temperature at 255 degC here and 265 degC in the register) mean one of them
is wrong, and an operator could act on the wrong one. Remove the local declaration and list the tag under \`uses\`.`,
    examples: {
      bad: 'interlocks:\n  - { tag: TSHH-210, trips-when: TI-210 >= 265 degC, action: Closes XV-2101 }   # register: 255 degC',
      good: 'uses: [TSHH-210]',
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    const register = ctx.register;
    if (!p || !register) return;
    const hint = "Remove the local declaration and name the register entry under 'uses'; change the register itself if the plant changed.";
    for (const signal of Object.values(p.signals)) {
      const entry = register.signals.get(signal.name);
      if (signal.from || !entry) continue;
      const differences: string[] = [];
      if ((signal.unit ?? '') !== (entry.unit ?? '')) differences.push(`unit ${signal.unit ?? '(none)'} here, ${entry.unit ?? '(none)'} in the register`);
      if (signal.range && entry.range && signal.unit && entry.unit) {
        const low = convert(signal.range[0], signal.unit, entry.unit);
        const high = convert(signal.range[1], signal.unit, entry.unit);
        if (low === null || high === null || Math.abs(low - entry.range[0]) > 1e-9 || Math.abs(high - entry.range[1]) > 1e-9) {
          differences.push(`range [${signal.range.join(', ')}] ${signal.unit} here, [${entry.range.join(', ')}] ${entry.unit} in the register`);
        }
      }
      const values = (v?: unknown[]) => (v ?? []).map(String).sort().join('|');
      if (values(signal.values) !== values(entry.values)) differences.push(`values [${values(signal.values).replaceAll('|', ', ')}] here, [${values(entry.values).replaceAll('|', ', ')}] in the register`);
      if (differences.length) {
        ctx.report({
          path: signal.path, part: 'key',
          message: `Signal '${signal.name}' is declared differently from the plant register: ${differences.join('; ')}.`,
          hint, related: [{ file: entry.file, range: rangeIn(register, entry.file, entry.path), message: `register definition of ${entry.id}` }],
        });
      }
    }
    for (const limit of p.limits) {
      const entry = register.signals.get(limit.signal);
      if (limit.from || !entry?.limits) continue;
      for (const side of ['low', 'high'] as const) {
        const local = limit[side]?.value;
        const theirs = entry.limits[side]?.value;
        if (local === undefined || sameAmount(local, theirs)) continue;
        ctx.report({
          path: limit[side]!.path,
          message: `The ${side} limit of ${limit.signal} is ${local} here but ${theirs ?? 'not set'} in the plant register${unitNote(local, theirs)}.`,
          hint, related: [{ file: entry.file, range: rangeIn(register, entry.file, entry.limits.path), message: `register limits of ${entry.id}` }],
        });
      }
    }
    for (const interlock of p.interlocks) {
      if (interlock.from) continue;
      const fn = register.safetyFunctions.get(interlock.tag);
      const relief = register.reliefDevices.get(interlock.tag);
      if (!fn && !relief) continue;
      const registerTrip = fn ? fn.tripsWhen?.value ?? '' : reliefOf(relief!, interlock.path).tripsWhen.value;
      const registerAction = fn ? describeSafetyFunction(fn, register) : undefined;
      const place = fn ?? relief!;
      const related = [{ file: place.file, range: rangeIn(register, place.file, place.path), message: `register definition of ${interlock.tag}` }];
      const ours = conditionKey(interlock.tripsWhen.value);
      const theirs = conditionKey(registerTrip);
      if (ours === null || theirs === null ? interlock.tripsWhen.value.trim() !== registerTrip.trim() : ours !== theirs) {
        ctx.report({
          path: interlock.tripsWhen.path,
          message: `Interlock ${interlock.tag} trips when '${interlock.tripsWhen.value}' here, but when '${registerTrip}' in the plant register${tripNote(interlock.tripsWhen.value, registerTrip)}.`,
          hint, related,
        });
      }
      if (registerAction !== undefined && !sameWording(interlock.action, registerAction) && !sameWording(interlock.action, fn?.action)) {
        ctx.report({
          path: [...interlock.path, 'action'],
          message: `Interlock ${interlock.tag} is described differently from the plant register. Here: '${interlock.action}'. Register: '${registerAction}'`,
          hint, related,
        });
      }
    }
  },
);

function rangeIn(register: NonNullable<Parameters<typeof describeSafetyFunction>[1]>, file: string, path: readonly (string | number)[]) {
  return register.sources.find((s) => s.file === file)?.source.rangeOf(path, 'key');
}

/** The gauge/absolute conversion note when the two limits are pressures on different references. */
function unitNote(a: string | number | undefined, b: string | number | undefined): string {
  const qa = a === undefined ? undefined : parseQuantity(String(a));
  const qb = b === undefined ? undefined : parseQuantity(String(b));
  return qa?.ok && qb?.ok ? pressureConversionNote(qa.unit, qb.unit) : '';
}

/** The same for two trip conditions. */
function tripNote(a: string, b: string): string {
  const parsed = [a, b].flatMap((text) => {
    const r = parseCondition(text);
    return r.ok ? [r.condition] : [];
  });
  return conditionPressureNote(parsed, () => undefined);
}
