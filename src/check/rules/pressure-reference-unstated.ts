// Reports a pressure in the plant register whose unit does not say whether it is gauge or absolute.
import { parseQuantity, pressureReference } from '../../analysis/units.ts';
import { defineManualRule } from '../define-rule.ts';

/** Pressure units that say which reference they use: the gauge ones (kPag ...) and the marked absolute ones (kPaa ...). */
const stated = /^(k|M|m)?(Pa|bar)[ag]$|^psi[ag]$/;

export default defineManualRule(
  {
    id: 'pressure-reference-unstated',
    summary: 'A pressure signal or relief set pressure in the plant register does not say whether it is gauge or absolute.',
    category: 'limits',
    defaultSeverity: 'warning',
    source: 'Common practice: a pressure transmitter and a relief valve setting read gauge or absolute pressure; the two differ by the standard atmosphere, 101.325 kPa (NIST SP 811, Appendix B.8)',
    docs: `Stepwright reads an unmarked pressure unit (\`kPa\`, \`bar\`, \`psi\`, \`atm\`, \`mmHg\` ...) as absolute, as SI does.
On a plant, though, "bar" on a gauge often means gauge pressure: a signal written \`unit: bar\` by someone who meant
barg puts every limit, trip and setpoint on it 1.01325 bar out when they are compared with gauge values. The
register defines each pressure once for every procedure, so it says which reference the transmitter or the relief
valve uses: \`kPag\`, \`barg\`, \`psig\` (gauge) or \`kPaa\`, \`bara\`, \`psia\` (absolute). Procedures may keep writing
either; the checker converts with the standard atmosphere and says so.`,
    examples: {
      bad: 'signals:\n  PI-210: { text: Kettle pressure, unit: bar, range: [0, 6] }',
      good: 'signals:\n  PI-210: { text: Kettle pressure (absolute), unit: bara, range: [0, 6] }',
    },
  },
  (ctx) => {
    const register = ctx.register;
    if (!register) return;
    const advice = (unit: string) => (['kPa', 'MPa', 'bar', 'mbar', 'psi'].includes(unit)
      ? `${unit}g (gauge) or ${unit}a (absolute)`
      : 'kPag (gauge) or kPaa (absolute)');
    for (const signal of register.signals.values()) {
      const unit = signal.unit?.trim();
      if (!unit || !pressureReference(unit) || stated.test(unit)) continue;
      ctx.reportInRegister(signal.file, {
        path: [...signal.path, 'unit'],
        message: `Pressure signal ${signal.id} has unit '${unit}', which does not say whether the transmitter reads gauge or absolute pressure; Stepwright reads it as absolute.`,
        hint: `Write ${advice(unit)}, whichever the transmitter reads.`,
      });
    }
    for (const relief of register.reliefDevices.values()) {
      const parsed = parseQuantity(relief.setPressure.value);
      if (!parsed.ok || !pressureReference(parsed.unit) || stated.test(parsed.unit)) continue;
      ctx.reportInRegister(relief.file, {
        path: relief.setPressure.path,
        message: `The set pressure of ${relief.id} (${relief.setPressure.value}) does not say whether it is gauge or absolute; Stepwright reads it as absolute.`,
        hint: `Write it in ${advice(parsed.unit)}; relief valves are usually set in gauge pressure.`,
      });
    }
  },
);
