// Reports keys the format does not know, with the closest known key as a suggestion.
import { closest, distance } from 'fastest-levenshtein';
import { defineFileRule } from '../define-rule.ts';
import { mergeKey, mergeKeyHint, mergeKeyMessage, mergeKeyPaths } from '../../parse/merge-keys.ts';

export default defineFileRule(
  {
    id: 'unknown-key',
    summary: 'A key that the procedure format does not define (often a typing error).',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `Every key in the front-matter must be one the format defines (see the format reference). A misspelt
key is otherwise silently ignored: \`untill\` would leave a step without its transition. The hint names the
closest known key.

A YAML merge key (\`- <<: *common\`) is reported as what it is: front-matter is read as YAML 1.2, which has no merge
keys, so \`<<\` copies nothing and the keys of the anchored mapping must be written out. An alias for a whole value
(\`key: *anchor\`) does work.`,
    examples: { bad: 'untill: TI-210 >= 238 degC', good: 'until: TI-210 >= 238 degC' },
  },
  (ctx) => {
    const merges = mergeKeyPaths(ctx.source.data);
    for (const path of merges) ctx.report({ path, part: 'key', message: mergeKeyMessage, hint: mergeKeyHint });
    for (const issue of ctx.schemaIssues) {
      if (issue.code !== 'unknown-key') continue;
      // A merge key, and the keys inside what it names, are reported above as a merge key.
      if (merges.length && issue.path.includes(mergeKey)) continue;
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
