// Draws the laid-out sequence chart as a self-contained SVG string (no script, no external styles).
import type { HazardLevel, Procedure } from '../model/procedure.ts';
import { chartFont, layoutChart, type ChartLayout, type Shape } from './chart-layout.ts';
import { alertSymbolSvg, signalWordColours } from './signal-words.ts';
import type { StepNumbers } from './step-numbers.ts';

const fontFamily = "Arial, 'Liberation Sans', Helvetica, sans-serif";
const ink = '#1b1f24';

export function escapeXml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

export interface ChartSvgOptions {
  /** Accessible name of the whole chart. */
  title: string;
  /** Builds the link target of a step; defaults to the step table row `#step-<id>`. */
  hrefOf?: (stepId: string) => string;
  /** An id for the group of all its shapes, for other drawings on the page to show by reference (print parts). */
  shapesId?: string;
}

export function renderChartSvg(procedure: Pick<Procedure, 'steps' | 'hazards'>, options: ChartSvgOptions, numbers?: StepNumbers): string {
  return chartLayoutToSvg(layoutChart(procedure, numbers), options);
}

export function chartLayoutToSvg(layout: ChartLayout, options: ChartSvgOptions): string {
  const hrefOf = options.hrefOf ?? ((id: string) => `#step-${id}`);
  const parts: string[] = [];
  parts.push(chartSvgOpening(layout.width, 0, layout.height, options.title));
  if (options.shapesId !== undefined) parts.push(`<g id="${escapeXml(options.shapesId)}">`);
  // Lines first, so boxes and labels paint over line ends.
  for (const s of layout.shapes) if (s.type === 'line' || s.type === 'double' || s.type === 'single') parts.push(drawLine(s));
  for (const s of layout.shapes) if (s.type !== 'line' && s.type !== 'double' && s.type !== 'single') parts.push(drawShape(s, hrefOf));
  if (options.shapesId !== undefined) parts.push('</g>');
  parts.push('</svg>');
  return parts.join('');
}

/** The opening tag of a chart drawing that shows chart heights [y0, y0 + height), with the chart's font and ink. */
export function chartSvgOpening(width: number, y0: number, height: number, title: string): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" class="sfc-chart" viewBox="0 ${y0} ${width} ${height}" width="${width}" height="${height}" role="group" aria-label="${escapeXml(title)}" font-family="${escapeXml(fontFamily)}" font-size="${chartFont.size}" fill="${ink}">`;
}

function drawLine(s: Extract<Shape, { type: 'line' | 'double' | 'single' }>): string {
  if (s.type === 'line') return `<line class="sfc-link" x1="${s.x1}" y1="${s.y1}" x2="${s.x2}" y2="${s.y2}" stroke="${ink}" stroke-width="1.5"/>`;
  if (s.type === 'single') return `<line class="sfc-divergence" x1="${s.x1}" y1="${s.y}" x2="${s.x2}" y2="${s.y}" stroke="${ink}" stroke-width="1.5"/>`;
  return `<g class="sfc-parallel"><line x1="${s.x1}" y1="${s.y}" x2="${s.x2}" y2="${s.y}" stroke="${ink}" stroke-width="1.5"/><line x1="${s.x1}" y1="${s.y + 4}" x2="${s.x2}" y2="${s.y + 4}" stroke="${ink}" stroke-width="1.5"/></g>`;
}

