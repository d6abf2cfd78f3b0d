// A Vite plugin for `npm run dev`: a saved, added or removed procedure file reloads the open pages.
import { resolve } from 'node:path';

interface DevServer {
  config: { root: string };
  watcher: { add(path: string): unknown; on(event: string, listener: (file: string) => void): unknown };
  ws: { send(payload: { type: 'full-reload'; path?: string }): void };
}

/** A Vite plugin for the dev server: reloads the open pages when a procedure file changes. */
export function watchProcedures(): { name: string; apply: 'serve'; configureServer(server: DevServer): void } {
  return {
    name: 'stepwright-watch-procedures',
    apply: 'serve',
    configureServer(server) {
      const folder = resolve(server.config.root, process.env.STEPWRIGHT_PROCEDURES?.trim() || 'procedures');
      server.watcher.add(folder);
      const reload = (file: string) => {
        if (file.startsWith(folder) && file.endsWith('.md')) server.ws.send({ type: 'full-reload', path: '*' });
      };
      for (const event of ['add', 'change', 'unlink']) server.watcher.on(event, reload);
    },
  };
}
