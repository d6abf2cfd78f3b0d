// Reports values of the wrong type or outside the allowed choices (kind, status, hazard level, dates ...).
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'invalid-value',
    summary: 'A value has the wrong type or is not one of the allowed choices.',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `Values must have the type the format gives them: \`revision\` a whole number, dates written
YYYY-MM-DD, \`kind\`, \`status\` and hazard \`level\` one of their listed words, lists where lists are expected.`,
    examples: { bad: 'status: released', good: 'status: effective' },
  },
  (ctx) => {
    for (const issue of ctx.schemaIssues) {
      if (issue.code === 'bad-type' || issue.code === 'bad-value' || (issue.code === 'bad-format' && !isIdPath(issue.path))) {
        ctx.report({ path: issue.path, message: issue.message, hint: issue.hint ?? 'See the format reference for the values this key takes.' });
      }
    }
  },
);

function isIdPath(path: readonly (string | number)[]): boolean {
  const key = String(path.at(-1));
  return key === 'id' || key === 'step' || path.at(-2) === 'parallel';
}
