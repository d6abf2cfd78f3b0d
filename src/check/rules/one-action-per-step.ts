// Reports a step action that chains several imperatives ("Open XV-2101 and start P-211").
import { proseOf } from '../../analysis/prose/prose-sites.ts';
import { tagProseAhead } from '../../analysis/prose/tag-ahead.ts';
import { proseTaggedAhead } from '../prose-ahead.ts';
import { chainedImperatives, givesInstruction } from '../../analysis/prose/imperatives.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'one-action-per-step',
    summary: 'A step action chains more than one instruction.',
    category: 'writing',
    defaultSeverity: 'warning',
    source: 'DOE-STD-1029-92, Writer\'s Guide for Technical Procedures: one action per step; UK HSE HSG48 (steps short and in order)',
    docs: `A step that asks for two things gets one of them skipped, and cannot be checked off or signed for
precisely. Split chained instructions (*Open XV-2101 and start P-211*, *Drain the line, then flush it*) into
separate steps, each with its own transition.

Actions that really are done together can be written as a list under \`do\`; each item is then one action.
Lists of objects (*Charge xylene and glycol*) and descriptions of the plant (*Check that P-211 runs and
XV-2101 is open*) are not chained instructions.`,
    examples: {
      bad: 'do: Close hot-oil valve XV-2101 and open cooling-oil valve XV-2105',
      good: `- step: close-hot-oil
  do: Close hot-oil valve XV-2101
  until: XV-2101 == closed
- step: open-cooling
  do: Open cooling-oil valve XV-2105
  until: XV-2105 == open`,
    },
  },
  (ctx) => {
    if (!ctx.procedure) return;
    tagProseAhead(ctx.procedure);
    for (const site of proseOf(ctx.procedure)) {
      if (site.role !== 'action') continue;
      for (const sentence of site.sentences) {
        for (const i of chainedImperatives(sentence)) {
          const w = sentence.words[i];
          ctx.report({
            range: ctx.source.rangeInScalar(site.path, w.from, w.to),
            message: `Step '${site.step}' asks for more than one action: '${w.text}' starts a second instruction.`,
            hint: 'Split the step so that each step holds one action, or list actions done together as items under do.',
          });
        }
      }
      // A second sentence that is itself an instruction is a second action too.
      for (const sentence of site.sentences.slice(1)) {
        const found = givesInstruction(sentence);
        if (!found) continue;
        const w = sentence.words[found.at];
        ctx.report({
          range: ctx.source.rangeInScalar(site.path, w.from, w.to),
          message: `Step '${site.step}' asks for more than one action: the sentence starting '${w.text}' is a second instruction.`,
          hint: 'Split the step so that each step holds one action.',
        });
      }
    }
  },
  // The procedure's phrases go to the English model's thread before any rule runs.
  proseTaggedAhead,
);
