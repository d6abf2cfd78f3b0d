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
