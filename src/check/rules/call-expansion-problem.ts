// Runs the sequence, condition and limit rules on a caller with its calls expanded, and reports what goes
// wrong only in the combination (e.g. a called setpoint beyond the caller's own limits) at the call step.
import { collectFacts } from '../../analysis/procedure-facts.ts';
import { callSitesOf, inlineCalls, inlineSeparator } from '../../analysis/inline-calls.ts';
import type { Severity } from '../../parse/diagnostic.ts';
import type { Procedure } from '../../model/procedure.ts';
import { defineManualRule, type FileContext, type FileRule, type Report } from '../define-rule.ts';
import { rules } from './index.ts';

const categories = new Set(['sequence', 'conditions', 'limits']);

export default defineManualRule(
  {
    id: 'call-expansion-problem',
    summary: 'A problem that appears only when a called procedure runs inside its caller.',
    category: 'sequence',
    defaultSeverity: 'error',
    docs: `Each procedure is checked on its own, and a procedure with \`call\` steps is also checked with every call
expanded into the called steps. The sequence, condition and limit rules then see both procedures at once:
a setpoint of the called procedure beyond the caller's operating limits or at one of its interlock trips,
a signal the two declare with different units, a loop that can no longer finish. Such a problem belongs to
neither file alone, so it is reported at the call step, with the finding of the underlying rule. Fix it in
the caller (its limits, or the way it calls) or in the shared operation, then have both reviewed.
Calls are expanded at most 12 deep and to at most 5,000 steps in all; a call beyond either limit is not
checked in combination, and a warning with the sizes says so.`,
    examples: {
      bad: 'caller limits PI-210 to high: 150 kPa; the called inerting procedure sets PI-210 to 200 kPa',
      good: "the caller's limits cover the pressures the called procedure uses",
    },
  },
  (ctx) => {
    const byId = new Map<string, FileContext>();
    for (const f of ctx.files) if (f.procedure?.id && !byId.has(f.procedure.id)) byId.set(f.procedure.id, f);
    const checked = (Object.values(rules) as Array<{ scope: string }>)
      .filter((r): r is FileRule => r.scope === 'file' && categories.has((r as FileRule).meta.category));
    for (const file of ctx.files) {
      if (!file.procedure) continue;
      const sites = callSitesOf(file.procedure);
      if (!sites.length) continue;
      const expanded = inlineCalls(file.procedure, (id) => byId.get(id)?.procedure ?? undefined);
      // A call too deep or too large to expand is not checked in combination: say so, with the sizes.
      for (const problem of expanded.problems) {
        if (problem.kind !== 'too-deep' && problem.kind !== 'too-large') continue;
        ctx.report(file, {
          path: problem.site.path,
          severity: 'warning',
          message: problem.kind === 'too-deep'
            ? `Step '${problem.site.step.id}' calls '${problem.site.callee}' ${problem.depth} calls deep; calls are expanded at most ${problem.limit} deep, so this one was not checked together with its caller.`
            : `Expanding the call of '${problem.site.callee}' at step '${problem.site.step.id}' would give ${problem.steps > 1e15 ? 'more than 10^15' : problem.steps.toLocaleString('en-GB')} steps in all (calls multiplied out); the limit is ${problem.limit.toLocaleString('en-GB')}, so this call was not checked together with its caller.`,
          hint: 'Shared operations that call other shared operations multiply: call each one once, at the level where it is needed, or split the procedure.',
        });
      }
      if (!expanded.inlined.length) continue;
      // What each part reports on its own is already reported in its own file.
      const known = new Set(findings(file, file.procedure, checked).map((f) => f.key));
      for (const id of expanded.inlined) {
        const callee = byId.get(id);
        if (callee?.procedure) for (const f of findings(callee, callee.procedure, checked)) known.add(f.key);
      }
      const reported = new Set<string>();
      for (const finding of findings(file, expanded.procedure, checked)) {
        if (known.has(finding.key) || reported.has(finding.key)) continue;
        reported.add(finding.key);
        const site = sites.find((s) => finding.message.includes(`${s.step.id}${inlineSeparator}`)) ?? sites[0];
        ctx.report(file, {
          path: site.path,
          severity: finding.severity,
          message: `With '${site.callee}' run by step '${site.step.id}': ${finding.message}`,
          hint: finding.hint ?? `Check the caller's limits and signals against '${site.callee}', or change the call.`,
          trace: [`rule ${finding.rule}`],
        });
      }
    }
  },
);

interface Finding {
  rule: string;
  message: string;
  hint?: string;
  severity: Severity;
  /** The rule and message with call prefixes removed, to compare with what each file reports alone. */
  key: string;
}

function findings(file: FileContext, procedure: Procedure, checked: FileRule[]): Finding[] {
  const out: Finding[] = [];
  const facts = procedure === file.procedure ? file.facts : collectFacts(procedure);
  for (const rule of checked) {
    const context: FileContext = {
      ...file, procedure, facts, schemaIssues: [],
      report: (r: Report) => out.push({
        rule: rule.meta.id, message: r.message, hint: r.hint, severity: r.severity ?? rule.meta.defaultSeverity,
        key: `${rule.meta.id}\u0000${r.message.replace(/\b[a-z0-9-]+(?:\/[a-z0-9-]+)+/g, (ids) => ids.split(inlineSeparator).at(-1)!)}`,
      }),
    };
    try {
      rule.check(context);
    } catch {
      // A rule that cannot handle the combination says nothing here; it still runs on each file.
    }
  }
  return out;
}
