// Reports a step note that gives an instruction: notes inform, actions belong in steps.
import { proseOf } from '../../analysis/prose/prose-sites.ts';
import { tagProseAhead } from '../../analysis/prose/tag-ahead.ts';
import { proseTaggedAhead } from '../prose-ahead.ts';
import { givesInstruction } from '../../analysis/prose/imperatives.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'note-holds-action',
    summary: 'A note gives an instruction; notes only inform.',
    category: 'writing',
    defaultSeverity: 'warning',
    source: 'DOE-STD-1029-92, Writer\'s Guide for Technical Procedures: notes present information only and never contain actions; UK HSE HSG48',
    docs: `Operators under pressure skip notes. An instruction hidden in a note (*Close the drain first*,
*Do not exceed 2 bar*) is an instruction that will be missed. Make it a step of its own, or a hazard with
\`avoid\` when it protects people.`,
    examples: {
      bad: 'note: Close drain valve HV-2114 before you start the pump.',
      good: 'note: Drain valve HV-2114 is closed by the previous step.',
    },
  },
  (ctx) => {
    if (!ctx.procedure) return;
    tagProseAhead(ctx.procedure);
    for (const site of proseOf(ctx.procedure)) {
      if (site.role !== 'note') continue;
      for (const sentence of site.sentences) {
        const found = givesInstruction(sentence);
        if (!found) continue;
        const w = sentence.words[found.at];
        ctx.report({
          range: ctx.source.rangeInScalar(site.path, w.from, sentence.to),
          message: `The note of step '${site.step}' gives an instruction: '${sentence.text}'.`,
          hint: 'Move the instruction into a step of its own (or a hazard\'s avoid text); keep the note for information.',
        });
      }
    }
  },
  // The procedure's phrases go to the English model's thread before any rule runs.
  proseTaggedAhead,
);
