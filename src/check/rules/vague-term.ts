// Reports vague terms that leave the operator to guess a value ("as required", "sufficient", "approximately").
import { proseOf } from '../../analysis/prose/prose-sites.ts';
import { statesQuantity } from '../../analysis/prose/bare-numbers.ts';
import { vagueTerms } from '../../analysis/prose/vague-terms.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'vague-term',
    summary: 'A vague term ("as required", "sufficient", "approximately") stands without a value.',
    category: 'writing',
    defaultSeverity: 'warning',
    source: 'DOE-STD-1029-92, Writer\'s Guide for Technical Procedures: avoid vague terms; give specific values and limits; UK HSE HSG48',
    docs: `*Heat as required*, *purge sufficiently*, *wait a few minutes* each ask the operator to decide what the
writer did not. Give the value, the limit or the condition instead (*Purge until AI-210 reads below 2 percent*).

A term is accepted when the value is right there: *approximately 50 kg* (a number follows), or
*add sufficient water to reach 40 percent* (the sentence states the quantity). *Several*, *a few* and
*as soon as possible* are always reported.`,
    examples: {
      bad: 'do: Purge the kettle with nitrogen as required',
      good: 'do: Purge the kettle with nitrogen until AI-210 reads below 2 percent',
    },
  },
  (ctx) => {
    if (!ctx.procedure) return;
    for (const site of proseOf(ctx.procedure)) {
      for (const sentence of site.sentences) {
        for (const term of vagueTerms(sentence, () => statesQuantity(sentence))) {
          const from = sentence.words[term.at].from;
          const to = sentence.words[term.at + term.length - 1].to;
          ctx.report({
            range: ctx.source.rangeInScalar(site.path, from, to),
            message: `'${term.term}' is vague: it does not say how much, how long or when.`,
            hint: 'Give the value, the limit or the condition instead, e.g. "until AI-210 reads below 2 percent".',
          });
        }
      }
    }
  },
);
