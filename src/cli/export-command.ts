// `stepwright export ID --format json|mermaid`: one procedure of the manual as model JSON or a mermaid flowchart.
import { proceduresFolder } from './project.ts';
import { parseArgs } from 'node:util';
import { closest } from 'fastest-levenshtein';
import { estimateCycleTime } from '../analysis/cycle-time.ts';
import { inlineCalls } from '../analysis/inline-calls.ts';
import { loadConfig } from './load-config.ts';
import { loadRegister } from './load-register.ts';
import { checkSources } from '../check/run-checks.ts';
import type { Procedure } from '../model/procedure.ts';
import { mermaidFlowchart } from '../render/mermaid-flowchart.ts';
import { formatHuman } from '../render/format-diagnostics.ts';
import { todayOf, UsageError, useColour, type CliIo } from './io.ts';
import { readProcedureFiles } from '../engine/find-procedure-files.ts';
import { exportHelp } from './command-help.ts';
import { unreadFiles } from '../engine/unread-procedures.ts';
import { shellWord } from '../model/shell-word.ts';

export { exportHelp };

export async function runExport(argv: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args: argv,
    allowPositionals: true,
    options: {
      format: { type: 'string', default: 'json' },
      inline: { type: 'boolean', default: false },
      force: { type: 'boolean', default: false },
      help: { type: 'boolean', short: 'h' },
    },
    strict: true,
  });
  if (values.help) {
    io.stdout.write(exportHelp);
    return 0;
  }
  const [id, ...paths] = positionals;
  if (!id) throw new UsageError('Give the id of the procedure to export, e.g. stepwright export U2-K210-INERT-001.');
  if (values.format !== 'json' && values.format !== 'mermaid') throw new UsageError(`Unknown format '${values.format}'; use json or mermaid.`);

  const folders = paths.length ? paths : [proceduresFolder(io)];
  const inputs = readProcedureFiles(folders, io.cwd);
  const configured = loadConfig(io);
  const result = checkSources(inputs, { today: todayOf(io), severity: configured.policy, register: loadRegister(io.cwd, configured.file?.file, configured.config.register, folders[0]) });
  const byId = new Map<string, Procedure>();
  for (const f of result.files) if (f.procedure?.id && !byId.has(f.procedure.id)) byId.set(f.procedure.id, f.procedure);
  const found = result.files.find((f) => f.procedure?.id === id);
  if (!found?.procedure) {
    const where = paths.join(', ') || proceduresFolder(io);
    const unread = unreadFiles(id, inputs, result.files);
    if (unread[0]?.holdsId) {
      // The procedure is there, but its file could not be read: that is the problem to fix, not the id.
      io.stderr.write(`stepwright export: ${unread[0].file} names '${id}' on its id line but could not be read as a procedure, so nothing was exported:\n  ${unread[0].problem}\nFix it (stepwright check ${shellWord(unread[0].file)} lists every problem), then export again.\n`);
      return 1;
    }
    const guess = byId.size ? closest(id, [...byId.keys()]) : undefined;
    const couldNotRead = unread.length
      ? ` ${unread.length === 1 ? '1 file' : `${unread.length} files`} could not be read and may hold it: ${unread.slice(0, 3).map((u) => u.problem).join('; ')}${unread.length > 3 ? `; and ${unread.length - 3} more` : ''}.`
      : '';
    io.stderr.write(`stepwright export: no procedure with id '${id}' in ${where}.${couldNotRead}${guess ? ` Did you mean '${guess}'?` : ''}\n`);
    return 1;
  }
  const errors = found.diagnostics.filter((d) => d.severity === 'error');
  if (errors.length && !values.force) {
    const texts = new Map(inputs.flatMap((i) => ('text' in i ? [[i.file, i.text] as const] : [])));
    io.stderr.write(formatHuman(errors, texts, useColour(io, io.stderr)));
    io.stderr.write(`stepwright export: ${found.file} has ${errors.length} error${errors.length === 1 ? '' : 's'}; nothing was exported. Fix them, or use --force.\n`);
    return 1;
  }

  const procedure = values.inline ? inlineCalls(found.procedure, (callee) => byId.get(callee)).procedure : found.procedure;
  io.stdout.write(values.format === 'mermaid' ? mermaidFlowchart(procedure) : exportJson(procedure));
  return 0;
}

/** The model without the parsed body tree and the raw front-matter (both restate what is already there). */
export function exportJson(procedure: Procedure): string {
  const { body: _tree, bodyText, data: _data, ...model } = procedure;
  const cycle = estimateCycleTime(procedure);
  return `${JSON.stringify({
    format: 'stepwright-procedure',
    formatVersion: 1,
    ...model,
    body: bodyText,
    cycleTime: {
      seconds: { shortest: cycle.shortest, typical: cycle.typical, longest: Number.isFinite(cycle.longest) ? cycle.longest : null },
      criticalPath: cycle.criticalPath,
      notes: cycle.notes.map((n) => n.message),
    },
  }, (_key, value) => (value === undefined ? undefined : value), 2)}\n`;
}
