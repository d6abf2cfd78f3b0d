// Reports front-matter that is not valid YAML, at the place the YAML reader stopped.
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'yaml-syntax',
    summary: 'The front-matter is not valid YAML, or is too deep or too large to read safely.',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `The front-matter between the two \`---\` lines must be valid YAML. The diagnostic points at the place
where the YAML reader stopped. Common causes: text containing \`: \` or \`#\` that is not quoted, a list item
indented differently from its neighbours, a key written twice in one mapping, tabs used for indentation.
Front-matter nested more than 200 levels deep, or with aliases that expand to many copies, is refused.`,
    examples: { bad: 'do: Heat: then hold', good: 'do: "Heat, then hold"' },
  },
  (ctx) => {
    for (const d of ctx.source.diagnostics) {
      if (d.rule === 'yaml-syntax') ctx.report({ range: d, message: d.message, hint: d.hint });
    }
  },
);
