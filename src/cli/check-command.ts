// `stepwright check [paths…]`: checks procedure files and reports every problem with its place.
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { checkSources } from '../check/run-checks.ts';
import { explainSequence } from '../analysis/soundness/explain.ts';
import { formatHuman, formatJson, summarize } from './format-diagnostics.ts';
import { formatGithub } from './format-github.ts';
import { GitError } from '../history/git.ts';
import { previousFromGit, repoPath } from './repository.ts';
import { todayOf, UsageError, useColour, type CliIo } from './io.ts';
import { readProcedureFiles } from './read-procedure-files.ts';
import { loadConfig } from './load-config.ts';
import { proceduresFolder } from './project.ts';
import { loadRegister } from './load-register.ts';
import { commandCache } from './command-cache.ts';

export const checkHelp = `Usage: stepwright check [options] [paths…]

Checks procedure files (markdown with YAML front-matter) and reports every problem with
file:line:column, severity, rule id, message and a hint. Paths may be files or folders
(default: the procedures folder, see --procedures). Folders are searched for *.md files.

Options:
  --format <human|json|github>  output format (default: human); github prints workflow annotations
  --quiet                 print errors only
  --explain               also print each file's step graph, the proof method, the states explored,
                          its loops and exits, and how each decision splits the signal space
  --base <ref>            judge changes against this git ref (default: HEAD, the last commit)
  --no-history            do not read git history (the revision and status rules stay silent)
  --procedures <dir>      the procedures folder (default: $STEPWRIGHT_PROCEDURES, else 'procedures' in the
                          config file, else procedures/)
  --config <file>         rule severities and per-folder overrides (default: the nearest
                          stepwright.config.yaml from this folder up to the top of the git repository)
  -h, --help              show this help

Exit codes: 0 no errors (warnings allowed), 1 errors found, 2 usage or internal failure.
`;

export async function runCheck(argv: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args: argv,
    allowPositionals: true,
    options: {
      format: { type: 'string', default: 'human' }, quiet: { type: 'boolean', default: false }, explain: { type: 'boolean', default: false }, help: { type: 'boolean', short: 'h' },
      base: { type: 'string' }, 'no-history': { type: 'boolean', default: false }, config: { type: 'string' }, procedures: { type: 'string' },
    },
    strict: true,
  });
  if (values.help) {
    io.stdout.write(checkHelp);
    return 0;
  }
  if (values.format !== 'human' && values.format !== 'json' && values.format !== 'github') throw new UsageError(`Unknown format '${values.format}'; use human, json or github.`);
  const paths = positionals.length ? [...positionals, ...(values.procedures ? [values.procedures] : [])] : [proceduresFolder(io, values)];
  const inputs = readProcedureFiles(paths, io.cwd);
  const configured = loadConfig(io, values.config);
  let history: Awaited<ReturnType<typeof previousFromGit>> = {};
  try {
    if (!values['no-history']) history = await previousFromGit(inputs, io, values.base, paths[0]);
  } catch (error) {
    if (!(error instanceof GitError)) throw error;
    io.stderr.write(`stepwright check: ${error.message}\n`);
    return 2;
  }
  const register = loadRegister(io.cwd, configured.file?.file, configured.config.register);
  const checked = checkSources(inputs, {
    today: todayOf(io), previous: history.previous, severity: configured.policy, register,
    certificationIntervalMonths: configured.config.certificationIntervalMonths, cache: commandCache(io, configured.file?.text),
  });
  const result = { ...checked, diagnostics: [...configured.diagnostics, ...checked.diagnostics] };
  const shown = values.quiet ? result.diagnostics.filter((d) => d.severity === 'error') : result.diagnostics;
  if (values.format === 'json') io.stdout.write(formatJson(shown));
  else if (values.format === 'github') io.stdout.write(formatGithub(shown, (file) => (history.repo ? repoPath(history.repo, resolve(io.cwd, file)) : file)));
  else {
    const texts = new Map(inputs.flatMap((i) => ('text' in i ? [[i.file, i.text] as const] : [])));
    if (configured.file) texts.set(configured.file.file, configured.file.text);
    for (const r of register?.sources ?? []) texts.set(r.file, r.source.text);
    if (values.explain) {
      for (const f of result.files) if (f.facts) io.stdout.write(`== ${f.file}\n${explainSequence(f.facts).join('\n')}\n\n`);
    }
    io.stdout.write(formatHuman(shown, texts, useColour(io, io.stdout)));
    io.stdout.write(summarize(result.diagnostics, inputs.length));
  }
  return result.diagnostics.some((d) => d.severity === 'error') ? 1 : 0;
}
