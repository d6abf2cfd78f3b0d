// Reports a safety message that does not say the consequence of the hazard or how to avoid it.
import { defineFileRule } from '../define-rule.ts';
import { contentSeverity } from '../content-severity.ts';

export default defineFileRule(
  {
    id: 'safety-message-incomplete',
    summary: 'A safety message lacks the consequence of the hazard or how to avoid it.',
    category: 'safety',
    defaultSeverity: 'error',
    source: 'ANSI Z535.6 (product safety information in manuals) and ANSI Z535.4: a safety message identifies the hazard, the consequence of not avoiding it, and how to avoid it',
    docs: `A warning that only names a hazard leaves the operator to guess how bad it is and what to do. Each
entry under \`hazards\` states all three parts: \`hazard\` (what), \`consequence\` (what happens if it is
not avoided) and \`avoid\` (how to avoid it).

Missing content is a **warning** while the procedure is a \`draft\` and an **error** from \`in-review\` on.`,
    examples: {
      bad: `- level: warning
  hazard: Hot oil in the jacket at up to 280 degC`,
      good: `- level: warning
  hazard: Hot oil in the jacket at up to 280 degC
  consequence: Severe burns
  avoid: Do not open jacket drains while heater H-220 runs`,
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p) return;
    for (const h of p.hazards) {
      const missing = [!h.consequence?.trim() && "the consequence ('consequence')", !h.avoid?.trim() && "how to avoid it ('avoid')"].filter(Boolean);
      if (!missing.length) continue;
      ctx.report({
        path: [...h.path, 'hazard'],
        severity: contentSeverity(String(p.status)),
        message: `The ${h.level.toUpperCase()} message '${h.hazard}' does not state ${missing.join(' or ')}.`,
        hint: 'A safety message names the hazard, the consequence of not avoiding it, and how to avoid it.',
      });
    }
  },
);
