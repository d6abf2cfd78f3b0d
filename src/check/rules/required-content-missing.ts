// Reports safety content a procedure of its kind must hold: operating limits, safety systems, hazards, and for an emergency shutdown its triggers and who acts.
import type { Procedure } from '../../model/procedure.ts';
import { defineFileRule } from '../define-rule.ts';
import { contentSeverity } from '../content-severity.ts';

type Element = 'limits' | 'interlocks' | 'hazards' | 'conditions-requiring' | 'responsible';

const base: Element[] = ['limits', 'interlocks', 'hazards'];
/** What each operating phase must state. Source: OSHA 29 CFR 1910.119(f)(1)(i)–(iv). */
export const requiredByKind: Record<string, Element[]> = {
  normal: base,
  batch: base,
  startup: base,
  'startup-after-turnaround': base,
  shutdown: base,
  'emergency-shutdown': [...base, 'conditions-requiring', 'responsible'],
  emergency: base,
  temporary: base,
};

const described: Record<Element, { what: string; hint: string }> = {
  limits: {
    what: 'operating limits',
    hint: "Add 'limits' with low/high values, the consequence of deviation and the correction for each limited signal.",
  },
  interlocks: {
    what: 'safety systems (interlocks, trips, relief devices) and their functions',
    hint: "Add 'interlocks' with each safety system's tag, its trip condition and what it does.",
  },
  hazards: {
    what: 'hazards of the materials and the operation',
    hint: "Add 'hazards' with level, hazard, consequence and how to avoid it.",
  },
  'conditions-requiring': {
    what: 'the conditions that require an emergency shutdown',
    hint: "Add 'conditions-requiring' (a list), or a body section headed 'Conditions that require emergency shutdown'.",
  },
  responsible: {
    what: 'who is responsible for starting and running the emergency shutdown',
    hint: "Add 'responsible' (e.g. 'Board operator initiates; shift supervisor takes command'), or a body section headed 'Responsibility'.",
  },
};

export default defineFileRule(
  {
    id: 'required-content-missing',
    summary: 'The procedure lacks safety content its kind must state (limits, safety systems, hazards; for emergency shutdown also its triggers and who is responsible).',
    category: 'safety',
    defaultSeverity: 'error',
    source: 'OSHA 29 CFR 1910.119(f)(1)(i)–(iv) (also 40 CFR 68.69): operating limits, safety systems and their functions, safety and health considerations; emergency shutdown with the conditions that require it and the responsible operators',
    docs: `Operating procedures for a covered process must state, for each operating phase, the operating limits,
the safety systems and their functions, and the hazards of the materials. An emergency-shutdown procedure must
also say **which conditions require it** and **who is responsible** for starting it.

- Every kind: \`limits\`, \`interlocks\` and \`hazards\`.
- \`emergency-shutdown\`: also \`conditions-requiring\` and \`responsible\` (front-matter keys, or body sections
  headed *Conditions that require …* and *Responsibility*).

Missing content is a **warning** while the procedure is a \`draft\` and an **error** from \`in-review\` on.`,
    examples: {
      bad: `kind: emergency-shutdown
status: in-review
# no conditions-requiring, no responsible`,
      good: `kind: emergency-shutdown
status: in-review
conditions-requiring:
  - TI-210 at 250 degC or above
  - Loss of agitator M-210 during heat-up
responsible: Board operator initiates; shift supervisor takes command`,
    },
  },
  (ctx) => {
    const p = ctx.procedure;
    if (!p) return;
    const required = requiredByKind[String(p.kind)];
    if (!required) return;
    for (const element of required) {
      if (present(p, element)) continue;
      ctx.report({
        path: ['kind'],
        severity: contentSeverity(String(p.status)),
        message: `A ${p.kind} procedure must state ${described[element].what}; this one does not.`,
        hint: described[element].hint,
      });
    }
  },
);

function present(p: Procedure, element: Element): boolean {
  switch (element) {
    case 'limits': return p.limits.length > 0;
    case 'interlocks': return p.interlocks.length > 0;
    case 'hazards': return p.hazards.length > 0;
    case 'conditions-requiring': return (p.shutdownConditions?.length ?? 0) > 0 || hasHeading(p, /conditions?\b.*\brequir/i);
    case 'responsible': return Boolean(p.responsible?.trim()) || hasHeading(p, /responsib/i);
  }
}

function hasHeading(p: Procedure, pattern: RegExp): boolean {
  return p.body.children.some((node) => node.type === 'heading' && pattern.test(textOf(node)));
}

function textOf(node: unknown): string {
  const n = node as { value?: string; children?: unknown[] };
  return (n.value ?? '') + (n.children ?? []).map(textOf).join('');
}
