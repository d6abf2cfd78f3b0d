// Reports a step action that does not start with an action verb ("The valve is opened", "Opening XV-2101").
import { proseOf } from '../../analysis/prose/prose-sites.ts';
import { tagProseAhead } from '../../analysis/prose/tag-ahead.ts';
import { proseTaggedAhead } from '../prose-ahead.ts';
import { mainClauseStart, startsWithActionVerb } from '../../analysis/prose/imperatives.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'step-starts-with-verb',
    summary: "A step's action does not start with an action verb.",
    category: 'writing',
    defaultSeverity: 'warning',
    source: 'DOE-STD-1029-92, Writer\'s Guide for Technical Procedures: action steps begin with an action verb, in the active voice; UK HSE HSG48 (clear, direct instructions)',
    docs: `An operator scanning a procedure reads the first word of each step to know what to do. Write every
action as a command that starts with its verb: *Open*, *Close*, *Charge*, *Vent*, *Record*. A condition may
come first (*If TI-210 exceeds 245 degC, open XV-2105*); the main clause after it still starts with the verb.

Passive or descriptive wording (*The valve is opened*, *Opening of XV-2101*) hides who acts and what to do.`,
    examples: {
      bad: 'do: The hot-oil valve XV-2101 is opened to the jacket',
      good: 'do: Open hot-oil valve XV-2101 to the jacket',
    },
  },
  (ctx) => {
    if (!ctx.procedure) return;
    tagProseAhead(ctx.procedure);
    for (const site of proseOf(ctx.procedure)) {
      if (site.role !== 'action') continue;
      const first = site.sentences[0];
      if (!first || startsWithActionVerb(first)) continue;
      const at = first.words[Math.min(mainClauseStart(first), first.words.length - 1)] ?? first.words[0];
      ctx.report({
        range: at ? ctx.source.rangeInScalar(site.path, at.from, at.to) : undefined,
        path: site.path,
        message: `Step '${site.step}' does not start with an action verb: '${truncate(site.text)}'.`,
        hint: 'Start the action with the verb the operator performs, e.g. "Open XV-2101", "Record the acid value".',
      });
    }
  },
  // The procedure's phrases go to the English model's thread before any rule runs.
  proseTaggedAhead,
);

function truncate(text: string): string {
  return text.length > 60 ? `${text.slice(0, 57)}…` : text;
}
