// The sequence chart for paper: a chart taller than a page is cut at transitions (never through a step box or a
// label) into parts that each fit one printed page, each part saying where it continues.
import type { Procedure } from '../model/procedure.ts';
import { layoutChart, type ChartLayout, type Rect, type Shape } from './chart-layout.ts';
import { chartLayoutToSvg, chartSvgOpening, escapeXml } from './chart-svg.ts';
import type { StepNumbers } from './step-numbers.ts';

export interface PrintPageBox {
  /** Printable width in CSS px (A4 and Letter with 12 mm side margins: about 700). */
  width: number;
  /** Height one part may take on a page in CSS px, after the part's own "continued" lines. */
  height: number;
}

/** Fits A4 (186 × 263 mm printable) and US Letter (192 × 245 mm) with the print sheet's margins. */
export const defaultPrintBox: PrintPageBox = { width: 700, height: 820 };

export interface ChartPart {
  /** Chart coordinates [y0, y1) this part shows. */
  y0: number;
  y1: number;
  svg: string;
}

function shapeBoxes(s: Shape): Rect[] {
  switch (s.type) {
    case 'step': case 'end': return [s.rect];
    case 'bar': return [s.labelRect, { x: s.x - 16, y: s.y - 3, w: 32, h: 6 }];
    case 'jump': return [s.labelRect, { x: s.x - 2, y: s.y - 10, w: 4, h: 14 }];
    case 'branch-label': return [s.rect];
    default: return [];
  }
}

/** Heights where the chart may be cut: just above each transition bar's label, clear of every box and label. */
export function cutCandidates(layout: ChartLayout): number[] {
  const boxes = layout.shapes.flatMap(shapeBoxes);
  const clear = (y: number) => boxes.every((b) => y <= b.y - 1 || y >= b.y + b.h + 1);
  const ys = new Set<number>();
  for (const s of layout.shapes) {
    if (s.type !== 'step') continue;
    // The gap right below a step box: the link to its transition, before the bar and its label.
    const below = s.rect.y + s.rect.h + 4;
    if (clear(below)) ys.add(below);
  }
  return [...ys].filter((y) => y > 0 && y < layout.height).sort((a, b) => a - b);
}

/** Cut points (chart units) so that every part, scaled to the page width, fits the page height. */
export function planParts(layout: ChartLayout, box: PrintPageBox = defaultPrintBox): Array<[number, number]> {
  const scale = Math.min(1, box.width / layout.width);
  const budget = box.height / scale;
  if (layout.height <= budget) return [[0, layout.height]];
  const cuts = cutCandidates(layout);
  const parts: Array<[number, number]> = [];
  let start = 0;
  while (layout.height - start > budget) {
    const fits = cuts.filter((y) => y > start + 40 && y <= start + budget);
    // No clean cut within a page (one step taller than a page): cut at the page height rather than overflow it.
    const end = fits.length ? fits[fits.length - 1] : start + budget;
    parts.push([start, end]);
    start = end;
  }
  parts.push([start, layout.height]);
  return parts;
}

export function renderChartPrintParts(procedure: Pick<Procedure, 'steps' | 'hazards'>, title: string, numbers?: StepNumbers, box: PrintPageBox = defaultPrintBox): ChartPart[] {
  return chartLayoutPrintParts(layoutChart(procedure, numbers), title, box);
}

/**
 * The print parts of a chart already laid out (the page's screen chart uses the same layout). With `shapesId`, the id
 * of the screen chart's group of shapes on the same page (chartLayoutToSvg), each part shows that group through its
 * own window instead of holding a copy of the shapes: the page carries the chart's drawing once, not twice.
 */
export function chartLayoutPrintParts(layout: ChartLayout, title: string, box: PrintPageBox = defaultPrintBox, shapesId?: string): ChartPart[] {
  const plan = planParts(layout, box);
  if (plan.length < 2) return [];
  if (shapesId !== undefined) {
    return plan.map(([y0, y1], i) => ({
      y0, y1, svg: `${chartSvgOpening(layout.width, y0, y1 - y0, `${title}, part ${i + 1} of ${plan.length}`)}<use href="#${escapeXml(shapesId)}"/></svg>`,
    }));
  }
  return plan.map(([y0, y1], i) => {
    const shapes = layout.shapes.filter((s) => intersects(s, y0, y1));
    const svg = chartLayoutToSvg({ width: layout.width, height: layout.height, shapes }, { title: `${title}, part ${i + 1} of ${plan.length}` })
      .replace(`viewBox="0 0 ${layout.width} ${layout.height}"`, `viewBox="0 ${y0} ${layout.width} ${y1 - y0}"`)
      .replace(`height="${layout.height}"`, `height="${y1 - y0}"`);
    return { y0, y1, svg };
  });
}

function intersects(s: Shape, y0: number, y1: number): boolean {
  switch (s.type) {
    case 'line': return Math.max(s.y1, s.y2) >= y0 && Math.min(s.y1, s.y2) <= y1;
    case 'double': case 'single': return s.y >= y0 - 6 && s.y <= y1 + 6;
    default: return shapeBoxes(s).some((b) => b.y + b.h >= y0 && b.y <= y1);
  }
}
