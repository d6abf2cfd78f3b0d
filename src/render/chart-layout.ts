// Lays a procedure's sequence out as an IEC 60848 / IEC 61131-3 sequence chart: a list of positioned shapes.
// Steps and transitions alternate; parallel blocks open and close on double lines, decisions on single lines,
// jumps end in a labelled marker. Branches sit side by side; every size comes from the text it holds.
import type { ChooseBlock, HazardLevel, ParallelBlock, Procedure, SequenceItem, Step } from '../model/procedure.ts';
import { numberSteps, type StepNumbers } from './step-numbers.ts';
import { textWidth, wrapText } from './text-metrics.ts';
import { performerMarker, verifyMarker } from './step-roles.ts';
import { callOf } from '../analysis/inline-calls.ts';

export const chartFont = { size: 14, line: 18, small: 12 } as const;
const boxTextMax = 200;
const boxPad = 8;
const boxMinWidth = 120;
const barHalf = 16;
const labelGap = 8;
const labelMax = 180;
const stem = 12;
const branchGap = 28;
const doubleGap = 4;
const branchLabelZone = 22;
const margin = 16;

export interface Rect {
  x: number;
  y: number;
  w: number;
  h: number;
}

export type Shape =
  | {
      type: 'step'; id: string; number: string; rect: Rect; header: string; lines: string[]; markers: string[];
      initial: boolean; hazard?: HazardLevel; signOff?: string;
    }
  | { type: 'bar'; x: number; y: number; label: string[]; labelRect: Rect; from?: string }
  | { type: 'line'; x1: number; y1: number; x2: number; y2: number }
  | { type: 'double'; x1: number; x2: number; y: number }
  | { type: 'single'; x1: number; x2: number; y: number }
  | { type: 'jump'; x: number; y: number; target: string; label: string; labelRect: Rect }
  | { type: 'branch-label'; text: string; rect: Rect }
  | { type: 'end'; rect: Rect };

export interface ChartLayout {
  width: number;
  height: number;
  shapes: Shape[];
}

interface Block {
  w: number;
  h: number;
  /** x of the flow line, from the block's left edge. */
  cx: number;
  /** False when nothing flows out of the bottom (every branch jumped away). */
  open: boolean;
  place(x: number, y: number, out: Shape[]): void;
}

type Pending = { kind: 'begin' } | { kind: 'join' } | { kind: 'step'; lines: string[]; from: string } | null;

const hazardRank: Record<HazardLevel, number> = { danger: 0, warning: 1, caution: 2, notice: 3 };

