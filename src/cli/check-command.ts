// `stepwright check [paths…]`: checks procedure files and reports every problem with its place.
import { parseArgs } from 'node:util';
import { formatHuman, formatJson, summarize } from '../render/format-diagnostics.ts';
import { formatGithub } from './format-github.ts';
import { formatSarif } from './format-sarif.ts';
import { GitError, pathInRepository, runCheckRun } from '../engine/check-run.ts';
import { UsageError, useColour, type CliIo } from './io.ts';
import { packageVersion } from './version.ts';
import { checkHelp } from './command-help.ts';
import { withCompilersForSize } from './compile-tiers.ts';
import { startModelThread } from '../analysis/prose/model-thread.ts';

export { checkHelp };

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
    run = await withCompilersForSize((sized) => runCheckRun({
      cwd: io.cwd, env: io.env, now: io.now, stdin: io.stdin, paths: positionals, procedures: values.procedures, config: values.config,
      history: values['no-history'] ? false : { base: values.base }, sized,
      // A check that found a result cache did not start the English model (main.ts): a run with files to check after
      // all (an edit) starts it now, to load on its own thread while the other files are read for the cross-file rules.
      checking: (files) => {
        if (files > 0) startModelThread();
      },
    }));
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
