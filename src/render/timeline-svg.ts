// Draws the typical run of a procedure as a timeline (one row per step, bars in time) in a self-contained SVG.
import { formatSeconds, type CycleTime, type TimelineBar } from '../analysis/cycle-time.ts';
import { escapeXml } from './chart-svg.ts';
import { textWidth } from './text-metrics.ts';

export interface TimelineSvgOptions {
  /** Accessible name of the chart. */
  title: string;
  /** Link target of a step's row; defaults to the step table row `#step-<id>`. */
  hrefOf?: (stepId: string) => string;
  width?: number;
}

const fontSize = 13;
const rowHeight = 26;
const axisHeight = 30;
const legendHeight = 26;
const labelWidth = 230;
const ink = '#1b1f24';
const criticalFill = '#24507a';
const otherFill = '#ffffff';
const rangeInk = '#5b6570';

/** Tick spacings in minutes; the first that gives at most eight ticks is used. */
const tickSteps = [1, 2, 5, 10, 15, 30, 60, 120, 240, 480, 960, 1440];

export function renderTimelineSvg(cycle: CycleTime, options: TimelineSvgOptions): string {
  const width = options.width ?? 760;
  const hrefOf = options.hrefOf ?? ((id: string) => `#step-${id}`);
  const bars = cycle.timeline;
  const plotLeft = labelWidth + 10;
  const plotWidth = width - plotLeft - 16;
  const finiteEnds = bars.map((b) => b.start + (Number.isFinite(b.longest) ? b.longest : b.typical));
  // Only finite times set the scale; an unbounded loop runs to the edge.
  const span = Math.max(60, ...[cycle.typical, ...finiteEnds].filter(Number.isFinite));
  const x = (seconds: number) => plotLeft + (Math.min(seconds, span) / span) * plotWidth;
  const height = axisHeight + bars.length * rowHeight + legendHeight + 8;

  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" class="timeline-chart" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" role="group" aria-label="${escapeXml(options.title)}" font-family="Arial, 'Liberation Sans', Helvetica, sans-serif" font-size="${fontSize}" fill="${ink}">`,
    `<title>${escapeXml(options.title)}</title>`,
    `<defs><pattern id="timeline-hatch" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)"><line x1="0" y1="0" x2="0" y2="6" stroke="${criticalFill}" stroke-width="2"/></pattern></defs>`,
  ];

  // Axis: ticks every few minutes, labelled, with faint grid lines down the rows.
  const stepMinutes = tickSpacing(span);
  const gridBottom = axisHeight + bars.length * rowHeight;
  for (let t = 0; t <= span + 1e-9; t += stepMinutes * 60) {
    const tx = round(x(t));
    parts.push(`<line x1="${tx}" y1="${axisHeight - 6}" x2="${tx}" y2="${gridBottom}" stroke="#d5dbe1" stroke-width="1"/>`);
    parts.push(`<text x="${tx}" y="${axisHeight - 10}" text-anchor="middle" font-size="11">${escapeXml(formatSeconds(t))}</text>`);
  }

  bars.forEach((bar, row) => {
    const top = axisHeight + row * rowHeight;
    const mid = top + rowHeight / 2;
    const indent = bar.lane.length * 12;
    const label = fitLabel(`${bar.lane.length ? `${bar.lane.at(-1)}: ` : ''}${bar.kind === 'loop' ? bar.label : `${bar.id} — ${bar.label}`}`, labelWidth - indent);
    const weight = bar.critical ? ' font-weight="bold"' : '';
    const text = `<text x="${indent}" y="${mid + 4}"${weight}>${escapeXml(label)}</text>`;
    parts.push(bar.kind === 'step' ? `<a href="${escapeXml(hrefOf(bar.id))}">${text}</a>` : text);
    parts.push(drawBar(bar, top, x));
  });

  // Legend in words, so nothing depends on colour alone.
  const ly = gridBottom + 18;
  parts.push(`<rect x="0" y="${ly - 10}" width="14" height="10" fill="${criticalFill}" stroke="${ink}"/>`);
  parts.push(`<text x="20" y="${ly}" font-size="11">critical path (bold label)</text>`);
  parts.push(`<rect x="180" y="${ly - 10}" width="14" height="10" fill="${otherFill}" stroke="${ink}"/>`);
  parts.push(`<text x="200" y="${ly}" font-size="11">runs alongside</text>`);
  parts.push(`<rect x="300" y="${ly - 10}" width="14" height="10" fill="url(#timeline-hatch)" stroke="${ink}" stroke-dasharray="3 2"/>`);
  parts.push(`<text x="320" y="${ly}" font-size="11">expected repeats</text>`);
  parts.push(`<line x1="440" y1="${ly - 5}" x2="470" y2="${ly - 5}" stroke="${rangeInk}" stroke-width="2"/>`);
  parts.push(`<text x="476" y="${ly}" font-size="11">shortest to longest</text>`);
  parts.push('</svg>');
  return parts.join('');
}

function drawBar(bar: TimelineBar, top: number, x: (s: number) => number): string {
  const out: string[] = [];
  const y = top + 6;
  const h = rowHeight - 12;
  const x0 = round(x(bar.start));
  const w = Math.max(2, round(x(bar.start + bar.typical) - x(bar.start)));
  const times = bar.kind === 'loop'
    ? `${bar.label}: typical ${formatSeconds(bar.typical)}, at most ${formatSeconds(bar.longest)}`
    : `${bar.id}: starts at ${formatSeconds(bar.start)}, typical ${formatSeconds(bar.typical)} (${formatSeconds(bar.shortest)} to ${formatSeconds(bar.longest)})`;
  // Range whisker from shortest to longest end; a loop without bound runs to the edge with an arrow head.
  if (bar.longest !== bar.shortest) {
    const r0 = round(x(bar.start + bar.shortest));
    const r1 = round(x(bar.start + bar.longest));
    out.push(`<line x1="${r0}" y1="${top + rowHeight / 2}" x2="${r1}" y2="${top + rowHeight / 2}" stroke="${rangeInk}" stroke-width="2"/>`);
    if (!Number.isFinite(bar.longest)) out.push(`<path d="M${r1 - 6},${top + rowHeight / 2 - 4} L${r1},${top + rowHeight / 2} L${r1 - 6},${top + rowHeight / 2 + 4}" fill="none" stroke="${rangeInk}" stroke-width="2"/>`);
  }
  const fill = bar.kind === 'loop' ? 'url(#timeline-hatch)' : bar.critical ? criticalFill : otherFill;
  const dash = bar.kind === 'loop' ? ' stroke-dasharray="3 2"' : '';
  out.push(`<rect x="${x0}" y="${y}" width="${w}" height="${h}" fill="${fill}" stroke="${ink}"${dash}><title>${escapeXml(times)}</title></rect>`);
  return out.join('');
}

/** Minutes between ticks: the first listed spacing that gives at most eight ticks, or a whole number of days that does (never more than nine ticks, however long the run). */
export function tickSpacing(spanSeconds: number): number {
  const listed = tickSteps.find((m) => spanSeconds / (m * 60) <= 8);
  if (listed !== undefined) return listed;
  const days = Math.ceil(spanSeconds / (8 * 86400));
  return Number.isFinite(days) ? days * 1440 : Number.MAX_VALUE;
}

function fitLabel(text: string, width: number): string {
  if (textWidth(text, fontSize) <= width) return text;
  let cut = text;
  while (cut.length > 1 && textWidth(`${cut}…`, fontSize) > width) cut = cut.slice(0, -1);
  return `${cut.trimEnd()}…`;
}

function round(n: number): number {
  return Math.round(n * 10) / 10;
}
