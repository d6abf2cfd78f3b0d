// Reports a step at which a hazard's condition can hold, over any path through the procedure (calls expanded),
// for the procedure's own hazards and for hazards other procedures state about the same signals.
import { parseCondition } from '../../analysis/conditions/parse.ts';
import { stepsWhere } from '../../analysis/state/state-findings.ts';
import { conditionPressureNote } from '../../analysis/condition-pressure-note.ts';
import { defineManualRule } from '../define-rule.ts';
import { showPath } from '../state-path.ts';
import { hazardJobs, hazardStateOf, undeclaredIn, type HazardJob } from '../hazard-state.ts';

export default defineManualRule(
  {
    id: 'hazard-can-occur',
    summary: 'A hazard\'s condition can hold at a step on some path through the procedure.',
    category: 'safety',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(ii) and (iii): consequences of deviation, steps to avoid it, precautions',
    docs: `A hazard may say when it is present: \`when: M-210 == running and LI-210 < 20 percent\`. Stepwright works
out which values every signal, valve and trip can have at each step over every path (sequences, decisions,
parallel branches, loops and called procedures), and reports each step at which the condition can be true,
with the path of steps that leads there. Hazards that another procedure states about the same signals apply
too (in \`emergency\` and \`emergency-shutdown\` procedures, except another procedure's NOTICE: damage to equipment
is accepted there to protect people): a caution in the shutdown procedure about opening the cooling valve when hot holds in the batch procedure.

Fix it by changing the steps, not the hazard: add the step that brings the plant to a safe state first
(cool to below 200 degC before opening the cooling valve; check the level before starting the agitator), or
make the transition of the step before guarantee it (\`until: LI-210 >= 20 percent\`).`,
    examples: {
      bad: "hazards: [{ when: 'M-210 == running and LI-210 < 20 percent' }]\nsteps: start M-210 with the kettle empty",
      good: 'a step with until: LI-210 >= 20 percent comes before the step that starts M-210',
    },
  },
  (ctx) => {
    // A register hazard whose condition cannot be read is checked nowhere: say so where it is written.
    for (const entry of ctx.register ? [...ctx.register.equipment.values(), ...ctx.register.chemicals.values()] : []) {
      for (const h of entry.hazards) {
        if (!h.when) continue;
        const parsed = parseCondition(h.when.value);
        if (parsed.ok) continue;
        ctx.reportInRegister(entry.file, {
          path: h.when.path,
          severity: 'warning',
          message: `The condition of ${entry.id}'s hazard '${h.hazard}' cannot be read (${parsed.error.message}), so no procedure is checked against it.`,
          hint: parsed.error.hint,
        });
      }
    }
    for (const job of hazardJobs(ctx)) ctx.perFile(job.file, job.inputs, () => judge(job));

    function judge(job: HazardJob): void {
      const { file, expanded } = job;
      if (!file.facts) return;
      for (const r of job.registerHazards) {
        const missing = undeclaredIn(r.hazard, expanded);
        if (!missing.length) continue;
        ctx.report(file, {
          path: r.hazard.path,
          severity: 'info',
          message: `Hazard '${r.hazard.hazard}' (stated in ${r.from}) was not checked here: its condition names ${missing.join(', ')}, which this procedure does not declare.`,
          hint: `Declare ${missing.join(', ')} (or list ${missing.length > 1 ? 'them' : 'it'} under 'uses') so that the hazard is checked at every step.`,
        });
      }
      const state = hazardStateOf(job);
      if (!state) return;
      const { all, graph, analysis, shared } = state;
      if (!analysis.complete && !shared) {
        ctx.report(file, {
          path: ['steps'],
          part: 'key',
          severity: 'warning',
          message: `Hazard conditions were checked only in part: ${[...new Set(analysis.gaps)].slice(0, 2).join('; ')}.`,
          hint: 'Correct the conditions named here; until then a step where a hazard can be present may not be reported.',
        });
      }
      const reported = new Set<string>();
      for (const { hazard, from } of all) {
        const region = analysis.regionOf(hazard.when!.value);
        if (!region) continue;
        for (const finding of stepsWhere(analysis, graph, region)) {
          const key = `${hazard.when!.value}|${finding.step.id}`;
          if (reported.has(key)) continue;
          reported.add(key);
          const source = from ? ` (stated in ${from})` : '';
          const when = parseCondition(hazard.when!.value);
          const note = when.ok ? conditionPressureNote([when.condition], (n) => expanded.signals[n]?.unit) : '';
          ctx.report(file, {
            path: [...finding.step.path, 'step'],
            message: `Hazard '${hazard.hazard}'${source} can be present at step '${finding.step.id}': ${hazard.when!.value} can hold there (${finding.values})${note}. Path: ${showPath(finding.path)}.`,
            hint: 'Add or move a step so that the plant is safe before this one (or make the step before guarantee it with its until), or change what this step does.',
            related: from ? undefined : [{ path: hazard.when!.path, message: 'the hazard\'s condition' }],
            trace: finding.path,
          });
        }
      }
    }
  },
);