export function layoutChart(procedure: Pick<Procedure, 'steps' | 'hazards'>, numbers: StepNumbers = numberSteps(procedure.steps)): ChartLayout {
  const hazardOf = new Map<string, HazardLevel>();
  for (const h of procedure.hazards) {
    for (const at of h.at) {
      const known = hazardOf.get(at.value);
      if (!known || hazardRank[h.level] < hazardRank[known]) hazardOf.set(at.value, h.level);
    }
  }
  let firstStep = true;

  const stepBlock = (step: Step): Block => {
    const number = numbers.ofStep.get(step.id) ?? '?';
    const header = `${number}  ${step.id}`;
    const lines = step.actions.flatMap((a) => wrapText(a, boxTextMax, chartFont.size));
    const markers: string[] = [];
    const hazard = hazardOf.get(step.id);
    // NOTICE is about property damage and never carries the safety alert symbol (ANSI Z535.4).
    // The safety alert symbol is drawn in front of DANGER, WARNING and CAUTION (ANSI Z535.4); NOTICE gets a square.
    if (hazard) markers.push(`${hazard === 'notice' ? '■' : '⚠'} ${hazard.toUpperCase()}`);
    if (step.performer) markers.push(...wrapText(performerMarker(step.performer), boxTextMax, chartFont.small));
    if (step.verify) markers.push(...wrapText(verifyMarker(step.verify), boxTextMax, chartFont.small));
    if (step.signOff) markers.push(...wrapText(`◆ SIGN-OFF: ${step.signOff}`, boxTextMax, chartFont.small));
    const textW = Math.max(
      textWidth(header, chartFont.size) + 2,
      ...lines.map((l) => textWidth(l, chartFont.size)),
      ...markers.map((m) => textWidth(m, chartFont.small) + 2),
    );
    const w = Math.max(boxMinWidth, textW + 2 * boxPad);
    const h = boxPad * 2 + chartFont.line * (1 + lines.length) + markers.length * (chartFont.small + 4);
    const initial = firstStep;
    firstStep = false;
    return {
      w, h, cx: Math.round(w / 2), open: true,
      place: (x, y, out) => out.push({
        type: 'step', id: step.id, number, rect: { x, y, w, h }, header, lines, markers, initial, hazard, signOff: step.signOff,
      }),
    };
  };

  const transitionBlock = (label: string[], from?: string): Block => {
    const lines = label.flatMap((l) => wrapText(l, labelMax, chartFont.size));
    const labelW = Math.max(...lines.map((l) => textWidth(l, chartFont.size)));
    const labelH = lines.length * chartFont.line;
    const h = Math.max(labelH, 8) + 2 * stem;
    const cx = barHalf;
    const w = cx + barHalf + labelGap + labelW;
    return {
      w, h, cx, open: true,
      place: (x, y, out) => {
        const barY = y + Math.round(h / 2);
        out.push({ type: 'line', x1: x + cx, y1: y, x2: x + cx, y2: y + h });
        out.push({
          type: 'bar', x: x + cx, y: barY, label: lines, from,
          labelRect: { x: x + cx + barHalf + labelGap, y: barY - Math.round(labelH / 2), w: labelW, h: labelH },
        });
      },
    };
  };

  const jumpBlock = (target: string): Block => {
    const label = `go to ${numbers.ofStep.get(target) ?? '?'} ${target}`;
    const labelW = textWidth(label, chartFont.size);
    const h = 40;
    const cx = 8;
    return {
      w: cx + 10 + labelW, h, cx, open: false,
      place: (x, y, out) => {
        out.push({ type: 'line', x1: x + cx, y1: y, x2: x + cx, y2: y + 20 });
        out.push({ type: 'jump', x: x + cx, y: y + 28, target, label, labelRect: { x: x + cx + 10, y: y + 14, w: labelW, h: chartFont.line } });
      },
    };
  };

  const spacerBlock = (): Block => ({ w: 0, h: 28, cx: 0, open: true, place: () => {} });

  const endBlock = (): Block => ({
    w: 64, h: 30, cx: 32, open: false,
    place: (x, y, out) => out.push({ type: 'end', rect: { x, y, w: 64, h: 30 } }),
  });

  const stackBlocks = (blocks: Block[]): Block => {
    const cx = Math.max(0, ...blocks.map((b) => b.cx));
    const right = Math.max(0, ...blocks.map((b) => b.w - b.cx));
    const h = blocks.reduce((sum, b) => sum + b.h, 0);
    const last = blocks[blocks.length - 1];
    return {
      w: cx + right, h, cx, open: last ? last.open : true,
      place: (x, y, out) => {
        let top = y;
        for (const b of blocks) {
          b.place(x + cx - b.cx, top, out);
          top += b.h;
        }
      },
    };
  };

  const pendingBar = (pending: Pending): Block | undefined => {
    if (!pending || pending.kind === 'begin') return undefined;
    if (pending.kind === 'join') return transitionBlock(['all branches done']);
    return transitionBlock(pending.lines.length ? pending.lines : ['(no transition)'], pending.from);
  };

  // A call step ends when the procedure it runs has ended, with its own condition too when it has one.
  const guardLines = (step: Step): string[] => [
    ...(callOf(step) ? [`${callOf(step)!.callee} ended`] : []),
    ...(step.until ? [step.until.value] : []),
    ...(step.confirm ? [`confirm: ${step.confirm.value}`] : []),
  ];

  /** Lays out a sequence; returns its blocks and what is still pending at its end. */
  const layoutSequence = (items: SequenceItem[], pending: Pending): { blocks: Block[]; pending: Pending } => {
    const blocks: Block[] = [];
    let current = pending;
    for (const item of items) {
      // After a decision whose branches all jumped away, the next item starts a new, unconnected run.
      if (blocks.length && !blocks[blocks.length - 1].open) blocks.push(spacerBlock());
      if (item.kind === 'step') {
        const bar = current?.kind === 'join' || current?.kind === 'step' ? pendingBar(current) : undefined;
        if (bar) blocks.push(bar);
        blocks.push(stepBlock(item));
        current = { kind: 'step', lines: guardLines(item), from: item.id };
      } else if (item.kind === 'parallel') {
        if (current?.kind === 'step') blocks.push(pendingBar(current)!);
        blocks.push(parallelBlock(item));
        current = { kind: 'join' };
      } else {
        const block = chooseBlock(item, current);
        blocks.push(block);
        current = null;
      }
    }
    return { blocks, pending: current };
  };

  const parallelBlock = (block: ParallelBlock): Block => {
    const branches = block.branches.map((branch, i) => {
      const { blocks, pending } = layoutSequence(branch.items, null);
      if (pending?.kind === 'step') blocks.push(pendingBar(pending)!);
      const seq = stackBlocks(blocks);
      // The block's own number with the branch letter, exactly as the step table numbers the branch (3A, 8b).
      const label = `${numbers.ofBlock.get(block) ?? '?'}${numbers.letterOf(block, i)} · ${branch.name}`;
      return { seq, label, labelW: textWidth(label, chartFont.small) };
    });
    return sideBySide(branches, 'double');
  };

  const chooseBlock = (block: ChooseBlock, pending: Pending): Block => {
    const before = pending?.kind === 'step' ? pending.lines : [];
    const branches = block.branches.map((branch, i) => {
      const own = branch.otherwise ? 'otherwise' : branch.when ? `IF ${branch.when.value}` : '(no condition)';
      const from = pending?.kind === 'step' ? pending.from : undefined;
      const blocks: Block[] = [transitionBlock([...before, own], from)];
      const inner = layoutSequence(branch.items ?? [], null);
      blocks.push(...inner.blocks);
      const hasItems = (branch.items?.length ?? 0) > 0;
      if (hasItems && inner.pending?.kind === 'step') blocks.push(pendingBar(inner.pending)!);
      if (branch.goto) blocks.push(jumpBlock(branch.goto.value));
      const seq = stackBlocks(blocks);
      const label = `${numbers.ofBlock.get(block) ?? '?'}${numbers.letterOf(block, i)}`;
      return { seq, label, labelW: textWidth(label, chartFont.small) };
    });
    return sideBySide(branches, 'single');
  };

  /** Branches side by side between two divergence lines (double for parallel, single for decisions). */
  const sideBySide = (branches: Array<{ seq: Block; label: string; labelW: number }>, line: 'double' | 'single'): Block => {
    const topZone = (line === 'double' ? doubleGap : 0) + branchLabelZone;
    const columns: Array<{ left: number; cx: number; seq: Block; label: string; labelW: number }> = [];
    let left = 0;
    for (const b of branches) {
      const w = Math.max(b.seq.w, b.seq.cx + 6 + b.labelW);
      columns.push({ left, cx: left + b.seq.cx, seq: b.seq, label: b.label, labelW: b.labelW });
      left += w + branchGap;
    }
    const width = left - branchGap;
    const innerH = Math.max(...branches.map((b) => b.seq.h));
    const bottomY = topZone + innerH + 10;
    const open = columns.some((c) => c.seq.open);
    const h = open ? bottomY + (line === 'double' ? doubleGap : 0) : topZone + innerH;
    const cx = columns[0].cx;
    return {
      w: width, h, cx, open,
      place: (x, y, out) => {
        const xs = columns.map((c) => x + c.cx);
        const lineLeft = Math.min(...xs) - (line === 'double' ? 10 : 0);
        const lineRight = Math.max(...xs) + (line === 'double' ? 10 : 0);
        if (line === 'double') out.push({ type: 'double', x1: lineLeft, x2: lineRight, y });
        else out.push({ type: 'single', x1: lineLeft, x2: lineRight, y });
        const continuing = columns.filter((c) => c.seq.open).map((c) => x + c.cx);
        for (const c of columns) {
          const cxAbs = x + c.cx;
          const lineTop = y + (line === 'double' ? doubleGap : 0);
          out.push({ type: 'line', x1: cxAbs, y1: lineTop, x2: cxAbs, y2: y + topZone });
          out.push({ type: 'branch-label', text: c.label, rect: { x: cxAbs + 6, y: lineTop + 3, w: c.labelW, h: chartFont.small + 2 } });
          c.seq.place(x + c.left, y + topZone, out);
          if (c.seq.open) out.push({ type: 'line', x1: cxAbs, y1: y + topZone + c.seq.h, x2: cxAbs, y2: y + bottomY });
        }
        if (open) {
          const span = [...continuing, x + cx];
          const l = Math.min(...span) - (line === 'double' ? 10 : 0);
          const r = Math.max(...span) + (line === 'double' ? 10 : 0);
          if (line === 'double') out.push({ type: 'double', x1: l, x2: r, y: y + bottomY });
          else out.push({ type: 'single', x1: l, x2: r, y: y + bottomY });
        }
      },
    };
  };

  const top = layoutSequence(procedure.steps, { kind: 'begin' });
  const blocks = [...top.blocks];
  if (top.pending?.kind === 'step') blocks.push(pendingBar(top.pending)!);
  if (blocks.length === 0 || blocks[blocks.length - 1].open) blocks.push(endBlock());
  const whole = stackBlocks(blocks);
  const shapes: Shape[] = [];
  whole.place(margin, margin, shapes);
  return { width: whole.w + 2 * margin, height: whole.h + 2 * margin, shapes };
}
