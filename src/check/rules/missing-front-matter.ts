// Reports a file under the manual that holds no procedure front-matter.
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'missing-front-matter',
    summary: 'The file does not start with YAML front-matter.',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `Every procedure file starts with a line \`---\`, then the procedure keys in YAML, then a closing \`---\`.
The markdown narrative follows. A markdown file in the procedures folder without front-matter holds no
procedure; move notes elsewhere or add the front-matter.`,
    examples: { bad: '# Start-up of H-220\n...', good: '---\nid: U2-H220-SU-001\n...\n---\n## Purpose' },
  },
  (ctx) => {
    for (const d of ctx.source.diagnostics) {
      if (d.rule === 'missing-front-matter') ctx.report({ range: d, message: d.message, hint: d.hint });
    }
  },
);
