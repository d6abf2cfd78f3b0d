// Reports a narrative so large that reading and publishing it would take too long.
import { defineFileRule } from '../define-rule.ts';
import { bodyLimits } from '../../parse/nesting-prescan.ts';
import { groupDigits } from '../../parse/group-digits.ts';

export default defineFileRule(
  {
    id: 'body-too-large',
    summary: 'The markdown narrative is too large to read safely (characters, lines or link definitions).',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `The markdown below the front-matter is read and published with every build, and the markdown reader's
time grows with its size. A narrative of more than ${bodyLimits.bytes / 1024} kB, ${groupDigits(bodyLimits.lines)} lines or ${bodyLimits.linkDefinitions} link reference
definitions (\`[name]: address\`) is refused without being read. A procedure's purpose, scope and notes fit
in far less; move reference material to a document of its own and link to it.`,
    examples: { bad: '(a 2 MB narrative, or 50,000 lines "[r1]: https://…")', good: '## Purpose\nStart up the hot-oil heater H-220 after a planned stop.' },
  },
  (ctx) => {
    for (const d of ctx.source.diagnostics) {
      if (d.rule === 'body-too-large') ctx.report({ range: d, message: d.message, hint: d.hint });
    }
  },
);
