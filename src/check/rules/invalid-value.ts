// Reports values of the wrong type or outside the allowed choices (kind, status, hazard level, dates ...).
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'invalid-value',
    summary: 'A value has the wrong type or is not one of the allowed choices.',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `Values must have the type the format gives them: \`revision\` a whole number, dates written
YYYY-MM-DD, \`kind\`, \`status\` and hazard \`level\` one of their listed words, lists where lists are expected.
A signal's \`range\` is \`[low, high]\`: one written high end first (\`[300, 0]\`) is reported, since a range that runs
backwards usually means a typing slip in one of its ends (the checks that use the range read it whichever way
round it is written, and their messages show it low end first). A register signal's range is checked in the
register (\`register-entry-invalid\`).`,
    examples: { bad: 'status: released', good: 'status: effective' },
  },
  (ctx) => {
    for (const issue of ctx.schemaIssues) {
      if (issue.code === 'bad-type' || issue.code === 'bad-value' || (issue.code === 'bad-format' && !isIdPath(issue.path))) {
        ctx.report({ path: issue.path, message: issue.message, hint: issue.hint ?? 'See the format reference for the values this key takes.' });
      }
    }
    for (const signal of Object.values(ctx.procedure?.signals ?? {})) {
      const range = signal.range;
      if (signal.from || !range || !(range[0] > range[1])) continue;
      ctx.report({
        path: [...signal.path, 'range'],
        message: `The range of ${signal.name} runs backwards ([${range[0]}, ${range[1]}]): a range is written [low, high].`,
        hint: `Write the low end first: [${range[1]}, ${range[0]}]; check both ends against what the instrument reads.`,
      });
    }
  },
);

function isIdPath(path: readonly (string | number)[]): boolean {
  const key = String(path.at(-1));
  return key === 'id' || key === 'step' || path.at(-2) === 'parallel';
}
