// Signal words and their safety colours; the word is always shown with the colour, never the colour alone.
import type { HazardLevel } from '../model/procedure.ts';

/**
 * ANSI Z535.4 / ISO 3864-2 pair each signal word with a safety colour: DANGER red, WARNING orange,
 * CAUTION yellow, NOTICE blue (NOTICE is for property damage, not injury).
 * Hex values approximate the Z535.1 safety colours (from memory) and are darkened where needed so
 * the word on them keeps at least 4.5:1 contrast (WCAG 2.x).
 */
export const signalWordColours: Record<HazardLevel, { word: string; background: string; foreground: string }> = {
  danger: { word: 'DANGER', background: '#c8102e', foreground: '#ffffff' },
  warning: { word: 'WARNING', background: '#ff7900', foreground: '#000000' },
  caution: { word: 'CAUTION', background: '#ffd100', foreground: '#000000' },
  notice: { word: 'NOTICE', background: '#005eb8', foreground: '#ffffff' },
};

/** Most severe first: the order hazards are listed in. */
export const hazardOrder: readonly HazardLevel[] = ['danger', 'warning', 'caution', 'notice'];

export function hazardRank(level: HazardLevel | string): number {
  const i = hazardOrder.indexOf(level as HazardLevel);
  return i === -1 ? hazardOrder.length : i;
}

/** Signal words that carry the safety alert symbol: those for hazards to people. NOTICE never carries it. */
export function carriesAlertSymbol(level: HazardLevel | string): boolean {
  return level === 'danger' || level === 'warning' || level === 'caution';
}

/**
 * The safety alert symbol of ANSI Z535.4 (an equilateral triangle with an exclamation mark), as inline SVG in
 * the signal word's own colours: triangle in the word's colour, exclamation mark in the panel colour.
 * Source: ANSI Z535.4 (safety alert symbol shape), from memory.
 */
export function alertSymbolSvg(level: HazardLevel, size = 16, x?: number, y?: number): string {
  const c = signalWordColours[level];
  const at = x !== undefined && y !== undefined ? ` x="${x}" y="${y}"` : '';
  return `<svg class="alert-symbol"${at} width="${size}" height="${size}" viewBox="0 0 24 24" role="img" aria-label="Safety alert symbol" focusable="false">` +
    `<path d="M12 1.5 23.2 21.5H.8z" fill="${c.foreground}" stroke="${c.background}" stroke-width="1"/>` +
    `<path d="M10.6 8h2.8l-.5 7.6h-1.8z" fill="${c.background}"/><circle cx="12" cy="18.3" r="1.5" fill="${c.background}"/></svg>`;
}
