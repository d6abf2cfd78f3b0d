// Reports a latching trip that the procedure trips on purpose and can end with still in force.
import { latched, tripVariable } from '../../analysis/state/state-input.ts';
import { defineFileRule } from '../define-rule.ts';
import { showPath } from '../state-path.ts';
import { stoppingKinds } from '../../model/kinds.ts';

export default defineFileRule(
  {
    id: 'trip-left-latched',
    summary: 'A step trips a latching interlock on purpose, and the procedure can end with it still latched.',
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(iv): safety systems and their functions; IEC 61131-3 action qualifiers S and R (a stored action lasts until reset); common practice: a trip test ends with the trips reset and proven healthy',
    docs: `A step with \`trips: [...]\` trips interlocks on purpose, as in a trip test. A latching trip then holds its
outputs (valves closed, heaters off) until a step resets it (\`resets: [...]\`). When the procedure can end with the
trip still latched, the next crew finds the plant tripped without a word in the procedure about why, and the
trip's healthy state after the test was never confirmed.

Stepwright follows every path to the end of the procedure and reports each tripped interlock that can still be
latched there, with a path that leads there. Add a reset step after the test (and confirm the trip shows healthy).
\`shutdown\`, \`emergency\` and \`emergency-shutdown\` procedures may end tripped on purpose and are not reported.`,
    examples: {
      bad: "steps:\n  - { step: test-trips, trips: [TSHH-210], confirm: Trip recorded }\n  - { step: write-log, confirm: Logged }",
      good: "steps:\n  - { step: test-trips, trips: [TSHH-210], confirm: Trip recorded }\n  - { step: reset-trips, resets: [TSHH-210], confirm: Panel shows no latched trip }",
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    // A procedure that stops the plant may end with it tripped on purpose: making it safe is what it is for.
    if (!p || !ctx.facts || stoppingKinds.has(String(p.kind))) return;
    const tripping = ctx.facts.steps.filter(({ step }) => (step.trips ?? []).length > 0);
    if (!tripping.length) return;
    const latching = new Set(p.interlocks.filter((i) => i.latches).map((i) => i.tag));
    const analysis = ctx.facts.state;
    const ends = analysis.endViews.get('') ?? [];
    const latchedAt = (tag: string) => ends.find(({ box }) => {
      const v = box.get(tripVariable(tag));
      return v?.kind === 'enum' && v.set.includes(latched);
    });
    const reported = new Set<string>();
    for (const { step } of tripping) {
      const left = step.trips!.filter((t) => latching.has(t.value) && !reported.has(t.value) && latchedAt(t.value));
      if (!left.length) continue;
      for (const t of left) reported.add(t.value);
      const tags = left.map((t) => t.value);
      const path = analysis.pathTo(latchedAt(tags[0])!.node);
      const one = tags.length === 1;
      ctx.report({
        path: left[0].path,
        message: `Step '${step.id}' trips ${tags.join(' and ')}, which ${one ? 'latches' : 'latch'}, and the procedure can end with ${one ? 'it' : 'them'} still latched. Path: ${showPath(path)}.`,
        hint: `Add a step after the test that resets ${tags.join(' and ')} (resets: [${tags.join(', ')}]) and confirms ${one ? 'it shows' : 'they show'} healthy.`,
        trace: path,
      });
    }
  },
);
