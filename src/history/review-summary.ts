// The pull-request summary as GitHub-flavoured Markdown: per changed procedure the revision and status change,
// the safety-relevant changes first, the step changes, the sign-offs the policy requires, check results and a flowchart.
import type { Diagnostic } from '../parse/diagnostic.ts';
import type { Procedure } from '../model/procedure.ts';
import { mermaidFlowchart } from '../render/mermaid-flowchart.ts';
import { stepMarks, type FieldChange, type ItemChange, type Redline, type StepRow, type WordPart } from './redline.ts';
import type { RequiredSignOff } from './approval-policy.ts';
import { describeBase } from './previous-version.ts';
import type { RegisterEntryChange } from './register-impact.ts';

export interface ReviewedFile {
  /** Path now (or before, when deleted), relative to the repository root. */
  path: string;
  oldPath?: string;
  change: 'added' | 'modified' | 'renamed' | 'deleted';
  before?: Procedure;
  after?: Procedure;
  redline?: Redline;
  signOffs: RequiredSignOff[];
  diagnostics: Diagnostic[];
}

export interface ReviewInput {
  base: string;
  baseCommit: string;
  files: ReviewedFile[];
  /** Where the approval policy came from, e.g. "default policy (docs/review.md)". */
  policySource: string;
  notices: string[];
  /** Entries of the plant register that changed, with every procedure that uses each. */
  registerChanges?: RegisterEntryChange[];
  /**
   * Errors the check finds in files the change did not touch (a procedure that calls a deleted one, a register entry
   * at odds with a changed trip): the build stops on them as on any other.
   */
  otherErrors?: Diagnostic[];
}

/** How many errors elsewhere are listed one by one; the rest are counted. */
const otherErrorsListed = 30;

function otherErrorsSection(errors: Diagnostic[]): string[] {
  if (!errors.length) return [];
  const out = ['#### Errors in files this change did not touch', '', 'The build stops on these too. The change may have caused them (a call to a procedure it deletes, a trip it moves) or they were there before; either way they must be fixed before the manual can be published.', ''];
  for (const d of errors.slice(0, otherErrorsListed)) out.push(`- \`${d.file}:${d.line}:${d.column}\` **${d.rule}**: ${inline(d.message)}`);
  if (errors.length > otherErrorsListed) out.push(`- … and ${errors.length - otherErrorsListed} more: run \`stepwright check\` for all of them.`);
  out.push('');
  return out;
}

/** How every review summary starts (a file that starts so is an earlier summary, which `review --output` may replace). */
export const reviewHeading = '## Stepwright review against';

export function renderReviewMarkdown(input: ReviewInput): string {
  const out: string[] = [];
  out.push(`${reviewHeading} ${describeBase(input.base, input.baseCommit).replace(/^(\S+)/, '`$1`')}`, '');
  for (const n of input.notices) out.push(`> [!WARNING]`, `> ${n}`, '');
  out.push(...registerSection(input.registerChanges ?? []));
  const elsewhere = input.otherErrors ?? [];
  const elsewhereNote = elsewhere.length ? ` And ${plural(elsewhere.length, 'error')} in files this change did not touch (listed below).` : '';
  if (!input.files.length) {
    out.push(`No procedure changed.${elsewhereNote}`, '');
    out.push(...otherErrorsSection(elsewhere));
    return `${out.join('\n')}\n`;
  }
  const errors = input.files.flatMap((f) => f.diagnostics).filter((d) => d.severity === 'error').length;
  const warnings = input.files.flatMap((f) => f.diagnostics).filter((d) => d.severity === 'warning').length;
  const withSafety = input.files.filter((f) => safetyItems(f).length > 0).length;
  out.push(
    `${plural(input.files.length, 'procedure')} changed, ${withSafety} with safety-relevant changes. ` +
      `Check: ${plural(errors, 'error')}, ${plural(warnings, 'warning')} in the changed procedures.${elsewhereNote}`,
    '',
    '| Procedure | Change | Revision | Status | Safety-relevant | Sign-offs still needed |',
    '| --- | --- | --- | --- | --- | --- |',
  );
  for (const f of input.files) {
    const p = f.after ?? f.before;
    const missing = f.signOffs.filter((s) => !s.signedBy).map((s) => s.role);
    out.push(row([
      inline(p ? p.id : f.path),
      f.change,
      arrow(f.before?.revision, f.after?.revision),
      arrow(f.before?.status, f.after?.status),
      String(safetyItems(f).length),
      missing.length ? inline(missing.join(', ')) : f.signOffs.length ? 'none' : '—',
    ]));
  }
  out.push('');
  out.push(...otherErrorsSection(elsewhere));
  for (const f of input.files) out.push(...fileSection(f, input.policySource));
  return `${out.join('\n').replace(/\n{3,}/g, '\n\n')}\n`;
}

