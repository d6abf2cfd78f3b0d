// Reports a condition threshold outside the signal's declared range: that comparison can never change.
import { comparisonsIn } from '../../analysis/conditions/parse.ts';
import { literalToBase } from '../../analysis/evaluate-condition.ts';
import { pressureConversionNote, toBase } from '../../analysis/units.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'threshold-outside-range',
    summary: "A condition's threshold lies outside the signal's declared range.",
    category: 'conditions',
    defaultSeverity: 'error',
    docs: `Each numeric signal declares the range its instrument can read. A threshold outside that range makes
the comparison always true or always false: \`until: TI-210 >= 350 degC\` on a 0–300 degC transmitter never ends
the step. Thresholds are converted into the signal's unit before the comparison.`,
    examples: { bad: "TI-210: {unit: degC, range: [0, 300]}\nuntil: TI-210 >= 350 degC", good: 'until: TI-210 >= 238 degC' },
  },
  (ctx) => {
    if (!ctx.facts || !ctx.procedure) return;
    for (const site of ctx.facts.conditions) {
      if (site.fromRegister) continue;
      if (!site.result.ok || site.problems.length) continue;
      for (const cmp of comparisonsIn(site.result.condition)) {
        const signal = ctx.procedure.signals[cmp.name.name];
        if (!signal?.range || !signal.unit || cmp.value.kind !== 'quantity') continue;
        const threshold = literalToBase(cmp.value);
        const low = toBase(signal.range[0], signal.unit);
        const high = toBase(signal.range[1], signal.unit);
        if (threshold === null || low === null || high === null) continue;
        if (threshold >= Math.min(low, high) && threshold <= Math.max(low, high)) continue;
        ctx.report({
          range: ctx.source.rangeInScalar(site.path, cmp.value.span.from, cmp.value.span.to),
          message: `Threshold ${cmp.value.value} ${cmp.value.unit} is outside the declared range of ${signal.name} (${Math.min(...signal.range)}..${Math.max(...signal.range)} ${signal.unit}), so '${cmp.name.name} ${cmp.op} ...' can never change${pressureConversionNote(cmp.value.unit, signal.unit)}.`,
          hint: 'Correct the threshold, or the declared range if the instrument reads further.',
          related: [{ path: [...signal.path, 'range'], message: 'declared range' }],
        });
      }
    }
  },
);
