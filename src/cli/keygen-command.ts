// `stepwright keygen [folder]`: writes a new ed25519 key pair for signing the published manual's manifest.
import { join, relative, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import type { CliIo } from './io.ts';
import { privateKeyFile, publicKeyFile, writeKeyPair } from './site-manifest.ts';
import { keygenHelp } from './command-help.ts';
import { shellWord } from '../model/shell-word.ts';

export { keygenHelp };

export async function runKeygen(argv: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseArgs({ args: argv, allowPositionals: true, options: { help: { type: 'boolean', short: 'h' } }, strict: true });
  if (values.help) {
    io.stdout.write(keygenHelp);
    return 0;
  }
  const folder = resolve(io.cwd, positionals[0] ?? '.');
  const privatePath = join(folder, privateKeyFile);
  const publicPath = join(folder, publicKeyFile);
  const show = (p: string) => relative(io.cwd, p) || p;
  try {
    writeKeyPair(privatePath, publicPath);
  } catch (error) {
    const e = error as NodeJS.ErrnoException;
    io.stderr.write(e.code === 'EEXIST'
      ? `stepwright keygen: ${e.path ? show(e.path) : 'a key file'} already exists; no key was written or replaced. Move the old pair away first if you mean to replace it.\n`
      : `stepwright keygen: the key pair could not be written: ${e.message}\n`);
    return 1;
  }
  io.stdout.write(`Wrote ${show(privatePath)} (private: keep it secret, never commit it) and ${show(publicPath)} (public).\n`
    + `Sign builds with: stepwright build --sign-key ${shellWord(show(privatePath))}\nVerify with:      stepwright verify --public-key ${shellWord(show(publicPath))} <site>\n`);
  return 0;
}
