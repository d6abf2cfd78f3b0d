// Reports a hold test (a pressure-hold leak test) whose pass branch accepts a larger fall than the test's own
// acceptance criterion (`max-drop`).
import { comparisonsIn, parseCondition } from '../../analysis/conditions/parse.ts';
import { convert, formatQuantity, parseQuantity } from '../../analysis/units.ts';
import type { ChooseBlock, SequenceItem, Step } from '../../model/procedure.ts';
import { walkSteps } from '../../model/walk-steps.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'hold-test-beyond-criterion',
    summary: "A hold test's pass branch accepts a larger fall than the test's acceptance criterion ('max-drop').",
    category: 'safety',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(i): steps for each operating phase, including start-up after a turnaround; common practice: a pressure-hold leak test passes only when the fall over the hold is within its stated acceptance (from memory: ASME PCC-2 / site leak-test standards state the allowed drop)',
    docs: `A hold test brings a signal to a value, holds it and reads the fall: a vessel pressurised with nitrogen to
200 kPa, isolated for 30 minutes, passes when it has lost no more than 5 kPa. The hold step states that
acceptance with \`max-drop\` (\`{ PI-210: 5 kPa }\`), and the \`choose\` block directly after it decides pass or fail.

The rule takes the highest value the signal can start the hold at — the largest of the nearest earlier step's
setpoint and the threshold its \`until\` waits for — and the threshold at which the pass branch (the branch
without a \`goto\` that compares the signal with \`>=\` or \`>\`) is taken. Their difference is the largest fall the
procedure accepts; when it is more than \`max-drop\`, a leaking vessel passes. Pressurising to \`>= 195 kPa\` and
passing at \`>= 190 kPa\` accepts a 10 kPa fall against a 5 kPa criterion.

Fix the thresholds (pressurise to 200 kPa and pass at 195 kPa), or correct the criterion if the site standard
allows more. A hold step whose start value or pass branch cannot be found is reported as not checked (info).`,
    examples: {
      bad: "- step: pressurise\n  set: { PI-210: 200 kPa }\n  until: PI-210 >= 195 kPa\n- step: hold\n  max-drop: { PI-210: 5 kPa }\n  until: elapsed >= 30 min\n- choose:\n    - when: PI-210 >= 190 kPa",
      good: "- step: pressurise\n  set: { PI-210: 200 kPa }\n  until: PI-210 >= 200 kPa\n- step: hold\n  max-drop: { PI-210: 5 kPa }\n  until: elapsed >= 30 min\n- choose:\n    - when: PI-210 >= 195 kPa",
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p) return;
    const order = walkSteps(p.steps).map((s) => s.step);
    for (const { step, next } of holdSteps(p.steps)) {
      for (const criterion of step.maxDrop ?? []) {
        const allowed = parseQuantity(criterion.quantity);
        if (!allowed.ok) continue; // the unit rules report a malformed quantity
        const signal = criterion.signal;
        const notChecked = (why: string) => ctx.report({
          path: criterion.path,
          severity: 'info',
          message: `The acceptance criterion of step '${step.id}' (${signal} falls at most ${criterion.quantity}) was not checked: ${why}.`,
          hint: `Write the step that brings ${signal} up (with 'set' or 'until') before '${step.id}', and a 'choose' block directly after it whose pass branch compares ${signal} with '>='.`,
        });
        const start = startValue(order, step, signal, allowed.unit);
        if (start === undefined) { notChecked(`no earlier step sets ${signal} or waits for it to rise`); continue; }
        const pass = next ? passThreshold(next, signal, allowed.unit) : undefined;
        if (!pass) { notChecked(`no decision directly after the step passes on ${signal} >= a value`); continue; }
        const accepted = start.value - pass.value;
        if (accepted <= allowed.value + 1e-9) continue;
        ctx.report({
          path: pass.path,
          message: `The hold test of step '${step.id}' passes at ${pass.text}, although ${signal} can start the hold at ${formatQuantity(start.value, allowed.unit)} (${start.from}): it accepts a fall of ${formatQuantity(accepted, allowed.unit)}, more than its criterion of ${criterion.quantity}.`,
          hint: `Pass only at ${signal} >= ${formatQuantity(start.value - allowed.value, allowed.unit)}, or bring ${signal} to a known value before the hold ('until: ${signal} >= …' equal to the setpoint).`,
          related: [{ path: criterion.path, message: `acceptance criterion of step '${step.id}'` }],
        });
      }
    }
  },
);

/** Steps with a `max-drop`, each with the item that directly follows it in its sequence. */
function holdSteps(items: SequenceItem[]): Array<{ step: Step; next?: SequenceItem }> {
  const out: Array<{ step: Step; next?: SequenceItem }> = [];
  const visit = (seq: SequenceItem[]) => {
    seq.forEach((item, i) => {
      if (item.kind === 'step') {
        if (item.maxDrop?.length) out.push({ step: item, next: seq[i + 1] });
      } else if (item.kind === 'parallel') item.branches.forEach((b) => visit(b.items));
      else item.branches.forEach((b) => b.items && visit(b.items));
    });
  };
  visit(items);
  return out;
}

/** The highest value the signal can start the hold at: the nearest earlier step that sets it or waits for it to rise. */
function startValue(order: Step[], hold: Step, signal: string, unit: string): { value: number; from: string } | undefined {
  const at = order.indexOf(hold);
  for (let i = at - 1; i >= 0; i--) {
    const s = order[i]!;
    const values: number[] = [];
    for (const sp of s.set) {
      if (sp.signal !== signal) continue;
      const q = parseQuantity(sp.quantity);
      const v = q.ok ? convert(q.value, q.unit, unit) : null;
      if (v !== null) values.push(v);
    }
    const parsed = s.until ? parseCondition(s.until.value) : undefined;
    if (parsed?.ok) {
      for (const c of comparisonsIn(parsed.condition)) {
        if (c.name.name !== signal || c.value.kind !== 'quantity' || !['>=', '>', '=='].includes(c.op)) continue;
        const v = convert(c.value.value, c.value.unit, unit);
        if (v !== null) values.push(v);
      }
    }
    if (values.length) return { value: Math.max(...values), from: `step '${s.id}'` };
  }
  return undefined;
}

/** The threshold of the pass branch: a branch without a jump whose condition needs the signal at or above a value. */
function passThreshold(next: SequenceItem, signal: string, unit: string): { value: number; text: string; path: ChooseBlock['path'] } | undefined {
  if (next.kind !== 'choose') return undefined;
  for (const branch of next.branches) {
    if (branch.goto || !branch.when) continue;
    const parsed = parseCondition(branch.when.value);
    if (!parsed.ok) continue;
    for (const c of comparisonsIn(parsed.condition)) {
      if (c.name.name !== signal || c.value.kind !== 'quantity' || (c.op !== '>=' && c.op !== '>')) continue;
      const v = convert(c.value.value, c.value.unit, unit);
      if (v !== null) return { value: v, text: branch.when.value, path: branch.when.path };
    }
  }
  return undefined;
}
