// Reports a quantity whose unit cannot be converted to the unit of the signal it is compared with or set on.
import { defineFileRule } from '../define-rule.ts';
import { reportProblemsOfKind } from '../report-condition-problems.ts';

export default defineFileRule(
  {
    id: 'unit-mismatch',
    summary: "A quantity's unit does not fit the signal (e.g. bar on a temperature), or a unit is missing.",
    category: 'conditions',
    defaultSeverity: 'error',
    source: 'NIST SP 811 (units and conversion factors)',
    docs: `A value compared with or set on a signal must carry a unit of the same kind as the signal's unit:
any temperature unit for a temperature, any pressure unit for a pressure. Stepwright converts between them
(mmHg, Torr, bar, psi, atm ...) exactly. A bare number on a signal with a unit is ambiguous and is reported.`,
    examples: { bad: 'until: TI-210 >= 2 bar', good: 'until: TI-210 >= 180 degC' },
  },
  (ctx) => reportProblemsOfKind(ctx, ['unit-mismatch', 'missing-unit']),
);
