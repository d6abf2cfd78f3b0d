// Reports a procedure that can end, on an ordinary path, with equipment in a state it put it in that the other
// paths do not leave it in and the line-up does not find it in: a branch that forgets to put it back.
import { enumValuesAt, enumeratedSignals, lineUpValues, signalsMovedBy } from '../../analysis/state/end-states.ts';
import type { StateView } from '../../analysis/state/analyse-state.ts';
import { emergencyKinds } from '../../model/kinds.ts';
import type { Step } from '../../model/procedure.ts';
import { walkSteps } from '../../model/walk-steps.ts';
import { defineFileRule } from '../define-rule.ts';
import { showPath } from '../state-path.ts';

/** At most this many paths are shown for one finding. */
const pathsShown = 2;

export default defineFileRule(
  {
    id: 'end-state-differs',
    summary: 'On one path the procedure ends with equipment in a state that the other paths and the line-up do not leave it in.',
    category: 'safety',
    defaultSeverity: 'warning',
    source: 'Common practice: a procedure leaves the plant in one known state, whichever way it went (OSHA 29 CFR 1910.119(f)(1)(i) steps for each operating phase, including normal shutdown)',
    docs: `The next shift, and the next procedure, take over the plant as this procedure leaves it. When a
procedure can end in more than one way (a \`choose\` whose branches end it), every way should leave each valve, pump
and heater it moved in the same state, or as the \`line-up\` found it. This rule reports an enumerated signal that
the procedure can leave, on an ordinary path, in a state that another path never ends with and that the line-up
does not find it in, with the path that ends so and one that does not. For example, a shutdown opens hot-oil valve
XV-2101 to flush the jacket, and only the branch for a passed lab result closes it again: when the result fails,
the procedure ends with the valve open.

What is not reported:

- a signal that ends the same way on every path, and one the procedure never moves (a lab result it reads, a
  reading a decision branches on): the decision is not a state the procedure leaves behind;
- a path that leaves the signal as the procedure found it (it never moves it on that path, or the line-up finds it
  in that state);
- a branch that ends differently **on purpose**: a step of that branch itself (not one the other paths share)
  puts the signal in the state it ends in — say so there, with a \`state\` (\`state: { XV-2101: open }\`, "Leave
  XV-2101 open for the re-flush"); the step table shows it to the operator and the reviewer;
- a loop back (\`goto\` with \`repeat\`) does not end the procedure and is not a path of its own here;
- the ends after a \`time-limit\` or \`if-not\` jump: \`contingency-goto-unsafe\` judges those;
- \`emergency\` and \`emergency-shutdown\` procedures, which may rightly end with the plant tripped in the state each
  path reached.

Fix it by putting the equipment back on every branch (close the valve in the failed-result branch too), or, where
the difference is meant, by a \`state\` in the branch that says so, and by saying in the next procedure's
\`line-up\` what it expects.`,
    examples: {
      bad: "- step: flush\n  state: { XV-2101: open }\n- choose:\n    - when: lab-ok == pass\n      steps: [{ step: close, state: { XV-2101: closed } }]\n    - when: lab-ok == fail\n      steps: [{ step: tell, confirm: Supervisor is told }]   # ends with XV-2101 open",
      good: "    - when: lab-ok == fail\n      steps: [{ step: close-and-tell, state: { XV-2101: closed }, confirm: Supervisor is told }]",
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p || !ctx.facts || emergencyKinds.has(p.kind)) return;
    const ends = ctx.facts.state.endViews.get('') ?? [];
    if (ends.length < 2) return;
    // Only signals some step moves: what the procedure reads and branches on is no state it leaves behind.
    const steps = new Map<string, Step>();
    const movers = new Map<string, Set<string>>();
    for (const { step } of walkSteps(p.steps)) {
      steps.set(step.id, step);
      for (const s of signalsMovedBy(step)) movers.set(s, (movers.get(s) ?? new Set()).add(step.id));
    }
    const judged = enumeratedSignals(p).filter((s) => movers.has(s));
    if (!judged.length) return;
    const analysis = ctx.facts.state;
    const lineUp = lineUpValues(analysis, p);
    const paths = new Map<number, string[]>();
    const pathOf = (view: StateView) => {
      let path = paths.get(view.node);
      if (!path) paths.set(view.node, (path = analysis.pathTo(view.node)));
      return path;
    };
    const perEnd = ends.map((view) => ({ view, values: enumValuesAt([view], judged) }));
    for (const signal of judged) {
      const found = new Map<string, { odd: StateView[]; other: StateView; mover: string }>();
      for (const { view, values } of perEnd) {
        const here = values.get(signal);
        if (!here) continue;
        for (const value of here) {
          if (lineUp.get(signal)?.has(value)) continue;
          const other = perEnd.find((e) => e.values.get(signal) && !e.values.get(signal)!.has(value));
          if (!other) continue;
          const path = pathOf(view);
          // The last step on the way that moved the signal: none means it is as the procedure found it.
          const mover = [...path].reverse().find((id) => movers.get(signal)!.has(id));
          if (!mover) continue;
          // Put in that state by a step of its own branch (one the other end does not pass): meant, and said.
          if (!pathOf(other.view).includes(mover)) continue;
          const key = `${value}|${mover}`;
          const known = found.get(key);
          if (known) known.odd.push(view);
          else found.set(key, { odd: [view], other: other.view, mover });
        }
      }
      for (const [key, { odd, other, mover }] of found) {
        const value = key.slice(0, key.indexOf('|'));
        const step = steps.get(mover)!;
        const otherValues = [...(enumValuesAt([other], [signal]).get(signal) ?? [])].join(' or ');
        const oddPaths = odd.slice(0, pathsShown).map((v) => showPath(pathOf(v)));
        const more = odd.length > pathsShown ? ` (and ${odd.length - pathsShown} more)` : '';
        const atStart = lineUp.get(signal);
        const action = step.state?.find((a) => a.signal === signal);
        ctx.report({
          path: action?.path ?? step.until?.path ?? [...step.path, 'step'],
          message: `The procedure can end with ${signal} ${value}, as step '${mover}' leaves it, on the path ${oddPaths.join('; and on ')}${more}; on another path it ends with ${signal} ${otherValues} (${showPath(pathOf(other))})${atStart ? `, and its line-up finds it ${[...atStart].join(' or ')}` : ''}.`,
          hint: `Put ${signal} back on every branch that ends the procedure, or, where ending with ${signal} ${value} is meant, say so with a state in that branch and in the line-up of the procedure that follows.`,
          trace: pathOf(odd[0]),
        });
      }
    }
  },
);
