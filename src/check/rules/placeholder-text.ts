// Reports TODO placeholders (as `stepwright new` writes them) left in the front-matter or the body.
import type { PathKey } from '../../parse/read-source.ts';
import { isPlaceholder, placeholderMarker } from '../../model/placeholder.ts';
import { defineFileRule, type FileContext, type Report } from '../define-rule.ts';

export default defineFileRule(
  {
    id: 'placeholder-text',
    summary: `A placeholder (${placeholderMarker}) is still waiting to be filled in.`,
    category: 'writing',
    defaultSeverity: 'warning',
    docs: `\`stepwright new\` writes a procedure with every section its kind needs and marks each thing the author
must supply with the word ${placeholderMarker}: text such as \`"${placeholderMarker}: the hazard"\` and placeholder tags
such as \`${placeholderMarker}-TI\`. This rule lists every one left, in the front-matter (keys and values) and in the
narrative body, so that a new procedure is filled in completely before review. Replace the placeholder with
the real content; replace a placeholder tag everywhere it is used.`,
    examples: {
      bad: 'hazard: "TODO: the hazard"',
      good: 'hazard: Hot oil in the jacket at up to 280 degC',
    },
  },
  (ctx) => {
    if (ctx.source.data !== null && typeof ctx.source.data === 'object') visitData(ctx, ctx.source.data, []);
    visitBody(ctx, ctx.source.body);
  },
);

/** Walks the data with one path that grows and shrinks as it goes; a report takes a copy of it. */
function visitData(ctx: FileContext, value: unknown, path: PathKey[]): void {
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      path.push(i);
      visitData(ctx, value[i], path);
      path.pop();
    }
    return;
  }
  if (value !== null && typeof value === 'object') {
    for (const [key, item] of Object.entries(value)) {
      path.push(key);
      if (isPlaceholder(key)) report(ctx, key, { path: [...path], part: 'key' });
      visitData(ctx, item, path);
      path.pop();
    }
    return;
  }
  if (typeof value === 'string' && isPlaceholder(value)) report(ctx, value, { path: [...path] });
}

interface BodyNode {
  type: string;
  value?: string;
  position?: { start: { line: number; column: number }; end: { line: number; column: number } };
  children?: BodyNode[];
}

function visitBody(ctx: FileContext, node: BodyNode): void {
  if ((node.type === 'text' || node.type === 'inlineCode') && node.value && isPlaceholder(node.value) && node.position) {
    const { start, end } = node.position;
    report(ctx, node.value, { range: { line: start.line, column: start.column, endLine: end.line, endColumn: end.column } });
    return;
  }
  for (const child of node.children ?? []) visitBody(ctx, child);
}

function report(ctx: FileContext, text: string, where: Omit<Report, 'message' | 'hint'>): void {
  const shown = text.length > 60 ? `${text.slice(0, 57)}...` : text;
  ctx.report({
    ...where,
    message: `Placeholder '${shown}' is not filled in yet.`,
    hint: `Replace it with the real content; ${placeholderMarker} marks what 'stepwright new' left for you to write.`,
  });
}
