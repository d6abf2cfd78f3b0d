// `stepwright serve`: a small static file server for the built manual (gzip when the browser asks for it).
import { createServer, type Server } from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize, resolve, sep } from 'node:path';
import { gzipSync } from 'node:zlib';
import { parseArgs } from 'node:util';
import { UsageError, type CliIo } from './io.ts';
import { defaultOutputFolder, siteBase } from '../engine/project.ts';
import { parseBase } from '../model/site-base.ts';
import { serveHelp } from './command-help.ts';
import { shellWord } from '../model/shell-word.ts';

export { serveHelp };

const types: Record<string, string> = {
  '.html': 'text/html; charset=utf-8', '.css': 'text/css; charset=utf-8', '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8', '.json': 'application/json', '.svg': 'image/svg+xml', '.png': 'image/png',
  '.ico': 'image/x-icon', '.webmanifest': 'application/manifest+json', '.wasm': 'application/wasm', '.txt': 'text/plain; charset=utf-8',
  '.woff2': 'font/woff2',
};
const compressible = /^(text\/|application\/(json|manifest\+json)|image\/svg)/;

export async function startStaticServer(dir: string, port: number, host = 'localhost', base = '/'): Promise<{ server: Server; url: string }> {
  const root = resolve(dir);
  const server = createServer(async (req, res) => {
    try {
      const requested = new URL(req.url ?? '/', 'http://x').pathname;
      // Under a base (e.g. /manual/) the folder is served there; the bare base and the root lead to it.
      if (base !== '/' && !requested.startsWith(base)) {
        if (requested === '/' || `${requested}/` === base) {
          res.writeHead(301, { location: base }).end();
          return;
        }
        res.writeHead(404, { 'content-type': 'text/plain; charset=utf-8' }).end(`Not found: the manual is served under ${base}`);
        return;
      }
      const path = decodeURIComponent(`/${requested.slice(base.length)}`);
      let file = normalize(join(root, path));
      if (file !== root && !file.startsWith(root + sep)) {
        res.writeHead(403).end('Forbidden');
        return;
      }
      let info = await stat(file).catch(() => null);
      if (info?.isDirectory()) {
        if (!path.endsWith('/')) {
          res.writeHead(301, { location: `${requested}/` }).end();
          return;
        }
        file = join(file, 'index.html');
        info = await stat(file).catch(() => null);
      }
      if (!info?.isFile()) {
        const notFound = await readFile(join(root, '404.html')).catch(() => Buffer.from('Not found'));
        res.writeHead(404, { 'content-type': 'text/html; charset=utf-8' }).end(notFound);
        return;
      }
      const type = types[extname(file)] ?? 'application/octet-stream';
      let body = await readFile(file);
      const headers: Record<string, string> = { 'content-type': type, 'cache-control': 'no-cache' };
      if (compressible.test(type) && /\bgzip\b/.test(String(req.headers['accept-encoding'] ?? ''))) {
        body = gzipSync(body);
        headers['content-encoding'] = 'gzip';
        headers.vary = 'accept-encoding';
      }
      res.writeHead(200, headers).end(req.method === 'HEAD' ? undefined : body);
    } catch {
      res.writeHead(500).end('Server error');
    }
  });
  await new Promise<void>((done, fail) => {
    server.once('error', fail);
    server.listen(port, host, () => done());
  });
  const address = server.address();
  const actual = typeof address === 'object' && address ? address.port : port;
  return { server, url: `http://${host}:${actual}${base}` };
}

export async function runServe(argv: string[], io: CliIo): Promise<number> {
  const { values } = parseArgs({
    args: argv,
    options: {
      dir: { type: 'string' }, port: { type: 'string', default: '4321' }, host: { type: 'string', default: 'localhost' },
      base: { type: 'string' }, config: { type: 'string' }, help: { type: 'boolean', short: 'h' },
    },
    strict: true,
  });
  if (values.help) {
    io.stdout.write(serveHelp);
    return 0;
  }
  const port = Number(values.port);
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new UsageError(`'${values.port}' is not a port number.`);
  // Default: dist/ of the project (beside the configuration file, else at the top of the repository).
  const named = values.dir ?? defaultOutputFolder(io, values);
  const dir = resolve(io.cwd, named);
  const base = values.base !== undefined ? siteBase(io, values) : ((await builtFor(dir)) ?? siteBase(io, values));
  if (!(await stat(join(dir, 'index.html')).catch(() => null))) {
    // The build writes into dist/ unless told otherwise: name the folder this serve looks in.
    const build = values.dir === undefined || values.dir.replace(/[\\/]+$/, '') === 'dist' ? 'stepwright build' : `stepwright build --out ${shellWord(values.dir)}`;
    io.stderr.write(`stepwright serve: no built manual in ${named}/; run '${build}' first.\n`);
    return 1;
  }
  let url: string;
  try {
    ({ url } = await startStaticServer(dir, port, values.host, base));
  } catch (error) {
    throw listenProblem(error, port, values.host) ?? error;
  }
  io.stdout.write(`Serving the manual from ${named}/ on ${url} (Ctrl+C stops).\n`);
  await new Promise(() => {});
  return 0;
}

/** The path a Stepwright build recorded for its site ("/" when built for the root); undefined when there is no record. */
export async function builtFor(dir: string): Promise<string | undefined> {
  let record: unknown;
  try {
    record = JSON.parse(await readFile(join(dir, 'offline-manifest.json'), 'utf8'));
  } catch {
    return undefined;
  }
  if (!record || typeof record !== 'object' || typeof (record as { version?: unknown }).version !== 'string') return undefined;
  const base = (record as { base?: unknown }).base;
  if (base === undefined) return '/';
  const parsed = typeof base === 'string' ? parseBase(base) : undefined;
  return parsed && 'base' in parsed ? parsed.base : undefined;
}

/** A port or host the server cannot take is the user's to change: a usage error that names the option. */
export function listenProblem(error: unknown, port: number, host: string): UsageError | undefined {
  const code = (error as NodeJS.ErrnoException)?.code;
  if (code === 'EADDRINUSE') return new UsageError(`Port ${port} on ${host} is already in use by another program. Choose another with --port <n> (--port 0 picks a free one), or stop the other program.`);
  if (code === 'EACCES') return new UsageError(`Port ${port} on ${host} needs administrator rights. Choose a port above 1023 with --port <n>.`);
  if (code === 'EADDRNOTAVAIL' || code === 'ENOTFOUND') return new UsageError(`Cannot listen on host '${host}': no such address on this machine. Check --host.`);
  return undefined;
}
