// Reports a file that opens front-matter but holds no procedure in it: empty, a list, a single value.
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'front-matter-not-mapping',
    summary: 'The file looks like a procedure, but no procedure is read from it (empty, list or value front-matter, or front-matter out of place).',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `A file that starts with a \`---\` line is taken for a procedure. Its front-matter must be a mapping of
procedure keys (\`id: ...\`, \`title: ...\`, \`steps: ...\`). Empty front-matter, a list (lines starting with
\`- \`) or a single value yields no procedure; the file would silently drop out of the manual, so it is an error.
The commonest cause is one extra \`---\` line at the top: it closes the front-matter at once and the keys
below it are read as narrative text. Front-matter that starts after blank lines, or procedure keys (\`id:\`,
\`steps:\` ...) written without the opening \`---\`, are reported too: such a file is never taken for a note.`,
    examples: { bad: '---\n---\nid: U2-H220-SU-001\n...\n---', good: '---\nid: U2-H220-SU-001\n...\n---' },
  },
  (ctx) => {
    for (const d of ctx.source.diagnostics) {
      if (d.rule === 'front-matter-not-mapping') ctx.report({ range: d, message: d.message, hint: d.hint });
    }
  },
);
