// Reports a review date further than the certification interval after the last certification.
import { addMonths, lastCertification } from '../../analysis/document-control.ts';
import { defineFileRule } from '../define-rule.ts';

const inUse = new Set(['approved', 'effective']);

export default defineFileRule(
  {
    id: 'review-interval-too-long',
    summary: "'review-by' is more than 12 months (or the configured interval) after the last certification.",
    category: 'document-control',
    defaultSeverity: 'error',
    dated: true,
    source: 'OSHA 29 CFR 1910.119(f)(3): operating procedures certified annually as current and accurate',
    docs: `Procedures in use are certified every year as current and accurate, separately from the approval of each
revision. The last certification is the newest entry under \`certifications\` (who certified it, their role, and
when), or the \`effective\` date before the first one. \`review-by\` must fall at most 12 months after it. A plant
with a stricter rule sets \`document-control: { certification-interval-months: 6 }\` in stepwright.config.yaml; the
interval cannot be made longer than 120 months, and 12 is the longest OSHA 1910.119(f)(3) allows.

\`\`\`yaml
certifications:
  - { name: Daniel Osei, role: Operations superintendent, date: 2026-11-02 }
review-by: 2027-11-02
\`\`\``,
    examples: { bad: 'effective: 2026-04-20\nreview-by: 2032-04-20', good: 'effective: 2026-04-20\nreview-by: 2027-04-20' },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p?.reviewBy || !inUse.has(String(p.status))) return;
    const last = lastCertification(p, ctx.today);
    if (!last) return;
    const months = ctx.certificationIntervalMonths ?? 12;
    const latest = addMonths(last.date, months);
    if (p.reviewBy <= latest) return;
    ctx.report({
      path: ['review-by'],
      message: `'review-by' ${p.reviewBy} is more than ${months} months after the last certification (${last.by === 'certification' ? 'certified' : 'effective'} ${last.date}); the next certification is due by ${latest}.`,
      hint: `Set 'review-by' to ${latest} or earlier, and record each yearly certification under 'certifications'.`,
    });
  },
);
