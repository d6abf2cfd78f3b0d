// Prints how long the sequence analysis and the whole check take: wide and deep parallel blocks, and a
// thousand generated procedures against the time to only parse their YAML. Figures, not assertions.
import { parseDocument } from 'yaml';
import { checkSources } from '../src/check/run-checks.ts';
import { readProcedure } from '../src/read/read-procedure.ts';
import { structuralSoundness } from '../src/analysis/soundness/structural.ts';
import { exploreSoundness } from '../src/analysis/soundness/explicit.ts';
import { analyseDecisions } from '../src/analysis/decisions/analyse-decisions.ts';
import { generateProcedures, nestedProcedure, wideParallelProcedure, type GeneratedProcedure } from './generate-procedures.ts';
import { quick, record } from './results.ts';

const today = '2026-12-05';

/** Median wall time of `runs` calls, in milliseconds. */
function time(run: () => void, runs = 7): number {
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const started = performance.now();
    run();
    times.push(performance.now() - started);
  }
  return times.sort((a, b) => a - b)[Math.floor(times.length / 2)];
}
const ms = (n: number) => `${n < 10 ? n.toFixed(2) : n.toFixed(0)} ms`;

function graphOf(p: GeneratedProcedure) {
  const { facts } = readProcedure(p.file, p.text);
  if (!facts) throw new Error(`${p.file} did not read`);
  return facts.graph;
}

console.log('Sequence analysis benchmark\n');

const wide = graphOf(wideParallelProcedure(12, 10));
const wideResult = structuralSoundness(wide);
console.log(`12 parallel branches × 10 steps (naive state space 11^12 ≈ ${(11 ** 12).toExponential(1)} markings)`);
console.log(`  structural method: ${ms(time(() => structuralSoundness(wide)))}  (goal < 50 ms; ${wideResult.states} states explored, ${wideResult.problems.length} problems)`);
const budgeted = exploreSoundness(wide);
console.log(`  explicit method:   ${ms(time(() => exploreSoundness(wide), 1))}  (stopped at the budget: ${budgeted.states} states, complete: ${budgeted.complete})\n`);

console.log('Branches × 10 steps: structural vs explicit (explicit stops at its state budget)');
for (let b = 2; b <= 12; b++) {
  const g = graphOf(wideParallelProcedure(b, 10));
  const structural = time(() => structuralSoundness(g));
  const explicit = exploreSoundness(g);
  const explicitTime = b <= 5 ? time(() => exploreSoundness(g), 1) : Number.NaN;
  record(`soundness/${String(b).padStart(2, '0')}-branches`, { value: Number(structural.toFixed(2)), unit: 'ms', ...(b === 12 ? { goal: '< 50, flat', met: structural < 50 } : {}), note: `${b} parallel branches x 10 steps, structural method` });
  console.log(`  ${String(b).padStart(2)} branches: structural ${ms(structural).padStart(9)}   explicit ${explicit.complete ? `${String(explicit.states).padStart(7)} states ${Number.isNaN(explicitTime) ? '' : ms(explicitTime)}` : `> ${explicit.states} states (budget)`}`);
}

const nested = nestedProcedure(20);
const nestedGraph = graphOf(nested);
const nestedResult = structuralSoundness(nestedGraph);
console.log(`\nParallel blocks nested 20 deep (${nestedGraph.places.filter((p) => p.kind === 'step').length} steps, a loop at every level)`);
console.log(`  structural method: ${ms(time(() => structuralSoundness(nestedGraph)))}  (${nestedResult.regions.length} regions, ${nestedResult.states} states, ${nestedResult.problems.length} problems)`);
console.log(`  whole check:       ${ms(time(() => checkSources([nested], { today }), 3))}`);

const many = generateProcedures(1000, 40);
// The median of three runs; one in quick mode (npm run bench -- --quick).
const manyRuns = quick ? 1 : 3;
const steps = many.reduce((n, p) => n + (p.text.match(/^\s*- step:|step: step-/gm)?.length ?? 0), 0);
const yamlOnly = time(() => {
  for (const p of many) parseDocument(p.text.slice(4, p.text.indexOf('\n---\n', 4)));
}, manyRuns);
const analysisOnly = time(() => {
  for (const p of many) {
    const { facts } = readProcedure(p.file, p.text);
    if (!facts) continue;
    structuralSoundness(facts.graph);
    analyseDecisions(facts);
  }
}, manyRuns);
const readOnly = time(() => {
  for (const p of many) readProcedure(p.file, p.text);
}, manyRuns);
const check = time(() => checkSources(many, { today }), manyRuns);
const sample = checkSources(many.slice(0, 50), { today });
const errors = sample.diagnostics.filter((d) => d.severity === 'error' && /sequence|loop|branches|unreachable|activated|left-active|contradictory/.test(d.rule)).length;
console.log(`\n1,000 generated procedures (about ${Math.round(steps / many.length)} steps each)`);
console.log(`  parse YAML only:              ${ms(yamlOnly)}`);
console.log(`  read into the model:          ${ms(readOnly)}`);
console.log(`  read + sequence + decisions:  ${ms(analysisOnly)}  (${(analysisOnly / yamlOnly).toFixed(2)}× YAML)`);
console.log(`  whole check, every rule:      ${ms(check)}  (${(check / yamlOnly).toFixed(2)}× YAML; goal < 2 s and < 3×)`);
console.log(`  sequence/decision errors in the first 50 (expected 0): ${errors}`);
record('check/1000-procedures', { value: Math.round(check), unit: 'ms', goal: '< 2000', met: check < 2000, note: 'checkSources, every rule, 1,000 generated procedures' });
record('check/yaml-only', { value: Math.round(yamlOnly), unit: 'ms', note: 'parseDocument of the same 1,000 front-matters' });
record('check/ratio-to-yaml', { value: Number((check / yamlOnly).toFixed(2)), unit: 'x', goal: '< 3', met: check / yamlOnly < 3 });

