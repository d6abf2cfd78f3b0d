// The state analysis takes a signal a step moves to stop exactly where its `until` becomes true (a sliver a
// millionth wide at the threshold). On a plant the step ends with a reading near that value: a vent stopped at
// "PI-210 <= 110 kPa" leaves 109.6 kPa as often as 110. A comparison that would call a condition impossible
// because of that exactness (a next procedure's line-up of PI-210 <= 109.9 kPa) widens each such point first.
import { intersect, normalize, type IntervalSet } from '../decisions/interval-set.ts';
import { sliverWidth, type Box, type Region, type SignalSpace } from '../decisions/signal-space.ts';

/**
 * How far around a threshold a reading may lie: 1 % of the signal's declared range (of the value where it has no
 * range). Common practice: process transmitters and the operator reading them are good to about 1 % of span.
 */
export const readingMargin = 0.01;

/** The region with every point value of a numeric signal widened to the readings near it, inside its domain. */
export function nearReadings(space: SignalSpace, region: Region): Region {
  return region.map((box) => {
    const out: Box = new Map(box);
    for (const [name, values] of box) {
      if (values.kind !== 'number') continue;
      const variable = space.variables.get(name);
      if (variable?.kind !== 'number') continue;
      const lo = variable.domain[0]?.lo ?? -Infinity;
      const hi = variable.domain.at(-1)?.hi ?? Infinity;
      const span = Number.isFinite(lo) && Number.isFinite(hi) && hi > lo ? hi - lo : undefined;
      const widened: IntervalSet = values.set.map((i) => {
        if (!Number.isFinite(i.lo) || !Number.isFinite(i.hi) || i.hi - i.lo > sliverWidth * Math.max(1, Math.abs(i.hi))) return i;
        const margin = readingMargin * (span ?? Math.max(1, Math.abs(i.hi)));
        return { lo: i.lo - margin, hi: i.hi + margin, loOpen: false, hiOpen: false };
      });
      out.set(name, { kind: 'number', set: intersect(normalize(widened), variable.domain) });
    }
    return out;
  });
}
