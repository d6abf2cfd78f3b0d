// Reports a line-up condition that a procedure this one requires never leaves true when it ends.
import { namesIn, parseCondition } from '../../analysis/conditions/parse.ts';
import type { Region } from '../../analysis/decisions/signal-space.ts';
import { nearReadings } from '../../analysis/state/near-readings.ts';
import { unitDimension } from '../../analysis/units.ts';
import type { Procedure, Signal } from '../../model/procedure.ts';
import { defineManualRule, type FileContext } from '../define-rule.ts';
import { filesById, requiresOf, type RequiresSite } from '../requires-sites.ts';

export default defineManualRule(
  {
    id: 'line-up-contradicts-required',
    summary: 'A line-up condition can never hold when a procedure this one requires has ended.',
    category: 'sequence',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(i): steps for each operating phase; line-ups and prerequisites: common practice',
    docs: `A procedure's \`line-up\` says what holds before its first step, and \`requires\` names the procedures completed
before it starts. When a required procedure, on every way it can end normally, leaves the plant so that a line-up
condition is false (the inerting procedure ends with the charge chute open, the line-up says it is closed), no
operator can start the procedure as written: a step is missing between the two, or one of them is wrong.

Stepwright works out the plant state at the end of the required procedure (its own line-up, steps, lasting actions
and transitions) and compares each line-up condition that speaks only of signals both procedures declare alike.
A condition the required procedure leaves open (it may or may not hold) is not reported; only one that cannot
hold. The conditions are also taken together: when each can hold at some end of the required procedure but no end
leaves all of them true (it ends with the chute valve open, or with the vent valve open, and the line-up wants both
closed), the line-up is reported as a whole. A signal the required procedure moves until a threshold is taken to end
near that threshold, within 1 % of its range, not exactly on it: a line-up just inside it is not reported. Add the step that brings the plant into the line-up (to either procedure), or correct the line-up.`,
    examples: {
      bad: 'U2-K210-INERT-001 ends with XV-2107 open\nU2-K210-BATCH-001: requires: [U2-K210-INERT-001], line-up: [XV-2107 == closed]',
      good: 'U2-K210-INERT-001 ends with a step that closes XV-2107',
    },
  },
  (ctx) => {
    const byId = filesById(ctx.files);
    for (const file of ctx.files) {
      const p = file.procedure;
      if (!p || !p.lineUp.length) continue;
      // The findings depend on the file and on the procedures it requires, as found by id: the end state of each is
      // worked out again only when one of them, or which file holds an id, has changed.
      const sites = requiresOf(p).map((site) => ({ site, required: byId.get(site.id) }));
      const found = sites.flatMap(({ required }) => (required ? [required] : []));
      const inputs = JSON.stringify(sites.map(({ site, required }) => [site.id, required?.file ?? null]));
      ctx.perFile(file, inputs, () => judge(file, p, sites), found);
    }

    function judge(file: FileContext, p: Procedure, sites: Array<{ site: RequiresSite; required: FileContext | undefined }>): void {
      for (const { site, required } of sites) {
        const q = required?.procedure;
        if (!q || required === file || !required.facts) continue;
        const analysis = required.facts.state;
        const ends = analysis.endViews.get('') ?? [];
        if (!analysis.complete || !ends.length) continue;
        // Where a signal was moved to a threshold, the readings near it: the end is not that exact on a plant.
        const ended = nearReadings(analysis.space, ends.map((e) => e.box));
        const endsWith = (names: string[]) => [...new Set(ends.map((e) => analysis.space.describe(new Map([...e.box].filter(([k]) => names.includes(k))) as never)))].slice(0, 3).join('; or ');
        const related = [{ file: required.file, range: required.source.rangeOf(['steps']), message: `the steps of ${site.id}` }];
        // The conditions compared, each with the values where it holds: each on its own first, then all of them together.
        const compared: Array<{ text: string; region: Region; names: string[] }> = [];
        let contradicted = false;
        for (const item of p.lineUp) {
          const parsed = parseCondition(item.value);
          if (!parsed.ok) continue;
          const names = [...new Set(namesIn(parsed.condition).map((n) => n.name))];
          if (!names.length || !names.every((n) => alike(p.signals[n], q.signals[n]))) continue;
          const region = analysis.regionOf(item.value);
          if (!region) continue;
          compared.push({ text: item.value, region, names });
          if (analysis.space.and(ended, region).length) continue;
          contradicted = true;
          ctx.report(file, {
            path: item.path,
            message: `The line-up says ${item.value}, but ${site.id}, which this procedure requires, always ends with ${endsWith(names)}.`,
            hint: `Add the step that brings the plant from the end of ${site.id} into this line-up (or make ${site.id} end so), or correct the line-up.`,
            related,
          });
        }
        // Each condition can hold at some end of the required procedure, but not all of them at the same end (it ends
        // with XV-1 open, or with XV-2 open, and the line-up wants both closed): no operator can start either.
        if (contradicted || compared.length < 2) continue;
        let together = compared[0].region;
        for (const c of compared.slice(1)) together = analysis.space.and(together, c.region);
        if (!together.length || analysis.space.and(ended, together).length) continue;
        const names = [...new Set(compared.flatMap((c) => c.names))];
        ctx.report(file, {
          path: p.lineUp[0].path.slice(0, -1),
          message: `The line-up's conditions ${compared.map((c) => c.text).join(', ')} can each hold when ${site.id}, which this procedure requires, has ended, but never all together: it ends with ${endsWith(names)}.`,
          hint: `Add the steps that bring the plant from each end of ${site.id} into the whole line-up, or correct the line-up.`,
          related,
        });
      }
    }
  },
);

function alike(a: Signal | undefined, b: Signal | undefined): boolean {
  if (!a || !b) return false;
  if (a.unit || b.unit) return !!a.unit && !!b.unit && unitDimension(a.unit) === unitDimension(b.unit);
  const va = (a.values ?? []).map(String).sort().join('|');
  const vb = (b.values ?? []).map(String).sort().join('|');
  return va === vb && va !== '';
}
