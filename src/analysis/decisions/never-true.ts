// Conditions that no signal values can make true: a transition that can never fire.
import type { Condition } from '../conditions/ast.ts';
import { NotAnalysable, SignalSpace, type SignalInfo } from './signal-space.ts';

/**
 * True when no values make the condition true, false when some do, null when it cannot be told.
 * Declared ranges are ignored here: a threshold outside its range is a different finding.
 */
export function neverTrue(conditions: Condition[], signals: Readonly<Record<string, SignalInfo>>): boolean | null {
  try {
    const space = new SignalSpace(signals, conditions, { useRanges: false });
    const regions = conditions.map((c) => space.regionOf(c));
    return regions.reduce((a, b) => space.and(a, b)).length === 0;
  } catch (error) {
    if (error instanceof NotAnalysable) return null;
    throw error;
  }
}
