// Reports a procedure that declares hazards to people but no protective equipment.
import { defineFileRule } from '../define-rule.ts';
import { contentSeverity } from '../content-severity.ts';

export default defineFileRule(
  {
    id: 'ppe-missing',
    summary: "Hazards to people are declared but 'ppe' lists no protective equipment.",
    category: 'safety',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(iii)(B): precautions necessary to prevent exposure, including engineering controls, administrative controls and personal protective equipment',
    docs: `When a procedure warns of hazards to people (DANGER, WARNING or CAUTION), it also lists the personal
protective equipment the operator wears for it under \`ppe\`. A NOTICE (property damage only) does not need PPE.

Missing content is a **warning** while the procedure is a \`draft\` and an **error** from \`in-review\` on.`,
    examples: {
      bad: `hazards:
  - { level: warning, hazard: Hot resin at SP-210, consequence: Severe burns, avoid: Wear a face shield }
# no ppe`,
      good: `ppe: [Face shield, Heat-resistant gauntlets, Flame-resistant coveralls]
hazards:
  - { level: warning, hazard: Hot resin at SP-210, consequence: Severe burns, avoid: Wear a face shield }`,
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || p.ppe.length > 0) return;
    const toPeople = p.hazards.find((h) => h.level !== 'notice');
    if (!toPeople) return;
    ctx.report({
      path: ['hazards'],
      part: 'key',
      severity: contentSeverity(String(p.status)),
      message: `The procedure warns of '${toPeople.hazard}' but lists no protective equipment.`,
      hint: "Add 'ppe' with the protective equipment the operator wears, e.g. [Face shield, Chemical gloves].",
    });
  },
);
