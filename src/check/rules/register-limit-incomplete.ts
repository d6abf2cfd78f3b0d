// Reports operating limits in the plant register that lack their consequence of deviation or their correction.
import { defineManualRule } from '../define-rule.ts';

export default defineManualRule(
  {
    id: 'register-limit-incomplete',
    summary: 'An operating limit in the plant register lacks its consequence of deviation or the steps to correct it.',
    category: 'safety',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(ii): operating limits with the consequences of deviation and the steps required to correct or avoid deviation',
    docs: `The register's limits appear on every page of every procedure that uses the signal, so each one states
what happens outside the limit (\`consequence\`) and what the operator does about it (\`correction\`). A procedure's
own limits are judged by \`limit-incomplete\`; a limit the register supplies is judged here, once, at its place in
the register file.`,
    examples: {
      bad: 'signals:\n  TI-210: { text: Kettle temperature, unit: degC, limits: { high: 245 degC } }',
      good: 'signals:\n  TI-210:\n    text: Kettle temperature\n    unit: degC\n    limits: { high: 245 degC, consequence: Above 245 degC the resin gels, correction: Switch the jacket to cooling oil }',
    },
  },
  (ctx) => {
    for (const signal of ctx.register?.signals.values() ?? []) {
      const limits = signal.limits;
      if (!limits || (!limits.low && !limits.high)) continue;
      const missing = [
        !limits.consequence?.trim() && 'the consequence of deviation (consequence)',
        !limits.correction?.trim() && 'the steps to correct it (correction)',
      ].filter(Boolean);
      if (!missing.length) continue;
      ctx.reportInRegister(signal.file, {
        path: limits.path,
        part: 'key',
        message: `The operating limits of ${signal.id} do not state ${missing.join(' or ')}; every procedure that uses ${signal.id} shows them without it.`,
        hint: "Add 'consequence' (what happens outside the limit) and 'correction' (what the operator does) under the signal's limits.",
      });
    }
  },
);
