// Runs `stepwright build` in a child process, as a user would, so a test can time it, wait for it or kill it.
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';

export const repo = join(import.meta.dirname, '../..');

export interface BuildRun {
  child: ChildProcess;
  done: Promise<{ code: number | null; signal: NodeJS.Signals | null; stdout: string; stderr: string }>;
}

export function startBuild(procedures: string, out: string, env: Record<string, string> = {}): BuildRun {
  // Our own process group, so a SIGKILL reaches every process the build started.
  const child = spawn(process.execPath, ['bin/stepwright.mjs', 'build', procedures, '--out', out], {
    cwd: repo, env: { ...process.env, NO_COLOR: '1', ...env }, detached: true, stdio: ['ignore', 'pipe', 'pipe'],
  });
  let stdout = '';
  let stderr = '';
  child.stdout!.on('data', (d) => (stdout += d));
  child.stderr!.on('data', (d) => (stderr += d));
  const done = new Promise<{ code: number | null; signal: NodeJS.Signals | null; stdout: string; stderr: string }>((resolve) => {
    child.on('close', (code, signal) => resolve({ code, signal, stdout, stderr }));
  });
  return { child, done };
}

export async function build(procedures: string, out: string, env: Record<string, string> = {}): Promise<string> {
  const run = await startBuild(procedures, out, env).done;
  if (run.code !== 0) throw new Error(`stepwright build failed (exit ${run.code}, signal ${run.signal}):\n${run.stdout}\n${run.stderr}`);
  return run.stdout;
}
