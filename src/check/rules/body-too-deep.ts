// Reports narrative text nested so deeply that reading it would take too long or fail.
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'body-too-deep',
    summary: 'The markdown narrative nests quotes or lists too deeply to read safely.',
    category: 'syntax',
    defaultSeverity: 'error',
    docs: `The markdown below the front-matter is read before it is published. Lines whose block-quote markers
(\`>\`) and list markers with their indentation are wider than 100 columns are refused without reading the
narrative: markdown readers slow down steeply with deep nesting, and a procedure's purpose, scope and notes
never need more than a few levels. Flatten the lists and quotes.`,
    examples: { bad: '> > > > > > > … (hundreds of levels)', good: '> Note: keep the drain closed.' },
  },
  (ctx) => {
    for (const d of ctx.source.diagnostics) {
      if (d.rule === 'body-too-deep') ctx.report({ range: d, message: d.message, hint: d.hint });
    }
  },
);
