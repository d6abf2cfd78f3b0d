// A problem that appears only when a called procedure runs inside its caller. The engine finds it
// (src/check/call-expansion.ts: the expanded procedure checked by the sequence, condition and limit rules and the
// emergency rules, findings compared by rule and place); this entry gives the pass its id, docs, examples and fixtures.
import { defineEnginePass } from '../define-rule.ts';

export default defineEnginePass(
  {
    id: 'call-expansion-problem',
    summary: 'A problem that appears only when a called procedure runs inside its caller.',
    category: 'sequence',
    defaultSeverity: 'error',
    docs: `Each procedure is checked on its own, and a procedure with \`call\` steps is also checked with every call
expanded into the called steps. The sequence, condition and limit rules then see both procedures at once:
a setpoint of the called procedure beyond the caller's operating limits or at one of its interlock trips,
a signal the two declare with different units, a loop that can no longer finish. The emergency rules
(\`contingency-missing\`, \`emergency-wait-without-time-limit\`) run too: in an \`emergency\` or
\`emergency-shutdown\` procedure, the steps it runs through calls, call after call, are held to them as its own
steps are, though the called procedure (a \`normal\` shared operation, say) is fine on its own; a \`time-limit\` or
\`if-not\` on the call step covers the called steps. Such a problem belongs to
neither file alone, so it is reported at the call step it comes through (or, when it lies in the caller's own
text, there), with the finding of the underlying rule. Findings are told apart by rule and place (where they point and the places they relate to): one the caller
or the called procedure already reports on its own is not reported again. Fix it in
the caller (its limits, or the way it calls) or in the shared operation, then have both reviewed.
Calls are expanded at most 12 deep and to at most 5,000 steps in all; a call beyond either limit is not
checked in combination, and a warning with the sizes says so.`,
    examples: {
      bad: 'caller limits PI-210 to high: 150 kPa; the called inerting procedure sets PI-210 to 200 kPa',
      good: "the caller's limits cover the pressures the called procedure uses",
    },
  },
);
