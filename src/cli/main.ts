// argv → command → exit code. Commands never throw to the user: failures become a message and exit 2.
import { runBuild } from './build-command.ts';
import { runCheck } from './check-command.ts';
import { runDev } from './dev-command.ts';
import { runExport } from './export-command.ts';
import { runInit } from './init-command.ts';
import { runKeygen } from './keygen-command.ts';
import { runNew } from './new-command.ts';
import { runReview } from './review-command.ts';
import { runSchema } from './schema-command.ts';
import { runServe } from './serve-command.ts';
import { runVerify } from './verify-command.ts';
import { UsageError, type CliIo } from './io.ts';

type Command = { summary: string; run: (argv: string[], io: CliIo) => Promise<number> };

export const commands: Record<string, Command> = {
  build: { summary: 'check the procedures and build the operator manual site', run: runBuild },
  check: { summary: 'check procedure files and report problems', run: runCheck },
  dev: { summary: 'live preview of the manual while you write: re-checks and reloads on save', run: runDev },
  export: { summary: 'print one procedure as model JSON or a mermaid flowchart', run: runExport },
  keygen: { summary: 'write a key pair for signing the published manual (never overwrites a key)', run: runKeygen },
  init: { summary: 'set up a plant repository: config, procedures folder, ignore entries, editor settings, CI workflow', run: runInit },
  new: { summary: 'write a new procedure of a given kind, with TODO placeholders', run: runNew },
  review: { summary: 'summarise procedure changes against a git base for a pull request', run: runReview },
  schema: { summary: 'print or write the JSON Schema of the front-matter for editors', run: runSchema },
  serve: { summary: 'serve the built manual on http://localhost:4321', run: runServe },
  verify: { summary: 'check that every page of a published manual matches its procedure source', run: runVerify },
};

function mainHelp(): string {
  const width = Math.max(...Object.keys(commands).map((c) => c.length));
  return `Usage: stepwright <command> [options]

Stepwright writes, checks and publishes operating procedures for process plants.

Commands:
${Object.entries(commands).map(([name, c]) => `  ${name.padEnd(width)}  ${c.summary}`).join('\n')}

Run 'stepwright <command> --help' for a command's options.
`;
}

export async function main(argv: string[], io: CliIo): Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === '-h' || name === 'help') {
    io.stdout.write(mainHelp());
    return name ? 0 : 2;
  }
  if (name === '--version') {
    io.stdout.write('stepwright 0.1.0\n');
    return 0;
  }
  const command = commands[name];
  if (!command) {
    io.stderr.write(`stepwright: unknown command '${name}'.\n\n${mainHelp()}`);
    return 2;
  }
  try {
    return await command.run(rest, io);
  } catch (error) {
    if (error instanceof UsageError || (error as { code?: string }).code?.startsWith?.('ERR_PARSE_ARGS')) {
      io.stderr.write(`stepwright ${name}: ${(error as Error).message}\nRun 'stepwright ${name} --help' for usage.\n`);
      return 2;
    }
    io.stderr.write(`stepwright ${name}: internal failure: ${(error as Error)?.message ?? String(error)}\nThis is a fault in Stepwright; please report it with the input that caused it.\n`);
    return 2;
  }
}