function fileSection(f: ReviewedFile, policySource: string): string[] {
  const p = f.after ?? f.before;
  const out: string[] = ['---', '', `### ${p ? `${p.id}: ${cellText(p.title)}` : f.path}`, ''];
  const where = f.oldPath && f.oldPath !== f.path ? `\`${f.oldPath}\` → \`${f.path}\`` : `\`${f.path}\``;
  out.push(`${where} · ${f.change} · revision **${arrow(f.before?.revision, f.after?.revision)}** · status **${arrow(f.before?.status, f.after?.status)}**`, '');
  if (f.after?.change && f.after.change !== f.before?.change) out.push(`> **Change:** ${f.after.change.replace(/\s+/g, ' ')}`, '');

  if (f.change === 'deleted') {
    out.push('The file is deleted. A procedure that is no longer used should be kept with status `retired`, so its revisions stay readable.', '');
  }
  if (f.change === 'added' && f.after) out.push(`New procedure with ${plural(f.after.hazards.length, 'hazard message')}, ${plural(f.after.limits.length, 'operating limit')} and ${plural(f.after.interlocks.length, 'interlock')}.`, '');

  const r = f.redline;
  if (!r && f.change !== 'deleted') out.push('The file cannot be read as a procedure now, so no redline is shown; the check results below say why.', '');
  if (r) {
    const safety = safetyItems(f);
    out.push('#### Safety-relevant changes', '');
    if (safety.length) {
      for (const item of safety) {
        out.push(`- ⚠️ ${itemLine(item)} — _${item.safety}_`);
        if (item.context) out.push(`  <br>In revision ${r.revision.after}: ${inline(item.context)}`);
      }
    }
    else out.push('None: no hazards, limits, interlocks, setpoints or transitions on guarded signals changed.');
    out.push('');

    const changedSteps = r.steps.filter((s) => s.kinds.length);
    out.push('#### Step changes', '');
    if (f.change === 'added') out.push(`All ${r.steps.length} steps are new; review the whole procedure.`);
    else if (changedSteps.length) {
      out.push('| Step | Change | Where | What changed |', '| --- | --- | --- | --- |');
      for (const s of changedSteps) out.push(row([`\`${s.id}\``, s.kinds.join(', '), placeOf(s), stepDetails(s)]));
    } else out.push('No step added, removed, moved or changed.');
    out.push('');

    const other = r.items.filter((i) => !i.safety && i.area !== 'setpoints');
    if (other.length) {
      out.push('#### Other changes', '');
      for (const item of other) out.push(`- ${itemLine(item)}`);
      out.push('');
    }
  }

  if (f.signOffs.length) {
    out.push('#### Sign-offs required', '', `Under the ${policySource}:`, '', '| Role | Why | New signature in this revision |', '| --- | --- | --- |');
    for (const s of f.signOffs) {
      const signed = s.signedBy ? `✅ ${inline(`${s.signedBy.name}, ${s.signedBy.date} (${s.signedBy.meaning})`)}` : '❌ not yet signed';
      out.push(row([inline(s.role), inline(s.reasons.join('; ')), signed]));
    }
    out.push('');
  }

  out.push('#### Check', '');
  if (f.diagnostics.length) {
    for (const d of f.diagnostics) {
      const icon = d.severity === 'error' ? '❌' : d.severity === 'warning' ? '⚠️' : 'ℹ️';
      out.push(`- ${icon} line ${d.line}: \`${d.rule}\` ${d.message}${d.hint ? ` _Hint: ${d.hint}_` : ''}`);
    }
  } else out.push('No problems found.');
  out.push('');

  if (f.after && f.change !== 'deleted') {
    const marks = r ? stepMarks(r) : new Map();
    const removed = r ? r.steps.filter((s) => s.kinds.includes('removed')).map((s) => `\`${s.id}\``) : [];
    out.push('<details><summary>Flowchart with changed steps marked</summary>', '', '```mermaid', mermaidFlowchart(f.after, { marks }).trimEnd(), '```', '');
    if (removed.length) out.push(`Removed steps (not in the chart): ${removed.join(', ')}.`, '');
    out.push('</details>', '');
  }
  return out;
}

/** Safety-relevant items, in the order a process-safety reviewer reads them. */
export function safetyItems(f: Pick<ReviewedFile, 'redline'>): ItemChange[] {
  const order = ['hazards', 'interlocks', 'limits', 'setpoints', 'transitions', 'decisions', 'signals', 'ppe'];
  return (f.redline?.items ?? []).filter((i) => i.safety).sort((a, b) => order.indexOf(a.area) - order.indexOf(b.area));
}

const areaWords: Record<ItemChange['area'], string> = {
  setpoints: 'Setpoint', transitions: 'Transition', decisions: 'Decision', limits: 'Limit', interlocks: 'Interlock',
  hazards: 'Hazard', signals: 'Signal', ppe: 'PPE', equipment: 'Equipment', identity: 'Identity', body: 'Narrative',
};

