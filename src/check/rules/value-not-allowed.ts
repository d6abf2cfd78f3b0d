// Reports a condition that compares an enumerated or boolean signal with a value it can never have.
import { defineFileRule } from '../define-rule.ts';
import { reportProblemsOfKind } from '../report-condition-problems.ts';

export default defineFileRule(
  {
    id: 'value-not-allowed',
    summary: 'A condition compares a signal with a value outside its declared values.',
    category: 'conditions',
    defaultSeverity: 'error',
    docs: `A signal declared with \`values: [pass, fail]\` can only be compared with those words. A misspelt value
(\`lab-result == passed\`) would make the condition never true.`,
    examples: { bad: 'when: lab-result == passed', good: 'when: lab-result == pass' },
  },
  (ctx) => reportProblemsOfKind(ctx, ['bad-value', 'bad-quantity']),
);
