// Astro writes modules of its own (the preview's pages, the build's prerender chunks) into folders of the
// user's, and those modules import the packages Stepwright depends on, found from their folder upward. With
// Stepwright installed in the plant's repository that works; run through npx, nothing is installed there.
// A folder of ours then gets a `node_modules` link to the folder that holds the installed package.
import { existsSync, lstatSync, readlinkSync, symlinkSync, unlinkSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { siteFolder } from '../site/astro-config.ts';

/**
 * The node_modules folder holding the installed package; in a development checkout, the checkout's own
 * (so a checkout can build a folder anywhere); undefined when neither exists.
 */
export function packagesHolder(): string | undefined {
  const packageRoot = dirname(dirname(siteFolder.replace(/[\\/]+$/, '')));
  const holder = dirname(packageRoot);
  if (basename(holder) === 'node_modules') return holder;
  const own = join(packageRoot, 'node_modules');
  return existsSync(join(own, 'astro', 'package.json')) ? own : undefined;
}

/** Whether modules written into `folder` find the packages the site needs, from there upward. */
export function packagesReachableFrom(folder: string): boolean {
  for (let dir = folder; ; dir = dirname(dir)) {
    if (existsSync(join(dir, 'node_modules', 'astro', 'package.json'))) return true;
    if (dirname(dir) === dir) return false;
  }
}

/**
 * Gives `folder` a `node_modules` link to the packages, when the package is installed in a node_modules folder.
 * An entry of that name that is not such a link is the user's and is left alone.
 */
export function linkPackages(folder: string): void {
  const holder = packagesHolder();
  if (!holder) return;
  const link = join(folder, 'node_modules');
  const existing = lstatSync(link, { throwIfNoEntry: false });
  if (existing && !existing.isSymbolicLink()) return;
  if (existing && readlinkSync(link) === holder) return;
  if (existing) unlinkSync(link);
  symlinkSync(holder, link, 'junction');
}
