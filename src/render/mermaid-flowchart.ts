// Procedure → mermaid flowchart text (for pull-request comments and exports), with optional marks on changed steps.
import type { Procedure } from '../model/procedure.ts';
import { compileStepGraph, type GuardPart, type Transition } from '../analysis/step-graph.ts';

export type StepMark = 'added' | 'changed' | 'moved';

export interface MermaidOptions {
  /** Step id → mark; marked steps get a class and a word in their label, so the mark survives without colour. */
  marks?: ReadonlyMap<string, StepMark>;
  direction?: 'TD' | 'LR';
  /** Longest action text in a box before it is shortened. */
  maxLabel?: number;
}

const markStyle: Record<StepMark, string> = {
  added: 'fill:#e3f4e6,stroke:#1f7a34,stroke-width:3px',
  changed: 'fill:#fff4d6,stroke:#9a6700,stroke-width:3px',
  moved: 'fill:#e6eefb,stroke:#2852a3,stroke-width:3px,stroke-dasharray:6 3',
};

export function mermaidFlowchart(procedure: Pick<Procedure, 'steps'>, options: MermaidOptions = {}): string {
  const graph = compileStepGraph(procedure);
  const maxLabel = options.maxLabel ?? 60;
  const lines = [`flowchart ${options.direction ?? 'TD'}`];
  const nodeOf = new Map<string, string>();
  const marked = new Map<StepMark, string[]>();

  // Steps, start and end become boxes; the virtual places around parallel branches fold into the fork and join bars.
  graph.places.forEach((place, i) => {
    if (place.kind === 'start') {
      nodeOf.set(place.id, 'start');
      lines.push('  start(["start"])');
    } else if (place.kind === 'end') {
      nodeOf.set(place.id, 'finish');
      lines.push('  finish(["end"])');
    } else if (place.kind === 'step' && place.step) {
      const id = `s${i}`;
      nodeOf.set(place.id, id);
      const mark = options.marks?.get(place.step.id);
      const action = shorten(place.step.actions.join('; '), maxLabel);
      const tag = mark ? ` [${mark}]` : '';
      lines.push(`  ${id}["${escapeLabel(`${place.step.id}${tag}`)}<br/>${escapeLabel(action)}"]`);
      if (mark) marked.set(mark, [...(marked.get(mark) ?? []), id]);
    }
  });

  const bars = new Map<Transition, string>();
  for (const t of graph.transitions) {
    if (t.from.length > 1 || t.to.length > 1) {
      const bar = `t${t.id.slice(1)}`;
      bars.set(t, bar);
      lines.push(`  ${bar}@{ shape: fork, label: " " }`);
      for (const p of t.from) if (!nodeOf.has(p)) nodeOf.set(p, bar);
      for (const p of t.to) if (!nodeOf.has(p)) nodeOf.set(p, bar);
    }
  }

  for (const t of graph.transitions) {
    const label = guardLabel(t.guard);
    const arrow = (text: string | undefined) => {
      const body = text ? `|"${escapeLabel(shorten(text, maxLabel))}"|` : '';
      return t.jump ? `-.->${body}` : `-->${body}`;
    };
    const bar = bars.get(t);
    const from = unique(t.from.map((p) => nodeOf.get(p)).filter((n): n is string => n !== undefined));
    const to = unique(t.to.map((p) => nodeOf.get(p)).filter((n): n is string => n !== undefined));
    if (!bar) {
      if (from[0] && to[0]) lines.push(`  ${from[0]} ${arrow(label)} ${to[0]}`);
      continue;
    }
    for (const f of from) if (f !== bar) lines.push(`  ${f} ${arrow(t.from.length === 1 ? label : undefined)} ${bar}`);
    for (const d of to) if (d !== bar) lines.push(`  ${bar} ${arrow(t.from.length > 1 ? label : undefined)} ${d}`);
  }

  for (const [mark, ids] of marked) {
    lines.push(`  classDef ${mark} ${markStyle[mark]}`);
    lines.push(`  class ${ids.join(',')} ${mark}`);
  }
  return `${lines.join('\n')}\n`;
}

function guardLabel(guard: GuardPart[]): string | undefined {
  const parts = guard.map((g) => (g.kind === 'confirm' ? `confirmed: ${g.text}` : g.text));
  return parts.length ? parts.join(' and ') : undefined;
}

/** Mermaid reads quotes, angle brackets, # and & inside labels; entity codes keep the text as written. */
export function escapeLabel(text: string): string {
  return text
    .replace(/#/g, '#35;')
    .replace(/&/g, '#38;')
    .replace(/"/g, '#quot;')
    .replace(/</g, '#60;')
    .replace(/>/g, '#62;')
    .replace(/[|`]/g, (c) => `#${c.charCodeAt(0)};`)
    .replace(/\s+/g, ' ');
}

function shorten(text: string, max: number): string {
  return text.length <= max ? text : `${text.slice(0, max - 1).trimEnd()}…`;
}

function unique<T>(list: T[]): T[] {
  return [...new Set(list)];
}
