// Deterministic procedure generator for benchmarks: realistic batch procedures of a chosen size, very wide
// parallel blocks, and deeply nested ones. Same seed, same text, on every machine.
import { stringify } from 'yaml';

export interface GeneratedProcedure {
  file: string;
  text: string;
}

/** Small, fast, seedable pseudo-random numbers (mulberry32). */
function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const signals = {
  'TI-210': { text: 'Kettle temperature', unit: 'degC', range: [0, 300] },
  'PI-210': { text: 'Kettle pressure', unit: 'bar', range: [0, 6] },
  'LI-230': { text: 'Blend tank level', unit: 'percent', range: [0, 100] },
  'FQ-211': { text: 'Solvent charged', unit: 'kg', range: [0, 5000] },
  'lab-result': { text: 'Lab release', values: ['pass', 'fail'] },
  'agitator-on': { text: 'Agitator running', values: [true, false] },
};

const actions = [
  'Open hot-oil valve XV-2101.', 'Start agitator M-210.', 'Charge xylene to K-210.', 'Close vent valve XV-2107.',
  'Heat K-210 on the hot-oil jacket.', 'Record the batch weight in the log.', 'Check the agitator seal for leaks.',
  'Cool K-210 on jacket cooling water.', 'Purge K-210 with nitrogen.', 'Transfer the batch to T-230.',
];

function document(id: string, title: string, steps: unknown[]): string {
  const front = {
    id, title, kind: 'batch', revision: 1, status: 'draft', owner: 'Unit 2 process engineering', author: 'Bench generator',
    equipment: ['K-210', 'XV-2101', 'M-210'], ppe: ['Face shield', 'Heat-resistant gloves'],
    signals,
    limits: { 'TI-210': { low: '15 degC', high: '245 degC', consequence: 'Resin degrades above the high limit', correction: 'Cut heating and start jacket cooling' } },
    interlocks: [{ tag: 'TSHH-210', 'trips-when': 'TI-210 >= 255 degC', action: 'Closes hot-oil valve XV-2101' }],
    steps,
  };
  return `---\n${stringify(front, { lineWidth: 0 })}---\n\n## Purpose\n\nGenerated for benchmarks.\n`;
}

/** A batch procedure of about `size` steps with parallel blocks, decisions on lab results and levels, and loops with exits. */
export function generateProcedure(index: number, size = 40): GeneratedProcedure {
  const next = random(index * 7919 + 17);
  const pick = <T>(list: readonly T[]) => list[Math.floor(next() * list.length)];
  let count = 0;
  const step = (until = true): Record<string, unknown> => {
    count++;
    const id = `step-${count}`;
    const value = 40 + Math.floor(next() * 180);
    const r = next();
    if (!until) return { step: id, do: pick(actions) };
    if (r < 0.4) return { step: id, do: 'Heat K-210 to the setpoint.', set: { 'TI-210': `${value} degC` }, until: `TI-210 >= ${value} degC` };
    if (r < 0.6) return { step: id, do: pick(actions), until: `PI-210 <= ${(1 + next() * 3).toFixed(1)} bar and agitator-on == true` };
    return { step: id, do: pick(actions), confirm: 'Done and logged' };
  };
  const sequence = (budget: number, nested: boolean): unknown[] => {
    const items: Array<Record<string, unknown>> = [];
    const start = count;
    while (count - start < budget) {
      const r = next();
      if (!nested && r < 0.15 && budget - (count - start) > 6) {
        const branches: Record<string, unknown[]> = {};
        const n = 2 + Math.floor(next() * 2);
        for (let b = 0; b < n; b++) branches[`line-${b + 1}`] = sequence(1 + Math.floor(next() * 3), true);
        items.push({ parallel: branches });
      } else if (r < 0.27 && items.some((i) => 'step' in i)) {
        // A lab check that loops back to an earlier step of this sequence until it passes.
        const back = pick(items.filter((i) => 'step' in i)).step;
        items.push(step(false));
        items.push({ choose: [{ when: 'lab-result == fail', goto: back, repeat: { expected: 1, max: 3 } }, { when: 'lab-result == pass', steps: [step()] }] });
      } else if (r < 0.35) {
        const level = 10 + Math.floor(next() * 60);
        items.push(step(false));
        items.push({ choose: [{ when: `LI-230 < ${level} percent`, steps: [step()] }, { otherwise: true }] });
      } else items.push(step());
    }
    return items;
  };
  const steps = sequence(size, false);
  const id = `GEN-${String(index).padStart(4, '0')}`;
  return { file: `generated/${id.toLowerCase()}.md`, text: document(id, `Generated batch procedure ${index}`, steps) };
}

export function generateProcedures(count: number, size = 40): GeneratedProcedure[] {
  return Array.from({ length: count }, (_, i) => generateProcedure(i + 1, size));
}

/** One parallel block of `branches` branches with `steps` steps each (the naive state space is (steps+1)^branches). */
export function wideParallelProcedure(branches: number, steps: number): GeneratedProcedure {
  const block: Record<string, unknown[]> = {};
  for (let b = 1; b <= branches; b++) {
    block[`line-${b}`] = Array.from({ length: steps }, (_, k) => ({ step: `l${b}-s${k + 1}`, do: `Run stage ${k + 1} of line ${b}.`, confirm: 'Stage done' }));
  }
  const id = `GEN-WIDE-${branches}X${steps}`;
  return { file: `generated/${id.toLowerCase()}.md`, text: document(id, `${branches} lines of ${steps} stages`, [{ step: 'prepare', do: 'Prepare all lines.', confirm: 'Ready' }, { parallel: block }, { step: 'finish', do: 'Finish.', confirm: 'Done' }]) };
}

/** Parallel blocks nested `depth` levels deep, each level with a step, a loop with an exit and the next level. */
export function nestedProcedure(depth: number): GeneratedProcedure {
  const level = (d: number): unknown[] => {
    const here = [
      { step: `level-${d}-check`, do: `Check level ${d}.` },
      { choose: [{ when: 'lab-result == fail', goto: `level-${d}-check`, repeat: { expected: 1, max: 3 } }, { when: 'lab-result == pass' }] },
    ];
    if (d === depth) return here;
    return [...here, { parallel: { inner: level(d + 1), side: [{ step: `level-${d}-side`, do: `Watch level ${d}.`, confirm: 'Watched' }] } }];
  };
  const id = `GEN-NESTED-${depth}`;
  return { file: `generated/${id.toLowerCase()}.md`, text: document(id, `Blocks nested ${depth} deep`, level(1)) };
}
