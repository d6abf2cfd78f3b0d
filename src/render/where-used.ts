// Cross-references for the manual: which procedures and steps use an equipment tag, an interlock or a signal.
import type { Procedure, SequenceItem, Step } from '../model/procedure.ts';
import { namesIn } from '../analysis/conditions/parse.ts';
import type { ProcedureFacts } from '../analysis/procedure-facts.ts';
import type { StepNumbers } from './step-numbers.ts';

export type TagRole = 'equipment' | 'interlock' | 'signal';

export interface TagUse {
  role: TagRole;
  procedureId: string;
  /** What the procedure says about the tag (signal text, interlock action …). */
  detail?: string;
  steps: Array<{ id: string; number: string; action: string }>;
}

/** True when `tag` appears in `text` as a whole token (tags contain hyphens, so word boundaries are not enough). */
export function mentionsTag(text: string, tag: string): boolean {
  if (!tag) return false;
  return tagPattern(tag).test(text);
}

/** Each tag's pattern is made once: a manual asks about the same few hundred tags in every step of every procedure. */
const patterns = new Map<string, RegExp>();

function tagPattern(tag: string): RegExp {
  let pattern = patterns.get(tag);
  if (!pattern) {
    // A long-running live preview meets new tags with every edit: start again rather than grow without end.
    if (patterns.size >= 20_000) patterns.clear();
    const escaped = tag.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
    pattern = new RegExp(`(?<![A-Za-z0-9_-])${escaped}(?![A-Za-z0-9_-])`);
    patterns.set(tag, pattern);
  }
  return pattern;
}

/** Decision conditions belong to the step that waits for them: the step right before the choose block. */
function decisionTexts(items: SequenceItem[], out = new Map<Step, string[]>()): Map<Step, string[]> {
  items.forEach((item, i) => {
    if (item.kind === 'step') return;
    const before = items[i - 1];
    for (const b of item.branches) {
      if (item.kind === 'choose' && before?.kind === 'step' && 'when' in b && b.when) out.set(before, [...(out.get(before) ?? []), b.when.value]);
      if (b.items) decisionTexts(b.items, out);
    }
  });
  return out;
}

function stepText(step: Step, decisions: Map<Step, string[]>): string {
  return [
    ...(decisions.get(step) ?? []),
    ...step.actions, step.note ?? '', step.until?.value ?? '', step.confirm?.value ?? '',
    ...step.set.map((s) => `${s.signal} ${s.quantity}`), ...step.params.map((p) => `${p.name} ${String(p.value)}`),
  ].join('\n');
}

/** Every use of every tag in one procedure. */
export function tagUsesIn(procedure: Procedure, facts: ProcedureFacts, numbers: StepNumbers): Map<string, TagUse[]> {
  const uses = new Map<string, TagUse[]>();
  const add = (tag: string, use: TagUse) => uses.set(tag, [...(uses.get(tag) ?? []), use]);
  const steps = facts.steps.map((s) => s.step);
  const decisions = decisionTexts(procedure.steps);
  const texts = new Map(steps.map((s) => [s, stepText(s, decisions)]));
  const stepsWhere = (test: (step: Step, text: string) => boolean) =>
    steps.filter((s) => test(s, texts.get(s)!)).map((s) => ({ id: s.id, number: numbers.ofStep.get(s.id) ?? '?', action: s.actions.join('; ') }));

  for (const tag of procedure.equipment) add(tag, { role: 'equipment', procedureId: procedure.id, steps: stepsWhere((_, text) => mentionsTag(text, tag)) });

  for (const interlock of procedure.interlocks) {
    // An interlock matters at the steps that name it and at those that drive or check the signals it trips on.
    const site = facts.conditions.find((c) => c.role === 'trips-when' && c.owner === interlock.tag);
    const watched = site?.result.ok ? namesIn(site.result.condition).map((n) => n.name) : [];
    add(interlock.tag, {
      role: 'interlock', procedureId: procedure.id, detail: `Trips when ${interlock.tripsWhen.value}: ${interlock.action}`,
      steps: stepsWhere((step, text) => mentionsTag(text, interlock.tag) || step.set.some((s) => watched.includes(s.signal)) || watched.some((w) => w !== 'elapsed' && w !== 'done' && mentionsTag(text, w))),
    });
  }

  for (const signal of Object.values(procedure.signals)) {
    add(signal.name, {
      role: 'signal', procedureId: procedure.id, detail: signal.unit ? `${signal.text} (${signal.unit})` : signal.text,
      steps: stepsWhere((_, text) => mentionsTag(text, signal.name)),
    });
  }
  return uses;
}
