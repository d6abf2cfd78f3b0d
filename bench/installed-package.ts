// The package as a plant installs it, for the benchmarks that run it: compiled to lib/ and laid out without src/
// (bin/, lib/ and package.json, with the dependencies next to it), so its bin runs the JavaScript as installed.
import { spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync, symlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** Compiles the package and lays it out in a new temporary folder; exits the benchmark when compiling fails. */
export function layOutInstalledPackage(root: string, name: string): { folder: string; bin: string } {
  const compile = spawnSync(process.execPath, [join(root, 'scripts/compile.mjs')], { cwd: root, encoding: 'utf8' });
  if (compile.status !== 0) {
    process.stderr.write(`${name} bench: compiling failed:\n${compile.stdout}${compile.stderr}`);
    process.exit(1);
  }
  const folder = mkdtempSync(join(tmpdir(), `stepwright-${name}-`));
  for (const part of ['bin', 'lib', 'package.json']) cpSync(join(root, part), join(folder, part), { recursive: true });
  symlinkSync(join(root, 'node_modules'), join(folder, 'node_modules'), 'dir');
  return { folder, bin: join(folder, 'bin', 'stepwright.mjs') };
}
