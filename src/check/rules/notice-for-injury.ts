// Reports a NOTICE whose text speaks of harm to people: NOTICE is reserved for property damage.
import { splitSentences } from '../../analysis/prose/words.ts';
import { harmWords } from '../../analysis/prose/harm-words.ts';
import { defineFileRule } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'notice-for-injury',
    summary: 'A NOTICE speaks of harm to people; NOTICE is for property damage only.',
    category: 'safety',
    defaultSeverity: 'error',
    source: 'ANSI Z535.4 and Z535.6: NOTICE addresses practices not related to personal injury; hazards to people use CAUTION, WARNING or DANGER',
    docs: `The signal word tells the operator how badly they can be hurt. NOTICE means *no one gets hurt*: only
equipment, product or the environment suffer. A NOTICE whose hazard or consequence mentions injuries, burns,
irritation or death is under-graded: use CAUTION (minor or moderate injury), WARNING (could kill or seriously
injure) or DANGER (will kill or seriously injure).`,
    examples: {
      bad: `- level: notice
  hazard: Caustic splashes at the CIP return
  consequence: Skin irritation and eye burns
  avoid: Wear a face shield and chemical gloves`,
      good: `- level: caution
  hazard: Caustic splashes at the CIP return
  consequence: Skin irritation and eye burns
  avoid: Wear a face shield and chemical gloves`,
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p) return;
    for (const h of p.hazards) {
      if (h.level !== 'notice') continue;
      const words = harmWords(splitSentences(`${h.hazard}. ${h.consequence ?? ''}`));
      if (!words.length) continue;
      ctx.report({
        path: [...h.path, 'level'],
        message: `This NOTICE speaks of harm to people ('${[...new Set(words)].join("', '")}'); NOTICE is for property damage only.`,
        hint: 'Use caution for minor or moderate injury, warning or danger for death or serious injury.',
      });
    }
  },
);
