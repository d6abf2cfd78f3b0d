// Reports a step parameter on a signal that differs from the value the plant's start-up procedure brings that
// signal to: two procedures that contradict each other about one running condition.
import { notInForce } from '../../analysis/document-control.ts';
import { convert, formatConverted, fromBase, toBase } from '../../analysis/units.ts';
import { defineManualRule } from '../define-rule.ts';

const startupKinds = new Set(['startup', 'startup-after-turnaround']);

export default defineManualRule(
  {
    id: 'param-differs-from-duty',
    summary: 'A step parameter gives a signal another value than the start-up procedure brings it to.',
    category: 'limits',
    defaultSeverity: 'warning',
    dated: true,
    source: 'OSHA 29 CFR 1910.119(f)(1)(ii) operating limits and (d)(3)(i) process safety information kept as one record; common practice',
    docs: `A start-up procedure brings a unit to its running conditions: the last setpoint it gives a signal is the
value the unit runs at (its duty). Another procedure that relies on that signal through a step parameter (the
batch's \`params: { hot-oil-supply: 270 degC }\`, tied to TI-221 by the register's \`params\`, or a parameter named
after the signal) expects that value. When the two differ, one of them is wrong, or the procedure must itself
change the signal (with a step that sets it). Compared exactly after unit conversion, with the start-up procedures
that are approved or effective; when two start-up procedures leave a signal at different values, it is not judged.`,
    examples: {
      bad: '# U2-H220-SU-001 (startup): set: { TI-221: 280 degC }\nparams: { hot-oil-supply: 270 degC }',
      good: '# U2-H220-SU-001 (startup): set: { TI-221: 280 degC }\nparams: { hot-oil-supply: 280 degC }',
    },
  },
  (ctx) => {
    // Signal → the value in-force start-up procedures leave it at (their last setpoint), when they agree.
    const duty = new Map<string, { base: number; text: string; unit: string; procedure: string; step?: string } | null>();
    for (const file of ctx.files) {
      const p = file.procedure;
      if (!p || !startupKinds.has(String(p.kind)) || notInForce(p, ctx.today) || !file.facts) continue;
      const last = new Map<string, (typeof file.facts.quantities)[number]>();
      for (const site of file.facts.quantities) if (site.role === 'setpoint' && site.quantity && !site.problems.length) last.set(site.signal, site);
      for (const [signal, site] of last) {
        const base = toBase(site.quantity!.value, site.quantity!.unit);
        if (base === null) continue;
        const known = duty.get(signal);
        if (known === undefined) duty.set(signal, { base, text: site.text, unit: site.quantity!.unit, procedure: p.id, step: site.step });
        else if (known !== null && Math.abs(known.base - base) > 1e-9 * Math.max(1, Math.abs(base))) duty.set(signal, null);
      }
    }
    if (!duty.size) return;
    for (const file of ctx.files) {
      const p = file.procedure;
      if (!p || startupKinds.has(String(p.kind)) || !file.facts) continue;
      const status = String(p.status);
      if (status === 'superseded' || status === 'retired') continue;
      const ownSetpoints = new Set(file.facts.quantities.filter((s) => s.role === 'setpoint').map((s) => s.signal));
      for (const site of file.facts.quantities) {
        if (site.role !== 'param' || !site.quantity || site.problems.length || ownSetpoints.has(site.signal)) continue;
        const d = duty.get(site.signal);
        const value = toBase(site.quantity.value, site.quantity.unit);
        if (!d || value === null || Math.abs(d.base - value) <= 1e-9 * Math.max(1, Math.abs(value))) continue;
        const what = site.param && site.param !== site.signal ? `parameter '${site.param}' (${site.signal})` : `parameter ${site.signal}`;
        const inTheirUnit = d.unit !== site.quantity.unit ? ` (${formatConverted(convert(site.quantity.value, site.quantity.unit, d.unit) ?? Number.NaN, d.unit, [fromBase(d.base, d.unit)])})` : '';
        ctx.report(file, {
          path: site.path,
          message: `Step '${site.step}' expects ${what} at ${site.text}${inTheirUnit}, but start-up procedure ${d.procedure} brings ${site.signal} to ${d.text}${d.step ? ` (step '${d.step}')` : ''}.`,
          hint: `Make the two agree, or add a step that sets ${site.signal} to the value this procedure needs.`,
        });
      }
    }
  },
);
