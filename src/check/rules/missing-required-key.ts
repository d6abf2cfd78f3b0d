// Reports a required key that is absent (id, title, kind, revision, status, steps; a step's id and action ...).
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'missing-required-key',
    summary: 'A key the format requires is missing.',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `A procedure needs \`id\`, \`title\`, \`kind\`, \`revision\`, \`status\` and \`steps\`. A step needs \`step\`
(its id) and \`do\` (its action). An approval needs \`role\`, \`name\`, \`date\` and \`meaning\`; a signal needs \`text\`;
an interlock needs \`tag\`, \`trips-when\` and \`action\`; a hazard needs \`level\` and \`hazard\`.`,
    examples: { bad: '- step: heat-up\n  until: TI-210 >= 180 degC', good: '- step: heat-up\n  do: Heat K-210 to 180 degC\n  until: TI-210 >= 180 degC' },
  },
  (ctx) => {
    for (const issue of ctx.schemaIssues) {
      if (issue.code !== 'missing-key') continue;
      const key = String(issue.path.at(-1));
      ctx.report({
        path: issue.path.slice(0, -1),
        message: issue.path.length === 1 ? `The procedure has no '${key}'.` : `This entry has no '${key}', which it requires.`,
        hint: issue.values ? `Add '${key}' here, one of ${issue.values.map((v) => `'${v}'`).join(', ')}.` : `Add '${key}: ...' here.`,
      });
    }
  },
);
