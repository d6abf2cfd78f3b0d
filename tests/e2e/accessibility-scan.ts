// One axe-core scan of a page, shared by the browser tests. Our pages have no frames, so axe runs in the page
// itself (one injection, one run); the library's default first collects results frame by frame and then opens a
// second, blank page to merge them, which here took two to three times as long for the same findings (5.9 s
// against 2.2 s on a procedure page). A page that does hold frames gets the default, which scans inside them.
// Only violations are worked up in full (axe-core's resultTypes): the passes and the undecided results, which the
// tests never read, each got a unique selector for every node; 3.0 s against 1.4 s on a procedure page.
import { AxeBuilder } from '@axe-core/playwright';
import type { Page } from 'playwright-core';

/** "id (impact): first targets" for every serious or critical violation on the page. */
export async function seriousViolations(page: Page): Promise<string[]> {
  const builder = new AxeBuilder({ page });
  if (page.frames().length === 1) builder.setLegacyMode(true);
  builder.options({ resultTypes: ['violations'] });
  const result = await builder.analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(', ')}`);
}
