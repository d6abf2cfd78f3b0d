// The operator manual's Astro project is this folder: pages, components, layouts, styles and browser code
// ship inside the package. The procedures, the output and the caches are the user's; no config file is read
// from the user's folder (nor their tsconfig, .env or public/), so a plant repository needs nothing but procedures.
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { AstroInlineConfig } from 'astro';
import { watchProcedures } from './watch-procedures.ts';

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
}

export function siteConfig(options: SiteConfigOptions): AstroInlineConfig {
  return {
    configFile: false,
    root: siteFolder,
    srcDir: siteFolder,
    // The site has no static files of its own; the service worker and offline list are written after the build.
    publicDir: join(siteFolder, 'public'),
    outDir: options.outDir,
    // Every page link goes through lib/url.ts, which reads this base back from import.meta.env.BASE_URL.
    base: options.base ?? '/',
    cacheDir: options.cacheDir,
    mode: options.mode,
    logLevel: options.logLevel ?? 'error',
    trailingSlash: 'always',
    build: { format: 'directory', inlineStylesheets: 'never' },
    compressHTML: true,
    devToolbar: { enabled: false },
    // Procedure pages are generated from the procedures folder, never from markdown files in the site.
    markdown: {},
    vite: { cacheDir: join(options.cacheDir, 'vite'), plugins: [watchProcedures(options.procedures)] },
  };
}
