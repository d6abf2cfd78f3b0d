// Reports a step whose own setpoint keeps its until false: held at the setpoint, the step never ends.
import { evaluateCondition } from '../../analysis/evaluate-condition.ts';
import { toBase } from '../../analysis/units.ts';
import { conditionPressureNote } from '../../analysis/condition-pressure-note.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'setpoint-blocks-transition',
    summary: "A step's setpoint keeps its own until condition false.",
    category: 'conditions',
    defaultSeverity: 'warning',
    docs: `When a step sets a signal and waits for that same signal, the controller drives the signal to the
setpoint and holds it there. \`set: {TI-210: 140 degC}\` with \`until: TI-210 >= 150 degC\` therefore waits forever
unless something else heats the kettle. The until is evaluated with the signal at its setpoint, after unit
conversion; other signals in the condition are left open, so only a condition that is false whatever they are
is reported.`,
    examples: { bad: 'set: {TI-210: 140 degC}\nuntil: TI-210 >= 150 degC', good: 'set: {TI-210: 152 degC}\nuntil: TI-210 >= 150 degC' },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    for (const site of ctx.facts.quantities) {
      if (site.role !== 'setpoint' || !site.quantity || site.problems.length || !site.step) continue;
      const step = ctx.facts.stepById.get(site.step)?.step;
      if (!step?.until) continue;
      const until = ctx.facts.conditionAt(step.until.path);
      if (!until?.result.ok || until.problems.length) continue;
      const base = toBase(site.quantity.value, site.quantity.unit);
      if (base === null) continue;
      const known = new Map([[site.signal, { kind: 'number' as const, base }]]);
      if (evaluateCondition(until.result.condition, known) !== false) continue;
      const note = conditionPressureNote([until.result.condition], () => undefined, [{ signal: site.signal, unit: site.quantity.unit }]);
      ctx.report({
        path: step.until.path,
        message: `Step '${step.id}' sets ${site.signal} to ${site.text}, but its until '${until.text}' is false at that setpoint${note}: held there, the step never ends.`,
        hint: 'Set the signal beyond the threshold, or wait for a value the setpoint reaches.',
        related: [{ path: site.path, message: `setpoint ${site.signal}: ${site.text}` }],
      });
    }
  },
);
