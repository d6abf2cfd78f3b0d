// `stepwright check [paths…]`: checks procedure files and reports every problem with its place.
import { parseArgs } from 'node:util';
import { formatHuman, formatJson, summarize } from '../render/format-diagnostics.ts';
import { formatGithub } from './format-github.ts';
import { formatSarif } from './format-sarif.ts';
import { GitError, pathInRepository, runCheckRun } from '../engine/check-run.ts';
import { UsageError, useColour, type CliIo } from './io.ts';
import { packageVersion } from './version.ts';

export const checkHelp = `Usage: stepwright check [options] [paths…]

Checks procedure files (markdown with YAML front-matter) and reports every problem with
file:line:column, severity, rule id, message and a hint. Paths may be files or folders
(default: the procedures folder, see --procedures), globs such as 'procedures/**/pump-*.md', or '-' for one procedure on
standard input. Folders and globs are searched for *.md files; markdown there that is not a
procedure (no front-matter and no procedure keys, e.g. a README) is skipped with an info line.

Options:
  --format <human|json|github|sarif>  output format (default: human); github prints workflow
                          annotations, sarif a SARIF 2.1.0 log for code-scanning views
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
  const format = values.format;
  if (format !== 'human' && format !== 'json' && format !== 'github' && format !== 'sarif') throw new UsageError(`Unknown format '${format}'; use human, json, github or sarif.`);
  let run;
  try {
    run = await runCheckRun({
      cwd: io.cwd, env: io.env, now: io.now, stdin: io.stdin, paths: positionals, procedures: values.procedures, config: values.config,
      history: values['no-history'] ? false : { base: values.base },
    });
  } catch (error) {
    if (!(error instanceof GitError)) throw error;
    io.stderr.write(`stepwright check: ${error.message}\n`);
    return 2;
  }
  const all = run.diagnostics;
  const shown = values.quiet ? all.filter((d) => d.severity === 'error') : all;
  const pathOf = (file: string) => pathInRepository(run, io.cwd, file);
  if (format === 'json') io.stdout.write(formatJson(shown));
  else if (format === 'github') io.stdout.write(formatGithub(shown, pathOf));
  else if (format === 'sarif') {
    const { rules } = await import('../check/rules/index.ts');
    const summaries = new Map<string, string>(Object.values(rules).map((r) => [r.meta.id, r.meta.summary]));
    io.stdout.write(formatSarif(shown, { version: packageVersion(), pathOf, describe: (id) => summaries.get(id) }));
  } else {
    if (values.explain) {
      const { explainSequence } = await import('../analysis/soundness/explain.ts');
      for (const f of run.result.files) if (f.facts) io.stdout.write(`== ${f.file}\n${explainSequence(f.facts).join('\n')}\n\n`);
    }
    io.stdout.write(formatHuman(shown, run.texts, useColour(io, io.stdout)));
    io.stdout.write(summarize(all, run.inputs.length));
  }
  return run.errors > 0 ? 1 : 0;
}
