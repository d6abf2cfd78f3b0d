// Lets each benchmark hand its figures to the runner (bench/run-all.ts), which writes them to bench/results.json.
import { appendFileSync } from 'node:fs';
import { basename } from 'node:path';

export interface Figure {
  value: number;
  unit: string;
  /** The goal in words, e.g. "< 2000 ms". */
  goal?: string;
  met?: boolean;
  note?: string;
  /** The script that measured it (file name without .ts), added by record(). */
  script?: string;
  /** When, and at what load average (1, 5, 15 min), the script ran; added by the runner. */
  measured?: { at: string; loadAtStart: number[]; loadAtEnd: number[] };
}

const sink = process.env.STEPWRIGHT_BENCH_RESULTS;
const script = basename(process.argv[1] ?? 'bench').replace(/\.ts$/, '');

/** Records one figure under a stable key; without the runner it does nothing (the script still prints). */
export function record(key: string, figure: Figure): void {
  if (sink) appendFileSync(sink, `${JSON.stringify({ key, script, ...figure })}\n`);
}

/** True when the runner asked for the smaller sizes. */
export const quick = process.env.STEPWRIGHT_BENCH_QUICK === '1' || process.argv.includes('--quick');

// Every benchmark process reports its own peak memory when it ends.
process.on('exit', () => {
  record(`peak-memory/${script}`, { value: Math.round(process.resourceUsage().maxRSS / 1024), unit: 'MB', note: 'peak resident memory of the benchmark process' });
});
