// Reports a safety message whose hazard or consequence text gives an instruction instead of describing the danger.
import { proseOf } from '../../analysis/prose/prose-sites.ts';
import { tagProseAhead } from '../../analysis/prose/tag-ahead.ts';
import { proseTaggedAhead } from '../prose-ahead.ts';
import { givesInstruction } from '../../analysis/prose/imperatives.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'caution-holds-action',
    summary: "A warning's hazard or consequence text gives an instruction.",
    category: 'safety',
    defaultSeverity: 'warning',
    source: 'DOE-STD-1029-92, Writer\'s Guide for Technical Procedures: warnings and cautions contain no actions; ANSI Z535.6 (hazard, consequence, avoidance as separate parts)',
    docs: `A warning or caution describes a danger; it does not carry the steps. An instruction written into the
\`hazard\` or \`consequence\` text is easy to read past and is never checked off. Say how to avoid the hazard
in \`avoid\`, and put any action the operator performs into a step.`,
    examples: {
      bad: `hazard: Open the jacket drains only when H-220 is stopped
consequence: Severe burns`,
      good: `hazard: Hot oil at up to 280 degC in the jacket drains
consequence: Severe burns
avoid: Do not open the jacket drains while H-220 runs`,
    },
  },
  (ctx) => {
    if (!ctx.procedure) return;
    tagProseAhead(ctx.procedure);
    for (const site of proseOf(ctx.procedure)) {
      if (site.role !== 'hazard') continue;
      for (const sentence of site.sentences) {
        const found = givesInstruction(sentence);
        if (!found) continue;
        const w = sentence.words[found.at];
        ctx.report({
          range: ctx.source.rangeInScalar(site.path, w.from, sentence.to),
          message: `This safety message gives an instruction in its ${String(site.path.at(-1))} text: '${sentence.text}'.`,
          hint: "Describe the danger here; say how to avoid it in 'avoid' and put actions into steps.",
        });
      }
    }
  },
  // The procedure's phrases go to the English model's thread before any rule runs.
  proseTaggedAhead,
);
