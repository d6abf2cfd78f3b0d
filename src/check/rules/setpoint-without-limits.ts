// Warns about a setpoint or step parameter on a signal that has no operating limits to check it against.
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'setpoint-without-limits',
    summary: 'A setpoint or step parameter is given to a signal that has no operating limits, so nothing checks it.',
    category: 'limits',
    defaultSeverity: 'warning',
    source: 'OSHA 29 CFR 1910.119(f)(1)(ii): operating limits for the process; (d)(3)(i)(B): safe upper and lower limits',
    docs: `A setpoint is checked against its signal's operating limits and trips. When the signal has no limits
(neither in the procedure nor in the plant register), a setpoint of 280 degC passes whatever the equipment can
take: the check is silent because it has nothing to compare with. Give the signal its operating limits, with
the consequence of deviation and the correction, in the register (or under \`limits\` for a one-off signal).`,
    examples: {
      bad: 'signals:\n  TI-220: { text: Hot-oil supply temperature, unit: degC, range: [0, 350] }\nsteps:\n  - { step: heat, do: Heat the oil., set: { TI-220: 280 degC }, until: TI-220 >= 275 degC }',
      good: 'limits:\n  TI-220: { low: 150 degC, high: 290 degC, consequence: ..., correction: ... }',
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || !ctx.facts) return;
    const limited = new Set(p.limits.filter((l) => l.low || l.high).map((l) => l.signal));
    const told = new Set<string>();
    for (const site of ctx.facts.quantities) {
      if ((site.role !== 'setpoint' && site.role !== 'param') || !site.quantity || site.problems.length) continue;
      const signal = p.signals[site.signal];
      if (!signal?.unit || limited.has(site.signal)) continue;
      // Once per signal and step is enough: the rest say the same.
      const key = `${site.signal}\u0000${site.step ?? ''}`;
      if (told.has(key)) continue;
      told.add(key);
      const what = site.role !== 'param' ? site.signal : site.param === site.signal ? `parameter ${site.signal}` : `parameter '${site.param}' (${site.signal})`;
      ctx.report({
        path: site.path,
        message: `Step '${site.step}' sets ${what} to ${site.text}, but ${site.signal} has no operating limits, so the value is not checked against any.`,
        hint: signal.from
          ? `Add limits (low, high, consequence, correction) to ${site.signal} in the plant register (${signal.from.file}).`
          : `Add limits for ${site.signal} under 'limits', or take the signal from the plant register.`,
      });
    }
  },
);
