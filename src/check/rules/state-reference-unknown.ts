// Reports a lasting action, trip hold, trip test, reset or jump that names something the procedure does not declare.
import { parseQuantity, unitDimension } from '../../analysis/units.ts';
import type { PathKey } from '../../parse/read-source.ts';
import { walkSteps } from '../../model/walk-steps.ts';
import { sharedLatches } from '../../analysis/state/state-input.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'state-reference-unknown',
    summary: 'A state, trip, reset or contingency names a signal, value, interlock or step that is not declared.',
    category: 'conditions',
    defaultSeverity: 'error',
    source: 'IEC 61131-3 SFC action qualifiers (an action names a declared variable); common practice',
    docs: `A step's lasting actions (\`state: { XV-2107: open }\`), an interlock's \`holds\`, a step's \`trips\` and
\`resets\`, and the \`goto\` of \`if-not\` and \`time-limit\` must name what the procedure declares: an enumerated
signal and one of its values, an interlock (a reset needs one with \`latches: true\`, or the latching plant-register function that trips of
the procedure start, such as \`resets: [ESD-210]\`), a step id. A duration in
\`lasts\`, \`after\` or \`time-limit.max\` is a time such as \`30 s\`. A misspelt name would make the plant-state
checks miss what the step does.

The long form of a lasting action follows the action qualifiers of IEC 61131-3 SFC in our own words: a plain
value lasts until another step changes it (stored, S; putting it back is the reset, R); \`lasts: step\` holds it
only while the step is active (N); \`lasts: 30 s\` at most that long and never past the step (L); \`after: 5 min\`
takes effect after a delay (D, or SD when it then stays).`,
    examples: { bad: 'state: { XV-2017: open }', good: 'state: { XV-2107: open }' },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p) return;
    const stepIds = new Set(walkSteps(p.steps).map((s) => s.step.id));
    const checkValue = (signal: string, value: string, path: PathKey[]) => {
      const s = Object.hasOwn(p.signals, signal) ? p.signals[signal] : undefined;
      if (!s) {
        ctx.report({ path, part: 'key', message: `'${signal}' is not a declared signal.`, hint: 'Declare it under signals with its values (e.g. [open, closed]), or correct the name.' });
      } else if (!s.values?.length) {
        ctx.report({ path, part: 'key', message: `'${signal}' has no declared values, so it cannot be put in state '${value}'.`, hint: 'Give the signal values (e.g. [running, stopped]); use set for a numeric setpoint.' });
      } else if (!s.values.map(String).includes(value)) {
        ctx.report({ path, message: `'${value}' is not a declared value of ${signal} (${s.values.map(String).join(', ')}).`, hint: 'Use one of the declared values, or add this one to the signal.' });
      }
    };
    const checkDuration = (text: string | undefined, path: PathKey[]) => {
      if (text === undefined) return;
      const q = parseQuantity(text);
      if (q.ok && unitDimension(q.unit) === 'time') return;
      ctx.report({ path, message: `'${text}' is not a duration.`, hint: 'Write a number and a time unit, e.g. 30 s or 15 min.' });
    };
    for (const i of p.interlocks) for (const h of i.holds) checkValue(h.signal, h.value, h.path);
    const tags = new Map(p.interlocks.map((i) => [i.tag, i]));
    // A latching register function that trips of this procedure start (ESD-210) may be reset by its own name.
    const latchingFunctions = sharedLatches(p);
    for (const { step } of walkSteps(p.steps)) {
      for (const a of step.state ?? []) {
        checkValue(a.signal, a.value, a.path);
        if (a.duration) checkDuration(a.duration.value, a.duration.path);
      }
      for (const t of step.trips ?? []) {
        if (!tags.has(t.value)) ctx.report({ path: t.path, message: `'${t.value}' is not an interlock of this procedure.`, hint: 'Name an interlock listed under interlocks.' });
      }
      for (const r of step.resets ?? []) {
        const i = tags.get(r.value);
        if (!i && latchingFunctions.has(r.value)) continue;
        if (!i) ctx.report({ path: r.path, message: `'${r.value}' is not an interlock of this procedure.`, hint: 'Name an interlock listed under interlocks.' });
        else if (!i.latches) ctx.report({ path: r.path, message: `Interlock ${r.value} does not latch, so there is nothing to reset.`, hint: 'Mark the interlock latches: true with the outputs it holds, or remove the reset.' });
      }
      if (step.timeLimit) checkDuration(step.timeLimit.max.value, step.timeLimit.max.path);
      for (const g of [step.timeLimit?.goto, step.ifNot?.goto]) {
        if (g && !stepIds.has(g.value)) ctx.report({ path: g.path, message: `No step '${g.value}' in this procedure.`, hint: 'Name a step id of this procedure.' });
      }
    }
  },
);
