// Reports numbers in prose that carry no unit ("Set TIC-210 to 45"), so the operator cannot tell 45 what.
import { proseOf } from '../../analysis/prose/prose-sites.ts';
import { tagProseAhead } from '../../analysis/prose/tag-ahead.ts';
import { proseTaggedAhead } from '../prose-ahead.ts';
import { bareNumbers } from '../../analysis/prose/bare-numbers.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'number-without-unit',
    summary: 'A number in the text has no unit.',
    category: 'writing',
    defaultSeverity: 'warning',
    source: 'DOE-STD-1029-92, Writer\'s Guide for Technical Procedures: numerical values are given with their units of measurement (and tolerances); NIST SP 811 (a value is a number and a unit)',
    docs: `A number without its unit invites the wrong one: 45 what, degC or percent, bar or kPa? Write every
value with its unit, as the instrument shows it (*45 degC*, *2.5 bar*, *30 percent*).

Not reported: counts of things (*2 bags*, *one 100 g sample*), labels (*channel 2*, *step 4*, *Unit 2*),
ranges whose second value carries the unit (*40 to 50 degC*), pH values, times of day and tags (*K-210*).`,
    examples: {
      bad: 'do: Set temperature controller TIC-210 to 45',
      good: 'do: Set temperature controller TIC-210 to 45 degC',
    },
  },
  (ctx) => {
    if (!ctx.procedure) return;
    tagProseAhead(ctx.procedure);
    for (const site of proseOf(ctx.procedure)) {
      for (const sentence of site.sentences) {
        for (const i of bareNumbers(sentence)) {
          const w = sentence.words[i];
          ctx.report({
            range: ctx.source.rangeInScalar(site.path, w.from, w.to),
            message: `The number ${w.text} has no unit.`,
            hint: 'Write the unit after the number, as the instrument shows it, e.g. "45 degC" or "2.5 bar".',
          });
        }
      }
    }
  },
  // The procedure's phrases go to the English model's thread before any rule runs.
  proseTaggedAhead,
);
