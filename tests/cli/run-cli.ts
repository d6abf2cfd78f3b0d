// Runs the CLI in-process with captured output and a fixed clock.
import { main } from '../../src/cli/main.ts';

// Commands load their modules on first use; load the checker here, with the test file, so the first test's
// time limit does not pay for it on a busy machine.
await import('../../src/cli/check-command.ts');

export async function runCli(argv: string[], cwd = process.cwd()) {
  let stdout = '';
  let stderr = '';
  const code = await main(argv, {
    stdout: { write: (t: string) => (stdout += t), isTTY: false },
    stderr: { write: (t: string) => (stderr += t), isTTY: false },
    cwd,
    env: { STEPWRIGHT_TODAY: '2026-12-01' },
  });
  return { code, stdout, stderr };
}
