// `stepwright dev` on a port another program holds: exit 2 with a message naming --port, the same as `serve`,
// never a preview quietly started on some other port and never an "internal failure".
import { mkdirSync } from 'node:fs';
import { createServer } from 'node:net';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from './run-cli.ts';
import { tempFolder } from '../temp-folder.ts';

describe('stepwright dev on a busy port', () => {
  it('exits 2 and names --port', { timeout: 120_000 }, async () => {
    const dir = tempFolder('stepwright-dev-port-');
    mkdirSync(join(dir, 'procedures'));
    const blocker = createServer();
    await new Promise<void>((done) => blocker.listen(0, '127.0.0.1', () => done()));
    const port = (blocker.address() as { port: number }).port;
    try {
      const r = await runCli(['dev', '--port', String(port), '--host', '127.0.0.1'], dir);
      expect(r.code).toBe(2);
      expect(r.stderr).toContain(`Port ${port} on 127.0.0.1 is already in use`);
      expect(r.stderr).toContain('--port');
      expect(r.stderr).not.toContain('internal failure');
      expect(r.stdout).not.toContain('Live preview');
    } finally {
      blocker.close();
    }
  });
});
