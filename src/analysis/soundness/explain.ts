// The reasoning behind the sequence checks as plain text: the step graph, the proof method and the states it
// explored, each loop with its exit, and how each decision splits the signal space.
import type { ProcedureFacts } from '../procedure-facts.ts';
import type { Transition } from '../step-graph.ts';
import { analyseDecisions } from '../decisions/analyse-decisions.ts';
import { analyseSequence, locatePlaces, showTrace, traceWords } from './analyse-sequence.ts';
import { walk } from './loops.ts';

function guardText(t: Transition): string {
  const parts = t.guard.map((g) => (g.kind === 'confirm' ? `confirm "${g.text}"` : g.text));
  return parts.length ? parts.join(' and ') : t.missing ? '(no transition written)' : '(at once)';
}

export function explainSequence(facts: ProcedureFacts): string[] {
  const lines: string[] = [];
  const analysis = analyseSequence(facts);
  const graph = analysis.graph;
  const where = locatePlaces(facts);
  const label = (id: string) => {
    const p = where.place(id);
    return p?.kind === 'step' ? p.label : `(${p?.label ?? id})`;
  };

  const steps = graph.places.filter((p) => p.kind === 'step').length;
  lines.push(`Step graph: ${graph.places.length} places (${steps} steps), ${graph.transitions.length} transitions`);
  for (const t of graph.transitions) {
    const kind = t.jump ? `goto ${t.jump.target}` : t.kind;
    lines.push(`  ${t.id.padEnd(5)} ${t.from.map(label).join(' + ')} → ${t.to.map(label).join(' + ') || '(nowhere)'}   [${kind}] when ${guardText(t)}`);
  }

  const result = analysis.result;
  if (!result) {
    lines.push('Soundness: not analysed (a goto names an unknown step).');
  } else {
    lines.push(`Soundness: ${result.method} method, ${result.states} states explored${result.complete ? '' : ' (budget exceeded: not proved)'}`);
    for (const r of result.regions) {
      const name = r.region === '' ? 'whole procedure' : `branch ${r.region}`;
      const how = r.method === 'by-construction' ? 'sound by construction (no jumps, every block completes)'
        : r.method === 'state-machine' ? `one active step at a time: ${r.states} states`
        : `jumps cross parallel branches here: token game over ${r.states} states`;
      lines.push(`  ${name}: ${how}`);
    }
    if (!result.problems.length && !result.deadPlaces.size && !analysis.endless.length) lines.push('  verdict: sound (always completes, completes properly, no step twice, no dead step)');
    for (const p of result.problems) {
      const what = p.kind === 'unsafe' ? 'a step can be active twice' : p.kind === 'stuck' ? 'the end can no longer be reached' : 'the end is reached with steps still active';
      lines.push(`  problem: ${what} after ${showTrace(traceWords(p.path, graph))}`);
    }
    const dead = [...result.deadPlaces].filter((id) => where.place(id)?.kind === 'step');
    if (dead.length) lines.push(`  dead steps: ${dead.map(label).join(', ')}`);
  }

  if (analysis.loops.length) lines.push('Loops:');
  for (const loop of analysis.loops) {
    const jump = loop.jump;
    const around = walk(graph, loop.head, jump.from[0], loop.body);
    const body = [label(loop.head), ...traceWords(around, graph)];
    const exits = loop.exits.map((t) => {
      const guard = t.guard.filter((g) => g.kind === 'when' || g.kind === 'otherwise').map((g) => g.text).join(' and ');
      return `${guard || guardText(t)} (from ${t.from.map(label).join(' + ')})`;
    });
    lines.push(`  loop ${body.join(' → ')} → goto ${jump.jump?.target}: ${exits.length ? `exit when ${exits.join('; or ')}` : 'NO EXIT'}`);
  }

  const decisions = analyseDecisions(facts);
  if (decisions.length) lines.push('Decisions:');
  for (const d of decisions) {
    const step = d.before ? ` (with the step's until: ${d.before.text})` : '';
    const key = d.block.path.join('.');
    const after = [...new Set(graph.transitions.filter((t) => t.choose?.path.join('.') === key).flatMap((t) => t.from.map(label)))];
    lines.push(`  choose after ${after.join(' / ') || 'the start'} (${key})${step}:`);
    if (d.skipped || !d.space) {
      lines.push(`    not analysed: ${d.skipped ?? 'no conditions'}`);
      continue;
    }
    const space = d.space;
    for (const b of d.branches) {
      const region = b.region.length ? b.region.map((box) => space.describe(box)).join('; or ') : 'never';
      lines.push(`    branch ${b.index + 1} ${b.label}: ${region}`);
    }
    for (const o of d.overlaps) lines.push(`    overlap: branches ${o.a + 1} and ${o.b + 1} when ${o.witness.join(' and ')}`);
    lines.push(`    uncovered: ${d.gap.length ? d.gap.map((box) => space.describe(box)).join('; or ') : 'nothing'}`);
  }
  return lines;
}
