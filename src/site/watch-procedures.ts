// A Vite plugin for the live preview (`stepwright dev`): a saved, added or removed procedure file reloads the open pages.
import { sep } from 'node:path';
import { isMarkdownName } from '../engine/markdown-name.ts';

interface DevServer {
  watcher: { add(path: string): unknown; on(event: string, listener: (file: string) => void): unknown };
  ws: { send(payload: { type: 'full-reload'; path?: string }): void };
}

/** Watches `folder` (an absolute path: the user's procedures, which lie outside the site's own folder). */
export function watchProcedures(folder: string): { name: string; apply: 'serve'; configureServer(server: DevServer): void } {
  const inside = folder.endsWith(sep) ? folder : folder + sep;
  return {
    name: 'stepwright-watch-procedures',
    apply: 'serve',
    configureServer(server) {
      server.watcher.add(folder);
      const reload = (file: string) => {
        if (file.startsWith(inside) && isMarkdownName(file)) server.ws.send({ type: 'full-reload', path: '*' });
      };
      for (const event of ['add', 'change', 'unlink']) server.watcher.on(event, reload);
    },
  };
}
