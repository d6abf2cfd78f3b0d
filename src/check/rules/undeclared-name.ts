// Reports a condition, setpoint or limit that names a signal the procedure does not declare.
import { defineFileRule } from '../define-rule.ts';
import { reportProblemsOfKind } from '../report-condition-problems.ts';

export default defineFileRule(
  {
    id: 'undeclared-name',
    summary: 'A condition, setpoint or limit names a signal that is not declared.',
    category: 'conditions',
    defaultSeverity: 'error',
    docs: `Every name used in a condition, a setpoint (\`set\`) or an operating limit must be declared under
\`signals\` with its text and either a unit and range or a list of values. Declaring signals lets the checker
convert units, compare setpoints with limits and prove decisions exclusive.`,
    examples: { bad: 'until: TI-201 >= 180 degC   # TI-201 not declared', good: 'signals:\n  TI-210: {text: Kettle temperature, unit: degC, range: [0, 300]}' },
  },
  (ctx) => reportProblemsOfKind(ctx, ['undeclared-name']),
);
