// Post-build step (after pagefind): writes the service worker and offline manifest for everything in the built site.
import { readdir, readFile, writeFile } from 'node:fs/promises';
import { join, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { offlineManifest, serviceWorkerSource, type BuiltFile, type OfflineManifest } from '../render/offline-manifest.ts';

const workerCodeFile = fileURLToPath(new URL('../site/client/service-worker.js', import.meta.url));

export interface OfflineCopySummary extends OfflineManifest {
  builtAt: string;
}

export async function writeOfflineCopy(siteDir: string, options: { now: Date }): Promise<OfflineCopySummary> {
  const files: BuiltFile[] = [];
  for (const entry of await readdir(siteDir, { recursive: true, withFileTypes: true })) {
    if (!entry.isFile()) continue;
    const full = join(entry.parentPath, entry.name);
    files.push({ path: relative(siteDir, full).split(sep).join('/'), bytes: await readFile(full) });
  }
  const manifest = offlineManifest(files);
  const builtAt = options.now.toISOString();
  await writeFile(join(siteDir, 'sw.js'), serviceWorkerSource(manifest, await readFile(workerCodeFile, 'utf8')));
  await writeFile(join(siteDir, 'offline-manifest.json'), `${JSON.stringify({ version: manifest.version, builtAt, files: manifest.files.length, bytes: manifest.bytes })}\n`);
  return { ...manifest, builtAt };
}