function drawShape(s: Exclude<Shape, { type: 'line' | 'double' | 'single' }>, hrefOf: (id: string) => string): string {
  switch (s.type) {
    case 'step':
      return drawStep(s, hrefOf);
    case 'bar': {
      const text = s.label
        .map((l, i) => `<text x="${s.labelRect.x}" y="${s.labelRect.y + (i + 1) * chartFont.line - 5}">${escapeXml(l)}</text>`)
        .join('');
      return `<g class="sfc-transition"${s.from ? ` data-from="${escapeXml(s.from)}"` : ''}><line class="sfc-bar" x1="${s.x - 16}" y1="${s.y}" x2="${s.x + 16}" y2="${s.y}" stroke="${ink}" stroke-width="4"/>${text}</g>`;
    }
    case 'jump':
      // The arrowhead is a shape of its own, not a marker: a drawing that shows these shapes by reference (a print
      // part) draws it too, and it points down the link.
      return `<g class="sfc-jump" data-target="${escapeXml(s.target)}"><line x1="${s.x}" y1="${s.y - 8}" x2="${s.x}" y2="${s.y - 4}" stroke="${ink}" stroke-width="1.5"/><path class="sfc-arrowhead" d="M${s.x - 5},${s.y - 5} L${s.x + 5},${s.y - 5} L${s.x},${s.y + 2} z" fill="${ink}"/><a href="${escapeXml(hrefOf(s.target))}">${jumpHitArea(s.labelRect)}<text x="${s.labelRect.x}" y="${s.labelRect.y + chartFont.line - 5}" font-weight="bold" text-decoration="underline">${escapeXml(s.label)}</text></a></g>`;
    case 'branch-label':
      return `<text class="sfc-branch" x="${s.rect.x}" y="${s.rect.y + chartFont.small}" font-size="${chartFont.small}" font-style="italic">${escapeXml(s.text)}</text>`;
    case 'end':
      return `<g class="sfc-end"><rect x="${s.rect.x}" y="${s.rect.y}" width="${s.rect.w}" height="${s.rect.h}" rx="15" fill="#fff" stroke="${ink}" stroke-width="1.5"/><text x="${s.rect.x + s.rect.w / 2}" y="${s.rect.y + 20}" text-anchor="middle" font-weight="bold">END</text></g>`;
  }
}

/** An invisible touch area around a jump label: 52 units tall so it stays at least 44 CSS px (WCAG 2.5.5) when the chart is scaled down to a portrait tablet. */
function jumpHitArea(r: { x: number; y: number; w: number; h: number }): string {
  const h = 52;
  const w = Math.max(r.w + 12, h);
  return `<rect class="sfc-hit" x="${r.x - 6}" y="${r.y + r.h / 2 - h / 2}" width="${w}" height="${h}" fill="transparent"/>`;
}

function drawStep(s: Extract<Shape, { type: 'step' }>, hrefOf: (id: string) => string): string {
  const { x, y, w, h } = s.rect;
  const out: string[] = [];
  // The link's name is its visible text (number, id, action, markers), so speech and sight agree.
  out.push(`<a class="sfc-step" href="${escapeXml(hrefOf(s.id))}" data-step="${escapeXml(s.id)}">`);
  out.push(`<rect x="${x}" y="${y}" width="${w}" height="${h}" fill="#fff" stroke="${ink}" stroke-width="1.5"/>`);
  // IEC 61131-3 marks the initial step with a double frame.
  if (s.initial) out.push(`<rect x="${x + 3}" y="${y + 3}" width="${w - 6}" height="${h - 6}" fill="none" stroke="${ink}" stroke-width="1"/>`);
  if (s.hazard) out.push(`<rect x="${x}" y="${y}" width="6" height="${h}" fill="${signalWordColours[s.hazard as HazardLevel].background}"/>`);
  let line = y + 8 + chartFont.line - 4;
  out.push(`<text x="${x + 10}" y="${line}" font-weight="bold">${escapeXml(s.header)}</text>`);
  for (const l of s.lines) {
    line += chartFont.line;
    out.push(`<text x="${x + 10}" y="${line}">${escapeXml(l)}</text>`);
  }
  for (const m of s.markers) {
    line += chartFont.small + 4;
    if (m.startsWith('⚠ ') && s.hazard) {
      // The safety alert symbol drawn as a shape (a font may lack the character), then the signal word.
      out.push(`<g class="sfc-alert" data-level="${escapeXml(s.hazard)}">${alertSymbolSvg(s.hazard as HazardLevel, chartFont.small + 2, x + 10, line - chartFont.small)}</g>`);
      out.push(`<text x="${x + 10 + chartFont.small + 5}" y="${line}" font-size="${chartFont.small}" font-weight="bold">${escapeXml(m.slice(2))}</text>`);
      continue;
    }
    out.push(`<text x="${x + 10}" y="${line}" font-size="${chartFont.small}" font-weight="bold">${escapeXml(m)}</text>`);
  }
  out.push('</a>');
  return out.join('');
}
