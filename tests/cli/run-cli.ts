// Runs the CLI in-process with captured output and a fixed clock.
import { main } from '../../src/cli/main.ts';

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
