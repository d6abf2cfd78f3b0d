// Reports a step at which a hazard is kept away only by a measured value read at an earlier step: the reading is
// carried over steps that do not name it (an hour of heating) instead of being checked right before the step.
import { hazardOnOldReadings, type OldReading, type OldReadingFinding } from '../../analysis/state/old-readings.ts';
import { defineManualRule } from '../define-rule.ts';
import { showPath } from '../state-path.ts';
import { hazardJobs, hazardStateOf, type HazardJob } from '../hazard-state.ts';

export default defineManualRule(
  {
    id: 'hazard-relies-on-old-reading',
    summary: 'A hazard is ruled out at a step only by a measured value read at an earlier step, not right before it.',
    category: 'safety',
    defaultSeverity: 'warning',
    // Source: common practice: a permissive (a pressure, a temperature, a level) is checked immediately before the
    // action it permits; OSHA 29 CFR 1910.119(f)(1)(iii) asks for the precautions, not for when they are read.
    source: 'Common practice: a measured permissive is checked right before the action it permits',
    docs: `The plant-state analysis carries a measured value from the step that established it (an \`until\`, a
\`needs\`, a decision's \`when\`, a \`set\`, the line-up) to every later step that does not name it: a signal changes
only in steps that name it. For hazard-can-occur that is enough to rule a hazard out; for a safety reviewer it is
not. A vent step \`until: PI-210 <= 102 kPaa\`, then an hour of heating the closed kettle, then \`open manway M-1\`:
the manway is opened on a pressure read an hour earlier.

At each step where a hazard's \`when\` cannot hold as analysed, Stepwright judges it again with every numeric signal
the condition names taken anywhere in its declared range, except those established as the step starts: by the
step's own \`needs\`, or by the condition of the transition that enters it (the \`until\` of the step before, the
\`when\` of the branch taken, the line-up for the first step) on every way in. Enumerated signals (valves, hatches,
trips) stay as analysed: they change only when a step names them. When the hazard can then hold, the step is
reported with the signal, the step where its value was last established and the path.

Ways in that establish nothing: a contingency jump (\`time-limit\` or \`if-not\` with \`goto\`) leaves its step
without the \`until\` holding; at the join of parallel branches only what every branch establishes at its end
counts, as the branches end at different times. The message says when either is why. A hazard whose condition
cannot be analysed is not judged here (hazard-can-occur and state-not-analysed say so).

Fix it by checking the value right before the step: a \`needs\` on the step (\`needs: PI-210 <= 105 kPaa\`), or an
\`until\` on the step before it. A plant that accepts a carried-over reading in some procedure can waive the rule
there.`,
    examples: {
      bad: "steps: [{ step: vent, until: PI-210 <= 102 kPaa }, { step: heat, until: elapsed >= 60 min }, { step: open-hatch, state: { hatch: open } }]",
      good: "steps: [{ step: vent, until: PI-210 <= 102 kPaa }, { step: heat, until: elapsed >= 60 min }, { step: open-hatch, needs: PI-210 <= 105 kPaa, state: { hatch: open } }]",
    },
  },
  (ctx) => {
    for (const job of hazardJobs(ctx)) ctx.perFile(job.file, job.inputs, () => judge(job));

    function judge(job: HazardJob): void {
      const state = hazardStateOf(job);
      if (!state) return;
      const { all, graph, analysis } = state;
      const lineUp = (job.expanded.lineUp ?? []).map((l) => l.value);
      const reported = new Set<string>();
      for (const { hazard, from } of all) {
        const region = analysis.regionOf(hazard.when!.value);
        if (!region) continue;
        for (const finding of hazardOnOldReadings(analysis, graph, region, lineUp)) {
          const key = `${hazard.when!.value}|${finding.step.id}`;
          if (reported.has(key)) continue;
          reported.add(key);
          const source = from ? ` (stated in ${from})` : '';
          const signals = finding.readings.map((r) => r.signal);
          const before = previousStep(finding);
          ctx.report(job.file, {
            path: [...finding.step.path, 'step'],
            message: `Hazard '${hazard.hazard}'${source} is ruled out at step '${finding.step.id}' only by ${finding.readings.map(whereRead).join('; ')}${entryNote(finding)}: `
              + `the step does not check ${list(signals)} itself, and with ${signals.length > 1 ? 'them' : 'it'} anywhere in range ${hazard.when!.value} can hold (${finding.values}). Path: ${showPath(finding.path)}.`,
            hint: `Check ${list(signals)} right before the step: a needs on '${finding.step.id}' that states the safe value${before ? `, or an until on '${before}'` : ''}.`,
            related: from ? undefined : [{ path: hazard.when!.path, message: 'the hazard\'s condition' }],
            trace: finding.path,
          });
        }
      }
    }
  },
);

function whereRead(r: OldReading): string {
  switch (r.by) {
    case 'line-up': return `${r.signal} as the line-up found it`;
    case 'range': return `${r.signal} as an earlier step left it`;
    case 'until': return `${r.signal} as read at the end of step '${r.step}' (its until)`;
    case 'needs': return `${r.signal} as checked before step '${r.step}' (its needs)`;
    case 'when': return `${r.signal} as read at the decision after step '${r.step}'`;
    case 'set': return `${r.signal} as set at step '${r.step}'`;
  }
}

function entryNote(f: OldReadingFinding): string {
  if (f.entry === 'jump') return ' (the step can be reached by a contingency jump, which leaves its step without the until holding)';
  if (f.entry === 'join') return ' (the step follows parallel branches that end at different times)';
  return '';
}

/** The step before the finding's step on its path, if any. */
function previousStep(f: OldReadingFinding): string | undefined {
  const before = f.path.slice(0, -1).at(-1);
  return before?.split(' (')[0];
}

function list(names: string[]): string {
  return names.length > 1 ? `${names.slice(0, -1).join(', ')} and ${names.at(-1)}` : names[0];
}
