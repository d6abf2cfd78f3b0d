// Writes the licences of the packages whose code a bundle holds, from esbuild's metafile: each package folder the
// bundle took code from, its name, version and licence, and the text of its licence and notice files.
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

/** Writes `licencesFile` for `bundleName` from `metafile` (paths relative to `root`); returns the packages' names. */
export function writeBundleLicences(root, metafile, bundleName, licencesFile) {
  const folders = new Set();
  for (const input of Object.keys(metafile.inputs)) {
    const match = /^(.*node_modules\/(?:@[^/]+\/)?[^/]+)\//.exec(input);
    if (match) folders.add(match[1]);
  }
  const packages = [];
  let licences = `Licences of the packages whose code is in ${bundleName}.\n`;
  for (const folder of [...folders].sort()) {
    const { name, version, license } = JSON.parse(readFileSync(join(root, folder, 'package.json'), 'utf8'));
    packages.push(name);
    licences += `\n${'='.repeat(78)}\n${name} ${version} (${license})\n${'='.repeat(78)}\n`;
    for (const file of readdirSync(join(root, folder)).filter((f) => /^(licen[cs]e|notice)(\.|$)/i.test(f)).sort()) {
      licences += `\n--- ${file} ---\n${readFileSync(join(root, folder, file), 'utf8')}`;
    }
  }
  writeFileSync(licencesFile, licences);
  return packages;
}
