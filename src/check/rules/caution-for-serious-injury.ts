// Reports a CAUTION whose consequence is death or serious injury: that is the range of WARNING or DANGER.
import { splitSentences } from '../../analysis/prose/words.ts';
import { seriousHarmWords } from '../../analysis/prose/harm-words.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'caution-for-serious-injury',
    summary: 'A CAUTION names death or serious injury as its consequence; use WARNING or DANGER.',
    category: 'safety',
    defaultSeverity: 'warning',
    source: 'ANSI Z535.4 and Z535.6 signal words: CAUTION could result in minor or moderate injury; WARNING could, and DANGER will, result in death or serious injury',
    docs: `The signal word grades the hazard. CAUTION stands for minor or moderate injury. When the consequence is
death, blindness, asphyxiation, severe burns or other serious injury, the message is under-graded: use WARNING
(could happen) or DANGER (will happen if not avoided).`,
    examples: {
      bad: `- level: caution
  hazard: Nitrogen in the kettle after inerting
  consequence: Asphyxiation and death on entry`,
      good: `- level: danger
  hazard: Nitrogen in the kettle after inerting
  consequence: Asphyxiation and death on entry`,
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p) return;
    for (const h of p.hazards) {
      if (h.level !== 'caution') continue;
      const words = seriousHarmWords(splitSentences(`${h.hazard}. ${h.consequence ?? ''}`));
      if (!words.length) continue;
      ctx.report({
        path: [...h.path, 'level'],
        message: `This CAUTION names death or serious injury ('${[...new Set(words)].join("', '")}'); CAUTION is for minor or moderate injury.`,
        hint: 'Use warning (could result in death or serious injury) or danger (will result in it).',
      });
    }
  },
);
