// Reports keys the format does not know, with the closest known key as a suggestion.
import { closest, distance } from 'fastest-levenshtein';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'unknown-key',
    summary: 'A key that the procedure format does not define (often a typing error).',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `Every key in the front-matter must be one the format defines (see the format reference). A misspelt
key is otherwise silently ignored: \`untill\` would leave a step without its transition. The hint names the
closest known key.`,
    examples: { bad: 'untill: TI-210 >= 238 degC', good: 'until: TI-210 >= 238 degC' },
  },
  (ctx) => {
    for (const issue of ctx.schemaIssues) {
      if (issue.code !== 'unknown-key') continue;
      const key = String(issue.path.at(-1));
      const known = issue.knownKeys ?? [];
      const guess = known.length ? closest(key, known) : undefined;
      const close = guess !== undefined && distance(key, guess) <= Math.max(2, Math.floor(key.length / 3));
      ctx.report({
        path: issue.path,
        part: 'key',
        message: `Unknown key '${key}'.`,
        hint: close ? `Did you mean '${guess}'?` : `Known keys here: ${known.join(', ')}.`,
      });
    }
  },
);
