// A port already in use is the user's to change: exit 2 with a message naming --port, never "internal failure".
import { mkdirSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from './run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

describe('stepwright serve on a busy port', () => {
  it('exits 2 and names --port', async () => {
    const dir = tempFolder('stepwright-port-');
    mkdirSync(join(dir, 'dist'));
    writeFileSync(join(dir, 'dist', 'index.html'), '<!doctype html><title>x</title>');
    const blocker = createServer();
    await new Promise<void>((done) => blocker.listen(0, '127.0.0.1', () => done()));
    const port = (blocker.address() as { port: number }).port;
    try {
      const r = await runCli(['serve', '--port', String(port), '--host', '127.0.0.1'], dir);
      expect(r.code).toBe(2);
      expect(r.stderr).toContain(`Port ${port} on 127.0.0.1 is already in use`);
      expect(r.stderr).toContain('--port');
      expect(r.stderr).not.toContain('internal failure');
    } finally {
      blocker.close();
    }
  });
});
