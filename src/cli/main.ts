// argv → command → exit code. Commands never throw to the user: failures become a message and exit 2.
// Each command's module is imported only when that command runs, so `--version` and `--help` start fast
// and load none of the checker, the units, the language model or the site stack.
import { closest, distance } from 'fastest-levenshtein';
import { commandHelp } from './command-help.ts';
import { isUsageError, type CliIo } from './io.ts';
import { packageVersion } from './version.ts';

type Runner = (argv: string[], io: CliIo) => Promise<number>;
type Command = { summary: string; load: () => Promise<Runner> };

export const commands: Record<string, Command> = {
  build: { summary: 'check the procedures and build the operator manual site', load: async () => (await import('./build-command.ts')).runBuild },
  check: { summary: 'check procedure files and report problems', load: async () => (await import('./check-command.ts')).runCheck },
  dev: { summary: 'live preview of the manual while you write: re-checks and reloads on save', load: async () => (await import('./dev-command.ts')).runDev },
  export: { summary: 'print one procedure as model JSON or a mermaid flowchart', load: async () => (await import('./export-command.ts')).runExport },
  keygen: { summary: 'write a key pair for signing the published manual (never overwrites a key)', load: async () => (await import('./keygen-command.ts')).runKeygen },
  init: { summary: 'set up a plant repository: config, procedures folder, ignore entries, editor settings, CI workflow', load: async () => (await import('./init-command.ts')).runInit },
  new: { summary: 'write a new procedure of a given kind, with TODO placeholders', load: async () => (await import('./new-command.ts')).runNew },
  review: { summary: 'summarise procedure changes against a git base for a pull request', load: async () => (await import('./review-command.ts')).runReview },
  schema: { summary: 'print or write the JSON Schema of the front-matter for editors', load: async () => (await import('./schema-command.ts')).runSchema },
  serve: { summary: 'serve the built manual on http://localhost:4321', load: async () => (await import('./serve-command.ts')).runServe },
  verify: { summary: 'check that every page of a published manual matches its procedure source', load: async () => (await import('./verify-command.ts')).runVerify },
};

function mainHelp(): string {
  const width = Math.max(...Object.keys(commands).map((c) => c.length));
  return `Usage: stepwright <command> [options]

Stepwright writes, checks and publishes operating procedures for process plants.

Commands:
${Object.entries(commands).map(([name, c]) => `  ${name.padEnd(width)}  ${c.summary}`).join('\n')}

Run 'stepwright help <command>' or 'stepwright <command> --help' for a command's options.
Run 'stepwright --version' for the version.
`;
}

/** The command a mistyped name most likely meant, when it is close enough to be a fair guess. */
export function suggestCommand(name: string, known: readonly string[] = Object.keys(commands)): string | undefined {
  if (!name || !known.length) return undefined;
  const lower = name.toLowerCase();
  const prefixed = known.filter((k) => k.startsWith(lower));
  if (prefixed.length === 1) return prefixed[0];
  const best = closest(lower, [...known]);
  // At most one edit per three letters (and at least one): 'chek' → check, 'xyz' → nothing.
  return distance(lower, best) <= Math.max(1, Math.floor(best.length / 3)) ? best : undefined;
}

function unknownCommand(name: string, io: CliIo, context = ''): number {
  const guess = suggestCommand(name);
  io.stderr.write(`stepwright: unknown command '${name}'${context}.${guess ? ` Did you mean '${guess}'?` : ''}\n\n${mainHelp()}`);
  return 2;
}

/**
 * A check with no result cache to answer from (none yet, or STEPWRIGHT_CACHE=off) reads every file's prose with the
 * English model: its load starts now on a second thread, beside loading the checker and reading the files. A check
 * that finds a cache may find every answer there and need no model: it starts the thread only once it knows that
 * some files were edited (check-command.ts), so a quick check of an unchanged manual is not slowed by a thread it does
 * not use. `build` starts the thread in any
 * case: a rebuild after an edit reads the edited file's prose, and the main thread is busy for seconds reading the
 * others for the cross-file rules while the second core would wait (it stops the thread once the check is done,
 * before the pages are built).
 */
async function startEnglishModelEarly(io: CliIo, command: string): Promise<void> {
  const { resultCacheHoldsEntries } = await import('../engine/cache-folder.ts');
  if (command !== 'build' && resultCacheHoldsEntries(io)) return;
  (await import('../analysis/prose/model-thread.ts')).startModelThread();
}

export async function main(argv: string[], io: CliIo): Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === '-h') {
    io.stdout.write(mainHelp());
    return name ? 0 : 2;
  }
  if (name === 'help') {
    const topic = rest[0];
    if (!topic) {
      io.stdout.write(mainHelp());
      return 0;
    }
    if (!Object.hasOwn(commands, topic)) return unknownCommand(topic, io);
    io.stdout.write(commandHelp[topic]);
    return 0;
  }
  if (name === '--version' || name === '-v' || name === 'version') {
    io.stdout.write(`stepwright ${packageVersion()}\n`);
    return 0;
  }
  const command = Object.hasOwn(commands, name) ? commands[name] : undefined;
  if (!command) return unknownCommand(name, io);
  // A command's help alone is printed without loading the command.
  if (rest.length === 1 && (rest[0] === '--help' || rest[0] === '-h') && Object.hasOwn(commandHelp, name)) {
    io.stdout.write(commandHelp[name]);
    return 0;
  }
  try {
    if (name === 'check' || name === 'build') await startEnglishModelEarly(io, name);
    const run = await command.load();
    return await run(rest, io);
  } catch (error) {
    if (isUsageError(error) || (error as { code?: string }).code?.startsWith?.('ERR_PARSE_ARGS')) {
      io.stderr.write(`stepwright ${name}: ${(error as Error).message}\nRun 'stepwright help ${name}' for usage.\n`);
      return 2;
    }
    io.stderr.write(`stepwright ${name}: internal failure: ${(error as Error)?.message ?? String(error)}\nThis is a fault in Stepwright; please report it with the input that caused it.\n`);
    return 2;
  }
}
