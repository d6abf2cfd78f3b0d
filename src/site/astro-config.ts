// The operator manual's Astro project is this folder: pages, components, layouts, styles and browser code
// ship inside the package. The procedures, the output and the caches are the user's; no config file is read
// from the user's folder (nor their tsconfig, .env or public/), so a plant repository needs nothing but procedures.
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { AstroInlineConfig } from 'astro';
import { watchProcedures } from './watch-procedures.ts';
import { engineOutside } from './engine-outside.ts';
import { drawnPages, type DrawnPageListener } from './drawn-pages.ts';

/** The site's own folder inside the package (src/site in a checkout, its compiled copy in the package). */
export const siteFolder = fileURLToPath(new URL('.', import.meta.url));

export interface SiteConfigOptions {
  /** Where the pages go (absolute). */
  outDir: string;
  /** Vite and Astro caches (absolute), in the user's project, never inside the package. */
  cacheDir: string;
  /** The user's procedures folder (absolute); the live preview reloads when a file in it changes. */
  procedures: string;
  mode: 'production' | 'development';
  /** The path the manual is served under: "/" or e.g. "/manual/" (model/site-base.ts). */
  base?: string;
  logLevel?: AstroInlineConfig['logLevel'];
  /**
   * Astro's project root, where its dev server writes `.astro/` (types, data store, lock file). Default: the
   * site folder, fine for a build (it writes nothing there). The live preview puts it in the user's cache
   * folder, so an installed, read-only package works.
   */
  root?: string;
  /** The site folder as Astro sees it (default: the site folder); the preview uses a link to it under `root`. */
  srcDir?: string;
  /** A build's hand on every page as it is drawn, before Astro writes it (drawn-pages.ts). */
  drawn?: DrawnPageListener;
}

/** Folders the live preview may serve files from: the site's code, the user's folder and the installed packages. */
function servedFolders(root: string): string[] {
  const folders = [root, dirname(siteFolder), process.cwd()];
  try {
    // The node_modules folder that holds Astro (and the browser code the pages import).
    folders.push(dirname(dirname(createRequire(import.meta.url).resolve('astro/package.json'))));
  } catch {
    // Astro not resolvable from here: the dev server would not start anyway.
  }
  return folders;
}

export function siteConfig(options: SiteConfigOptions): AstroInlineConfig {
  return {
    configFile: false,
    root: options.root ?? siteFolder,
    srcDir: options.srcDir ?? siteFolder,
    // The site has no static files of its own; the service worker and offline list are written after the build.
    publicDir: join(siteFolder, 'public'),
    outDir: options.outDir,
    // Every page link goes through lib/url.ts, which reads this base back from import.meta.env.BASE_URL.
    base: options.base ?? '/',
    cacheDir: options.cacheDir,
    mode: options.mode,
    logLevel: options.logLevel ?? 'error',
    trailingSlash: 'always',
    // Two pages at a time: one is rendered while the other is written out. Measured on 2,000 procedures (2 cores,
    // three runs each, interleaved): pages in 17.9 s against 21.9 s one at a time; four at a time 18.9 s. The pages
    // come out byte for byte the same.
    build: { format: 'directory', inlineStylesheets: 'never', concurrency: 2 },
    compressHTML: true,
    devToolbar: { enabled: false },
    integrations: options.drawn ? [drawnPages(options.drawn, options.base ?? '/')] : [],
    // Procedure pages are generated from the procedures folder, never from markdown files in the site.
    markdown: {},
    vite: {
      cacheDir: join(options.cacheDir, 'vite'),
      plugins: [watchProcedures(options.procedures), engineOutside(siteFolder)],
      // Under a root of the user's, the site is reached through a link: modules keep the linked paths so
      // Astro sees them inside its root.
      ...(options.root ? { server: { fs: { allow: servedFolders(options.root) } }, resolve: { preserveSymlinks: true } } : {}),
    },
  };
}
