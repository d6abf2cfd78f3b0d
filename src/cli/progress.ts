// Shows a long command's progress on a terminal: one line per phase, with a count when there is one.
// Writes nothing when the stream is not a terminal (CI logs, pipes, tests), so output stays as it was.
import type { OutputStream } from './io.ts';

export interface Progress {
  phase(name: string): void;
  done(detail?: string): void;
  fail(): void;
}

export function buildProgress(stream: OutputStream): Progress {
  if (stream.isTTY !== true) return { phase() {}, done() {}, fail() {} };
  let current: { name: string; started: number } | undefined;
  let index = 0;
  const end = (text: string) => {
    if (!current) return;
    const seconds = ((performance.now() - current.started) / 1000).toFixed(1);
    stream.write(`\r\x1b[K  [${index}] ${current.name}: ${text} (${seconds} s)\n`);
    current = undefined;
  };
  return {
    phase(name) {
      end('done');
      index += 1;
      current = { name, started: performance.now() };
      stream.write(`  [${index}] ${name}…`);
    },
    done(detail) {
      end(detail ?? 'done');
    },
    fail() {
      end('failed');
    },
  };
}
