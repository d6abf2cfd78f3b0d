// Indexes a built site for search. Pages are added one by one in sorted order: the index depends on the
// order pages are added, and a folder listing's order differs between file systems (ext4, tmpfs, ...).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { siteFiles } from './site-manifest.ts';

export async function indexSite(dir: string): Promise<void> {
  const pagefind = await import('pagefind');
  try {
    const { index, errors } = await pagefind.createIndex({});
    if (!index) throw new Error(`pagefind: ${errors.join('; ')}`);
    for (const path of siteFiles(dir).filter((p) => p.endsWith('.html'))) {
      const added = await index.addHTMLFile({ sourcePath: path, content: readFileSync(join(dir, ...path.split('/')), 'utf8') });
      if (added.errors.length) throw new Error(`pagefind: ${path}: ${added.errors.join('; ')}`);
    }
    const written = await index.writeFiles({ outputPath: join(dir, 'pagefind') });
    if (written.errors.length) throw new Error(`pagefind: ${written.errors.join('; ')}`);
  } finally {
    await pagefind.close();
  }
}
