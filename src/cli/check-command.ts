// `stepwright check [paths…]`: checks procedure files and reports every problem with its place.
import { parseArgs } from 'node:util';
import { checkSources } from '../check/run-checks.ts';
import { formatHuman, formatJson, summarize } from './format-diagnostics.ts';
import { todayOf, UsageError, useColour, type CliIo } from './io.ts';
import { readProcedureFiles } from './read-procedure-files.ts';

export const checkHelp = `Usage: stepwright check [options] [paths…]

Checks procedure files (markdown with YAML front-matter) and reports every problem with
file:line:column, severity, rule id, message and a hint. Paths may be files or folders
(default: procedures/). Folders are searched for *.md files.

Options:
  --format <human|json>   output format (default: human)
  --quiet                 print errors only
  -h, --help              show this help

Exit codes: 0 no errors (warnings allowed), 1 errors found, 2 usage or internal failure.
`;

export async function runCheck(argv: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args: argv,
    allowPositionals: true,
    options: { format: { type: 'string', default: 'human' }, quiet: { type: 'boolean', default: false }, help: { type: 'boolean', short: 'h' } },
    strict: true,
  });
  if (values.help) {
    io.stdout.write(checkHelp);
    return 0;
  }
  if (values.format !== 'human' && values.format !== 'json') throw new UsageError(`Unknown format '${values.format}'; use human or json.`);
  const inputs = readProcedureFiles(positionals.length ? positionals : ['procedures'], io.cwd);
  const result = checkSources(inputs, { today: todayOf(io) });
  const shown = values.quiet ? result.diagnostics.filter((d) => d.severity === 'error') : result.diagnostics;
  if (values.format === 'json') io.stdout.write(formatJson(shown));
  else {
    const texts = new Map(inputs.flatMap((i) => ('text' in i ? [[i.file, i.text] as const] : [])));
    io.stdout.write(formatHuman(shown, texts, useColour(io, io.stdout)));
    io.stdout.write(summarize(result.diagnostics, inputs.length));
  }
  return result.diagnostics.some((d) => d.severity === 'error') ? 1 : 0;
}
