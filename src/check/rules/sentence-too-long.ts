// Reports sentences longer than about 20 words in instructions and 25 in descriptions.
import { proseOf, type ProseRole } from '../../analysis/prose/prose-sites.ts';
import { countWords } from '../../analysis/prose/words.ts';
import { defineFileRule } from '../define-rule.ts';

/** Source: ASD-STE100 Simplified Technical English: at most 20 words in a procedural sentence, 25 in a descriptive one. */
export const maxWords: Record<ProseRole, number> = { action: 20, check: 20, avoid: 20, note: 25, hazard: 25, limit: 25 };

export default defineFileRule(
  {
    id: 'sentence-too-long',
    summary: 'A sentence is longer than 20 words (instructions) or 25 words (descriptions).',
    category: 'writing',
    defaultSeverity: 'warning',
    source: 'ASD-STE100 Simplified Technical English: procedural sentences of at most 20 words, descriptive sentences of at most 25; DOE-STD-1029-92 (short, simple instructions)',
    docs: `Long sentences are misread, above all on a tablet in the field. Instructions (\`do\`, \`confirm\`, a
hazard's \`avoid\`) are kept to **20 words** a sentence; descriptions (notes, hazards, consequences, limit
texts) to **25**. Tags such as XV-2101 and numbers count as one word each.

Split the sentence, move background into the body of the procedure, or make a second step.`,
    examples: {
      bad: 'do: Open the hot-oil supply valve XV-2101 slowly over about two minutes while you watch the jacket pressure on PI-2102 for any sudden rise',
      good: 'do: Open hot-oil supply valve XV-2101 over 2 min while watching jacket pressure PI-2102',
    },
  },
  (ctx) => {
    if (!ctx.procedure) return;
    for (const site of proseOf(ctx.procedure)) {
      const max = maxWords[site.role];
      for (const sentence of site.sentences) {
        const n = countWords(sentence);
        if (n <= max) continue;
        ctx.report({
          range: ctx.source.rangeInScalar(site.path, sentence.from, sentence.to),
          message: `This sentence has ${n} words; keep ${site.role === 'note' || site.role === 'hazard' || site.role === 'limit' ? 'descriptions' : 'instructions'} to ${max} words or fewer.`,
          hint: 'Split it into shorter sentences, or move background into the body of the procedure.',
        });
      }
    }
  },
);
