// Emergency and emergency-shutdown pages lead with what to do: the conditions that require the procedure, who
// is responsible, and the immediate actions (the steps up to the first decision or parallel block), before
// approvals, history and the full chart. The narrative sections used up here are not repeated further down.
import type { Root, RootContent } from 'mdast';
import { renderBodyHtml } from './body-html.ts';
import type { StepRow, TableRow } from './step-table.ts';

export { emergencyKinds } from '../model/kinds.ts';

export interface LeadSection {
  title: string;
  html: string;
}

export interface EmergencyLead {
  /** "Conditions that require …" (or, when there is none, the scope, which says when the procedure applies). */
  conditions?: LeadSection;
  /** "Responsibility": who starts it, who carries it out, who takes command. */
  responsibility?: LeadSection;
  /** The first steps in order, up to the first decision or parallel block (at most `maxActions`). */
  actions: StepRow[];
  /** Steps after the immediate actions, to say how many more follow in the table. */
  remaining: number;
  /** The narrative without the sections shown in the lead. */
  restHtml: string;
}

interface Section {
  title: string;
  nodes: RootContent[];
}

function textOf(node: RootContent): string {
  if ('value' in node && typeof node.value === 'string') return node.value;
  if ('children' in node) return (node.children as RootContent[]).map(textOf).join('');
  return '';
}

/** Splits the body at its level-2 headings; text before the first heading is a section without a title. */
function sectionsOf(body: Root): Section[] {
  const out: Section[] = [{ title: '', nodes: [] }];
  for (const node of body.children) {
    if (node.type === 'heading' && node.depth <= 2) out.push({ title: textOf(node).trim(), nodes: [node] });
    else out[out.length - 1].nodes.push(node);
  }
  return out.filter((s) => s.nodes.length > 0);
}

/** Link definitions and footnotes, wherever they are written (in a list or a quote too), in the order written. */
function definitionsIn(body: Root): RootContent[] {
  const out: RootContent[] = [];
  const visit = (node: Root | RootContent) => {
    if (node.type === 'definition' || node.type === 'footnoteDefinition') out.push(node);
    else if ('children' in node) for (const child of node.children) visit(child);
  };
  visit(body);
  return out;
}

const conditionsHeading = /\b(conditions?|triggers?|when to (start|use)|initiat)/i;
const responsibilityHeading = /\b(responsib|who )/i;
const scopeHeading = /\bscope\b/i;

/** The front-matter form of the same content: `conditions-requiring` and `responsible` (emergency shutdown). */
export interface LeadKeys {
  conditions?: readonly string[];
  responsible?: string;
}

const textNode = (value: string): RootContent => ({ type: 'paragraph', children: [{ type: 'text', value }] });

/** The key's text as body nodes: one condition as a sentence, more as a list. */
function keyNodes(items: readonly string[]): RootContent[] {
  const kept = items.map((i) => i.trim()).filter(Boolean);
  if (kept.length === 0) return [];
  if (kept.length === 1) return [textNode(kept[0])];
  return [{ type: 'list', ordered: false, spread: false, children: kept.map((i) => ({ type: 'listItem', spread: false, children: [textNode(i)] })) } as RootContent];
}

export function emergencyLead(body: Root, rows: TableRow[], maxActions = 6, keys: LeadKeys = {}): EmergencyLead {
  const sections = sectionsOf(body);
  const pick = (pattern: RegExp) => sections.find((s) => s.title && pattern.test(s.title));
  const conditionKey = keyNodes(keys.conditions ?? []);
  const responsibleKey = keyNodes(keys.responsible ? [keys.responsible] : []);
  const conditionSection = pick(conditionsHeading);
  // The scope stands in for the conditions only when neither the body nor the front matter states them.
  const conditions = merged(conditionSection ?? (conditionKey.length ? undefined : pick(scopeHeading)), conditionKey, 'Conditions that require this shutdown');
  const responsibility = merged(pick(responsibilityHeading), responsibleKey, 'Responsibility');
  const used = new Set([conditionSection ?? conditions, pick(responsibilityHeading)].filter(Boolean));
  // Each part is rendered on its own, but a link or footnote in one may be defined in another: every part is given
  // the body's definitions, first (the first of a label is the one used, as on a page of one part).
  const definitions = definitionsIn(body);
  const render = (s: Section | undefined, idPrefix: string): LeadSection | undefined => s && {
    title: s.title,
    // The heading itself becomes the lead block's own heading.
    html: renderBodyHtml({ type: 'root', children: [...definitions, ...s.nodes.filter((n) => n.type !== 'heading' || n !== s.nodes[0])] }, 2, idPrefix),
  };
  const actions: StepRow[] = [];
  let total = 0;
  let open = true;
  for (const row of rows) {
    if (row.kind === 'step') total++;
    if (!open) continue;
    if (row.kind === 'decision' || row.kind === 'parallel-start' || row.kind === 'jump') { open = false; continue; }
    if (row.kind === 'step') {
      if (actions.length < maxActions) actions.push(row);
      else open = false;
    }
  }
  const rest = sections.filter((s) => !used.has(s)).flatMap((s) => s.nodes);
  return {
    conditions: render(conditions, 'lead-conditions-'), responsibility: render(responsibility, 'lead-responsibility-'), actions, remaining: total - actions.length,
    restHtml: renderBodyHtml({ type: 'root', children: [...definitions, ...rest] }),
  };
}

/**
 * A lead part from the body section, the front-matter key, or both (the key's text first, then the section's):
 * the author may use either form, and what is written in one is never dropped for the other.
 */
function merged(section: Section | undefined, keyContent: RootContent[], title: string): Section | undefined {
  if (keyContent.length === 0) return section;
  if (!section) return { title, nodes: [{ type: 'heading', depth: 2, children: [{ type: 'text', value: title }] }, ...keyContent] };
  const [heading, ...rest] = section.nodes;
  return heading?.type === 'heading' ? { title: section.title, nodes: [heading, ...keyContent, ...rest] } : { title: section.title, nodes: [...keyContent, ...section.nodes] };
}
