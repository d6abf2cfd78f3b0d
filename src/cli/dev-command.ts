// `stepwright dev [folder]`: the live preview. Serves the manual from the procedures as they are on disk;
// a saved procedure reloads the open pages, and check findings show on the pages instead of stopping them.
import { existsSync, lstatSync, mkdirSync, readlinkSync, symlinkSync, unlinkSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { createServer } from 'node:net';
import { parseArgs } from 'node:util';
import { siteConfig, siteFolder } from '../site/astro-config.ts';
import { livePreviewVariable, siteBaseVariable } from '../site-data/site-mode.ts';
import { UsageError, type CliIo } from './io.ts';
import { proceduresFolder, projectFolder } from './project.ts';
import { listenProblem } from './serve-command.ts';
import { linkPackages } from './package-links.ts';
import { siteBase } from '../engine/project.ts';
import { devHelp } from './command-help.ts';

export { devHelp };

export async function runDev(argv: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args: argv,
    allowPositionals: true,
    options: { port: { type: 'string', default: '4321' }, host: { type: 'string', default: 'localhost' }, help: { type: 'boolean', short: 'h' },
      procedures: { type: 'string' }, config: { type: 'string' }, base: { type: 'string' }, 'cache-dir': { type: 'string' },
    },
    strict: true,
  });
  if (values.help) {
    io.stdout.write(devHelp);
    return 0;
  }
  const port = Number(values.port);
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new UsageError(`--port must be a whole number from 0 to 65535, not '${values.port}'.`);
  if (positionals.length > 1 || (positionals.length && values.procedures)) throw new UsageError('Give one procedures folder.');
  const folder = positionals[0] ?? proceduresFolder(io, values);
  if (values.config && !existsSync(resolve(io.cwd, values.config))) throw new UsageError(`The configuration file '${values.config}' does not exist.`);
  const base = siteBase(io, values);
  // A port another program holds is the user's to change, as in `serve`: a usage error that names --port.
  // Checked before Astro starts, and Vite is told not to move on to the next free port, so a preview never
  // starts quietly on another port than the one asked for (the command would then wait on it for ever).
  await portFree(port, values.host);
  // The pages read the procedures folder and the configuration from the environment.
  process.env.STEPWRIGHT_PROCEDURES = folder;
  process.env.STEPWRIGHT_CONFIG = values.config ? resolve(io.cwd, values.config) : '';
  process.env[siteBaseVariable] = base;
  process.env[livePreviewVariable] = '1';
  process.env.ASTRO_TELEMETRY_DISABLED = '1';
  const { dev } = await import('astro');
  // Astro's project root is a folder of the user's: its `.astro/` (types, data store, lock file) and the
  // caches go there, never into the site folder inside the installed package.
  const root = values['cache-dir'] !== undefined ? resolve(io.cwd, values['cache-dir']) : join(projectFolder(io, values), '.stepwright', 'dev');
  const code = linkSiteCode(root);
  const config = siteConfig({
    root,
    srcDir: join(code, basename(siteFolder)),
    outDir: join(root, 'out'),
    cacheDir: join(root, 'cache'),
    procedures: resolve(io.cwd, folder),
    mode: 'development',
    base,
    logLevel: 'warn',
  });
  let server: Awaited<ReturnType<typeof dev>>;
  try {
    server = await dev({ ...config, server: { port, host: values.host }, vite: { ...config.vite, server: { ...config.vite?.server, strictPort: true } } });
  } catch (error) {
    if (error instanceof Error && /^Port \d+ is already in use$/.test(error.message)) throw listenProblem(Object.assign(new Error(error.message), { code: 'EADDRINUSE' }), port, values.host)!;
    throw listenProblem(error, port, values.host) ?? error;
  }
  const host = server.address.address.includes(':') ? `[${server.address.address}]` : server.address.address;
  io.stdout.write(`Live preview of ${folder}/ on http://${values.host === 'localhost' ? 'localhost' : host}:${server.address.port}${base} (Ctrl+C stops it).\n`);
  // Vite ends the process on SIGTERM with exit code 143 before the server has stopped; a stop asked for is a
  // clean stop here, the same as Ctrl+C: the server closes, then the command returns 0.
  process.removeAllListeners('SIGTERM');
  await new Promise<void>((done) => {
    const stop = () => {
      process.off('SIGINT', stop);
      process.off('SIGTERM', stop);
      server.stop().finally(done);
    };
    process.on('SIGINT', stop);
    process.on('SIGTERM', stop);
  });
  return 0;
}

/** Binds the port for a moment and lets it go; a port that cannot be taken is a usage error naming --port. */
async function portFree(port: number, host: string): Promise<void> {
  if (port === 0) return;
  const probe = createServer();
  await new Promise<void>((done, fail) => {
    probe.once('error', (error) => fail(listenProblem(error, port, host) ?? error));
    probe.listen(port, host, () => probe.close(() => done()));
  });
}

/**
 * A link in the preview's root to the package's code (the folder holding the site and the modules its pages
 * import), so Astro finds its pages inside its own root and writes `.astro/` there, not into the package.
 */
function linkSiteCode(root: string): string {
  mkdirSync(root, { recursive: true });
  const link = join(root, 'code');
  const target = dirname(siteFolder.replace(/[\\/]+$/, ''));
  const existing = lstatSync(link, { throwIfNoEntry: false });
  if (existing && !existing.isSymbolicLink()) {
    // Never remove something of the user's: a folder chosen with --cache-dir may hold a real 'code'.
    throw new UsageError(`${link} exists and is not the preview's link to its pages; choose another folder with --cache-dir.`);
  }
  if (!existing || readlinkSync(link) !== target) {
    if (existing) unlinkSync(link);
    symlinkSync(target, link, 'junction');
  }
  // Modules reached through the link are resolved from the root upward: run through npx, nothing is installed
  // above it and every page request waited for ever.
  linkPackages(root);
  return link;
}

