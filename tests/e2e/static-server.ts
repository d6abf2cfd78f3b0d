// The one small static file server of the browser tests: serves a built manual from a folder that can be
// swapped (a newer publication), can replace single responses, logs requests, and can drop the network.
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize } from 'node:path';

const types: Record<string, string> = {
  '.html': 'text/html; charset=utf-8', '.js': 'text/javascript', '.mjs': 'text/javascript', '.css': 'text/css',
  '.json': 'application/json', '.svg': 'image/svg+xml', '.png': 'image/png', '.wasm': 'application/wasm',
  '.woff2': 'font/woff2', '.ico': 'image/x-icon', '.txt': 'text/plain',
};

export interface SiteServer {
  url: string;
  /** Serve another folder from now on (the next publication). */
  serve(dir: string): void;
  /** Replace a response body by path (e.g. a newer offline-manifest.json) for the next requests. */
  override: Map<string, string>;
  /** Every request path, in order. */
  requests: string[];
  /** Requests the service worker made to save files (marked with its x-stepwright-offline header), by path. */
  saved: string[];
  /** After this many more saving requests, every request fails (the connection is cut); null: never. */
  dropAfter: number | null;
  /** True while the network is down (every request's connection is cut). */
  down: boolean;
  close(): Promise<void>;
}

/** Serves `first`; on `port` when given (the same origin as an earlier server there), else on a free port. */
export async function serveSite(first: string, port = 0): Promise<SiteServer> {
  let dir = first;
  const state: SiteServer = {
    url: '', override: new Map(), requests: [], saved: [], dropAfter: null, down: false,
    serve(next) { dir = next; },
    close: () => new Promise<void>((resolve) => { server.closeAllConnections(); server.close(() => resolve()); }),
  };
  const handle = async (req: IncomingMessage, res: ServerResponse) => {
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
    const saving = req.headers['x-stepwright-offline'] !== undefined;
    if (saving && state.dropAfter !== null && !state.down) {
      if (state.dropAfter <= 0) state.down = true;
      else state.dropAfter--;
    }
    if (state.down) {
      req.socket.destroy();
      return;
    }
    state.requests.push(path);
    if (saving) state.saved.push(path);
    const replaced = state.override.get(path);
    if (replaced !== undefined) {
      res.writeHead(200, { 'content-type': types[extname(path)] ?? 'application/octet-stream', 'cache-control': 'no-cache' });
      res.end(replaced);
      return;
    }
    let file = join(dir, normalize(path).replace(/^(\.\.[/\\])+/, ''));
    try {
      if ((await stat(file)).isDirectory()) file = join(file, 'index.html');
      const body = await readFile(file);
      res.writeHead(200, { 'content-type': types[extname(file)] ?? 'application/octet-stream', 'cache-control': 'no-cache' });
      res.end(body);
    } catch {
      res.writeHead(404, { 'content-type': 'text/plain' });
      res.end('not found');
    }
  };
  const server: Server = createServer((req, res) => { void handle(req, res); });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', resolve);
  });
  const address = server.address();
  // localhost, not 127.0.0.1: service workers need a secure context, and localhost counts as one.
  state.url = `http://localhost:${typeof address === 'object' && address ? address.port : 0}`;
  return state;
}
