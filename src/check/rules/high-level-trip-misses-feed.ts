// Reports a high-level trip in the plant register that closes or stops nothing that feeds the vessel it protects.
import { comparisonsIn, parseCondition } from '../../analysis/conditions/parse.ts';
import { NotAnalysable, SignalSpace } from '../../analysis/decisions/signal-space.ts';
import type { Condition } from '../../analysis/conditions/ast.ts';
import type { PlantRegister, RegisterSafetyFunction } from '../../model/register.ts';
import { defineManualRule } from '../define-rule.ts';

export default defineManualRule(
  {
    id: 'high-level-trip-misses-feed',
    summary: 'A high-level trip closes or stops nothing that feeds the vessel whose level it watches.',
    category: 'safety',
    defaultSeverity: 'error',
    source: 'ISA-5.1 identification letters (first letter L: level); common practice: a high-level trip isolates the feeds of the vessel to prevent overfilling (HSE HSG176 / the Buncefield recommendations on overfill protection, from memory)',
    docs: `A high-level trip protects a vessel against overfilling, so it must close or stop what flows **into** the
vessel. A trip that stops the outlet pump instead leaves the feed running into a full vessel and makes it worse.

The rule reads the plant register: a safety function that trips at high values of a level signal (tag starting
with L, as in ISA-5.1), read from the values at which its \`trips-when\` is true, so that \`LI-210 >= 90 percent\`
and \`not (LI-210 < 90 percent)\` count alike (a condition that cannot be read as values is said so, as info); the vessel is that signal's \`equipment\`; the feeds of the vessel are
the equipment entries whose \`feeds\` list names it (\`FV-211: { feeds: [K-210] }\`). The trip's outputs are its
\`closes\` and \`stops\` lists, the tags its \`action\` words name, and the outputs of the function it \`starts\`. At
least one feed must be among them.

A vessel for which the register records no feed cannot be judged: the rule then says so (info) when the
register records feeds for other vessels, so that the gap is visible; with no \`feeds\` anywhere it does nothing.`,
    examples: {
      bad: 'equipment:\n  FV-211: { text: Xylene charge valve, feeds: [K-210] }\n  P-211: { text: Transfer pump, feeds: [T-230] }\nsafety-functions:\n  LSHH-210: { trips-when: LI-210 >= 90 percent, stops: [P-211] }',
      good: 'safety-functions:\n  LSHH-210: { trips-when: LI-210 >= 90 percent, closes: [FV-211, FV-212] }',
    },
  },
  (ctx) => {
    const register = ctx.register;
    if (!register) return;
    const feedsOf = new Map<string, string[]>();
    for (const item of register.equipment.values()) for (const v of item.feeds) feedsOf.set(v, [...(feedsOf.get(v) ?? []), item.id]);
    if (!feedsOf.size) return;
    for (const fn of register.safetyFunctions.values()) {
      if (!fn.tripsWhen) continue;
      const parsed = parseCondition(fn.tripsWhen.value);
      if (!parsed.ok) continue;
      const high = highLevelSignals(parsed.condition, register);
      if (!high.ok) {
        const named = [...new Set(comparisonsIn(parsed.condition).map((c) => c.name.name).filter((n) => /^L/.test(n)))];
        if (named.length) {
          ctx.reportInRegister(fn.file, {
            path: fn.tripsWhen.path,
            severity: 'info',
            message: `${fn.id} names the level ${named.join(', ')}, but its condition could not be read as a set of values (${high.reason}), so whether it trips on a high level and stops the feed was not checked.`,
            hint: 'Correct the trip condition (declared signals compared with quantities in their units), or check its outputs by hand.',
          });
        }
        continue;
      }
      const vessels = new Set(high.signals.map((s) => register.signals.get(s)?.equipment).filter((e): e is string => !!e));
      for (const vessel of vessels) {
        const feeds = feedsOf.get(vessel) ?? [];
        if (!feeds.length) {
          ctx.reportInRegister(fn.file, {
            path: fn.tripsWhen.path,
            severity: 'info',
            message: `${fn.id} trips on a high level of ${vessel}, but the register records nothing that feeds ${vessel}, so whether the trip stops the feed was not checked.`,
            hint: `Add 'feeds: [${vessel}]' to the valves and pumps that deliver into ${vessel}.`,
          });
          continue;
        }
        const outputs = outputsOf(fn, register, new Set());
        if (feeds.some((f) => outputs.has(f))) continue;
        const acted = [...outputs].filter((o) => register.equipment.has(o));
        ctx.reportInRegister(fn.file, {
          path: fn.tripsWhen.path,
          message: `${fn.id} trips on a high level of ${vessel} but closes or stops none of what feeds it (${feeds.join(', ')})${acted.length ? `; it acts on ${acted.join(', ')}` : ''}.`,
          hint: `Make the trip close or stop the feeds of ${vessel} (${feeds.join(', ')}), and correct its closes/stops lists or action.`,
        });
      }
    }
  },
);

/**
 * Level signals (ISA-5.1 first letter L) on which the condition trips at high values: read from the values at which
 * it trips (`LI >= 90 percent`, `not (LI < 90 percent)`, either alone or together with another condition), so that
 * the way it is written does not matter. Not ok when the condition cannot be read as values.
 */
function highLevelSignals(condition: Condition, register: PlantRegister): { ok: true; signals: string[] } | { ok: false; reason: string } {
  const signals = Object.fromEntries([...register.signals.values()].map((s) => [s.id, { unit: s.unit, range: s.range, values: s.values }]));
  try {
    const space = new SignalSpace(signals, [condition], { useRanges: false });
    const found = new Set<string>();
    for (const box of space.regionOf(condition)) {
      for (const [name, set] of box) {
        if (/^L/.test(name) && set.kind === 'number' && set.set.some((i) => i.hi === Infinity && i.lo !== -Infinity)) found.add(name);
      }
    }
    return { ok: true, signals: [...found] };
  } catch (error) {
    if (error instanceof NotAnalysable) return { ok: false, reason: error.message };
    throw error;
  }
}

/** What a function closes or stops: its lists, the tags its action words name, and what the function it starts does. */
function outputsOf(fn: RegisterSafetyFunction, register: PlantRegister, seen: Set<string>): Set<string> {
  const out = new Set<string>([...fn.closes, ...fn.stops]);
  for (const [tag] of (fn.action ?? '').matchAll(/[A-Z]{1,5}-\d+[A-Z]?/g)) out.add(tag);
  seen.add(fn.id);
  const started = fn.starts ? register.safetyFunctions.get(fn.starts) : undefined;
  if (started && !seen.has(started.id)) for (const o of outputsOf(started, register, seen)) out.add(o);
  return out;
}