function itemLine(item: ItemChange): string {
  const head = `**${areaWords[item.area]} ${item.key}** ${item.kind}`;
  if (item.kind !== 'changed') {
    // The key already names the item (a hazard's level and text, a tag, a signal), so it is not repeated.
    const shown = item.fields.filter((f) => !(item.area === 'hazards' && (f.field === 'level' || f.field === 'hazard')));
    const values = shown.map((f) => (f.field === item.area ? (f.after ?? f.before) : `${f.field}: ${f.after ?? f.before}`)).join('; ');
    return `${head}: ${inline(values)}`;
  }
  return `${head}: ${item.fields.map(fieldText).join('; ')}`;
}

function stepDetails(s: StepRow): string {
  const parts: string[] = [];
  if (s.kinds.includes('added') && s.after) parts.push(`do: ${inline(s.after.step.actions.join('; '))}`);
  if (s.kinds.includes('removed') && s.before) parts.push(`was: ${inline(s.before.step.actions.join('; '))}`);
  if (s.renamedFrom) parts.push(`id was \`${s.renamedFrom}\``);
  if (s.kinds.includes('moved') && s.before && s.after && s.before.where !== s.after.where) parts.push(`moved from ${inline(s.before.where)}`);
  else if (s.kinds.includes('moved')) parts.push('order changed');
  parts.push(...s.fields.map(fieldText));
  return parts.join('<br>');
}

function placeOf(s: StepRow): string {
  return inline((s.after ?? s.before)!.where);
}

export function fieldText(f: FieldChange): string {
  if (f.before === undefined) return `${f.field} added: ${inline(f.after ?? '')}`;
  if (f.after === undefined) return `${f.field} removed: ~~${inline(f.before)}~~`;
  if (f.words && (f.before.length > 24 || f.after.length > 24)) return `${f.field}: ${wordsMarkdown(f.words)}`;
  return `${f.field}: ${inline(f.before)} → **${inline(f.after)}**`;
}

/** Removed words struck through, added words in bold; whitespace stays outside the markers so Markdown renders them. */
export function wordsMarkdown(words: WordPart[]): string {
  return words.map((w) => {
    const text = inline(w.text);
    if (w.kind === 'same' || !text.trim()) return text;
    const [, lead, core, trail] = /^(\s*)(.*?)(\s*)$/s.exec(text)!;
    return `${lead}${w.kind === 'added' ? `**${core}**` : `~~${core}~~`}${trail}`;
  }).join('');
}

/** Text safe inside a Markdown table cell or list item. */
function inline(text: string): string {
  return text.replace(/\s*\n\s*/g, ' ').replace(/\|/g, '\\|').replace(/([*_~`<>])/g, '\\$1');
}

function cellText(text: string): string {
  return inline(text);
}

/** Cells must already be safe (see `inline`). */
function row(cells: string[]): string {
  return `| ${cells.join(' | ')} |`;
}

function arrow(before: unknown, after: unknown): string {
  const show = (v: unknown) => (v === undefined || v === '' || (typeof v === 'number' && Number.isNaN(v)) ? '—' : String(v));
  return before === after ? show(after) : `${show(before)} → ${show(after)}`;
}

function plural(n: number, word: string, many = `${word}s`): string {
  return `${n} ${n === 1 ? word : many}`;
}

/** The register changes first: a changed trip or limit reaches every procedure that uses it, changed or not. */
function registerSection(changes: RegisterEntryChange[]): string[] {
  if (!changes.length) return [];
  const out = ['### Plant register changes', ''];
  const stale = changes.flatMap((c) => c.procedures.filter((p) => !p.revisionChanged));
  out.push(
    `${plural(changes.length, 'register entry', 'register entries')} changed; ${plural(new Set(changes.flatMap((c) => c.procedures.map((p) => p.id))).size, 'procedure')} use them` +
      (stale.length ? `, ${plural(new Set(stale.map((p) => p.id)).size, 'procedure')} without a new revision.` : '.'),
    '',
    '| Register entry | Change | What changed | Used by |',
    '| --- | --- | --- | --- |',
  );
  for (const c of changes) {
    const users = c.procedures.length
      ? c.procedures.map((p) => (p.revisionChanged ? inline(p.id) : `**${inline(p.id)}** (revision not changed)`)).join('<br>')
      : 'no procedure';
    out.push(row([`${inline(c.id)} (${c.section})`, c.change, c.details.length ? c.details.map(inline).join('<br>') : '—', users]));
  }
  if (stale.length) {
    out.push('', 'Procedures in **bold** use a changed entry but their revision did not change: review each against the new register entry and raise its revision, or say in the pull request why it is not affected.');
  }
  out.push('');
  return out;
}
