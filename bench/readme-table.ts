// Writes the table of benchmark figures into README.md between two marker comments, from bench/results.json.
import { readFileSync, writeFileSync } from 'node:fs';
import type { Figure } from './results.ts';

export const tableStart = '<!-- bench-table:start (written by npm run bench; do not edit by hand) -->';
export const tableEnd = '<!-- bench-table:end -->';

interface Results {
  date: string;
  quick: boolean;
  machine: { cpus: number; cpu?: string; node: string; loadAverage: number[]; loadAtStart?: number[] };
  figures: Record<string, Figure>;
}

/** The rows the issue's goals name, in reading order: [what, key of the figure, key of its ratio or undefined]. */
const rows: Array<{ what: string; size: string; time: RegExp; ratio?: RegExp }> = [
  { what: 'Full build vs bare Astro build of the same pages', size: '500', time: /^site\/500\/full-build$/, ratio: /^site\/500\/ratio$/ },
  { what: 'Full build vs bare Astro build, CPU time', size: '500', time: /^site\/500\/full-build$/, ratio: /^site\/500\/cpu-ratio$/ },
  { what: 'Full build peak memory vs bare Astro build', size: '500', time: /^site\/500\/full-build-peak-memory$/, ratio: /^site\/500\/peak-memory-ratio$/ },
  { what: 'Full build vs bare Astro build of the same pages', size: '2,000', time: /^site\/2000\/full-build$/, ratio: /^site\/2000\/ratio$/ },
  { what: 'Full build vs bare Astro build, CPU time', size: '2,000', time: /^site\/2000\/full-build$/, ratio: /^site\/2000\/cpu-ratio$/ },
  { what: 'Full build peak memory vs bare Astro build', size: '2,000', time: /^site\/2000\/full-build-peak-memory$/, ratio: /^site\/2000\/peak-memory-ratio$/ },
  { what: 'Rebuild after one changed procedure vs full build', size: '2,000', time: /^site\/2000\/rebuild-one-change$/, ratio: /^site\/2000\/rebuild-ratio$/ },
  { what: 'Rebuild after one changed procedure vs full build', size: '500', time: /^site\/500\/rebuild-one-change$/, ratio: /^site\/500\/rebuild-ratio$/ },
  { what: 'check, cold, whole process', size: '1,001', time: /^check\/\d+\/cold$/ },
  { what: 'check, cold, vs read + front-matter parse with positions', size: '1,001', time: /^check\/\d+\/cold$/, ratio: /^check\/\d+\/cold-ratio$/ },
  { what: 'check, cold, installed package, vs the same floor', size: '1,001', time: /^check\/\d+\/cold-installed$/, ratio: /^check\/\d+\/cold-installed-ratio$/ },
  { what: 'check, cold, CPU time vs the same floor', size: '1,001', time: /^check\/\d+\/cold$/, ratio: /^check\/\d+\/cold-cpu-ratio$/ },
  { what: 'check, warm cache, whole process', size: '1,001', time: /^check\/\d+\/warm$/ },
  { what: 'check, warm cache, vs the same floor', size: '1,001', time: /^check\/\d+\/warm$/, ratio: /^check\/\d+\/warm-ratio$/ },
  { what: 'check after editing one file, the others in the cache, vs the same floor', size: '1,001', time: /^check\/\d+\/one-edit$/, ratio: /^check\/\d+\/one-edit-ratio$/ },
  { what: '`stepwright --version` (installed package); ratio to `node -e 0`', size: '—', time: /^startup\/version$/, ratio: /^startup\/version-floor-ratio$/ },
  { what: '`stepwright check` of the demo manual, cold, first run: no compile cache yet (installed package); ratio to `node -e 0`', size: '13', time: /^startup\/check-demo-first-run$/, ratio: /^startup\/check-demo-first-run-floor-ratio$/ },
  { what: '`stepwright check` of the demo manual, cold: no result cache, compile cache of an earlier run (installed package); ratio to `node -e 0`', size: '13', time: /^startup\/check-demo$/, ratio: /^startup\/check-demo-floor-ratio$/ },
  { what: '`stepwright check` of the demo manual, warm cache (installed package); ratio to `node -e 0`', size: '13', time: /^startup\/check-demo-warm$/, ratio: /^startup\/check-demo-warm-floor-ratio$/ },
  { what: 'Offline copy of the whole manual (files and bytes a tablet holds)', size: '1,000', time: /^offline\/1000\/copy-size$/ },
  { what: 'Tablet update after one changed procedure, share of the offline copy', size: '1,000', time: /^offline\/1000\/update-size$/, ratio: /^offline\/1000\/update-share$/ },
  { what: 'Sequence analysis, 12 parallel branches x 10 steps', size: '1', time: /^soundness\/12-branches$/ },
];

const find = (figures: Record<string, Figure>, pattern: RegExp) => Object.entries(figures).find(([k]) => pattern.test(k));

export function benchTable(results: Results): string {
  const lines = [
    `Measured ${results.date.slice(0, 16).replace('T', ' ')} UTC${results.quick ? ' (quick sizes)' : ''} on ${results.machine.cpus} cores (${results.machine.cpu ?? 'unknown CPU'}), Node ${results.machine.node}, ` +
      `load average ${(results.machine.loadAtStart ?? results.machine.loadAverage).join(' ')} at the start and ${results.machine.loadAverage.join(' ')} at the end. ` +
      'The machine is shared: read the ratios (both sides measured in the same run), not the seconds. A row without figures was not measured. ' +
      'The last column gives when each figure was measured (UTC) and the 1-minute load average when its benchmark started.',
    '',
    '| What | Procedures | Time or size | Ratio | Goal | Met | Measured (load) |',
    '| --- | ---: | ---: | ---: | --- | --- | --- |',
  ];
  for (const row of rows) {
    const time = find(results.figures, row.time);
    const ratio = row.ratio ? find(results.figures, row.ratio) : undefined;
    // The goal is the ratio's when it has one (a ratio of the startup rows only says how the time compares with Node's own start).
    const goalOf = ratio?.[1]?.goal ? ratio[1] : time?.[1];
    const size = time?.[0].match(/^check\/(\d+)\//)?.[1];
    const measured = (ratio?.[1] ?? time?.[1])?.measured;
    const when = measured ? `${measured.at.slice(0, 16).replace('T', ' ')} (${measured.loadAtStart[0]})` : '—';
    lines.push(`| ${row.what} | ${size ? Number(size).toLocaleString('en-GB') : row.size} | ${time ? `${time[1].value} ${time[1].unit}` : '—'} | ${ratio ? `${ratio[1].value}${ratio[1].unit}` : '—'} | ${goalOf?.goal ? `${goalOf.goal}${/\d$/.test(goalOf.goal) ? (goalOf.unit === 'x' ? 'x' : ` ${goalOf.unit}`) : ''}` : '—'} | ${goalOf?.met === undefined ? '—' : goalOf.met ? 'yes' : '**no**'} | ${when} |`);
  }
  return lines.join('\n');
}

/** Replaces the text between the markers (adding them at the end of the speed section when missing). */
export function writeReadmeTable(readmePath: string, results: Results): void {
  const readme = readFileSync(readmePath, 'utf8');
  const block = `${tableStart}\n${benchTable(results)}\n${tableEnd}`;
  const start = readme.indexOf(tableStart);
  const end = readme.indexOf(tableEnd);
  const next = start !== -1 && end > start
    ? readme.slice(0, start) + block + readme.slice(end + tableEnd.length)
    : readme.replace('\n## The procedure format', `\n${block}\n\n## The procedure format`);
  writeFileSync(readmePath, next);
}
