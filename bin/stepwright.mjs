#!/usr/bin/env node
// Entry point for the `stepwright` command. The published package runs its compiled JavaScript (lib/);
// a development checkout (src/ next to this folder) runs the TypeScript sources directly, so it never
// runs a stale compile. Written for any Node version so that an old one gets a clear message.
import { existsSync } from 'node:fs';
import module from 'node:module';

const needed = [22, 12];
const [major, minor] = process.versions.node.split('.').map(Number);
if (major < needed[0] || (major === needed[0] && minor < needed[1])) {
  process.stderr.write(`stepwright needs Node.js ${needed.join('.')} or later; this is Node.js ${process.versions.node} (${process.execPath}).\nInstall a current Node.js LTS release and run the command again.\n`);
  process.exit(2);
}

// Node keeps the compiled code of the modules between runs (in the system's temporary folder): faster starts.
module.enableCompileCache?.();

const sources = new URL('../src/cli/main.ts', import.meta.url);
let entry = new URL('../lib/cli/main.js', import.meta.url);
if (existsSync(sources)) {
  // A development checkout: Node strips the types itself (Node 22.18 and later, on by default).
  if (!process.features?.typescript) {
    process.stderr.write(`This is a development checkout of stepwright: it runs the TypeScript sources, which needs Node.js 22.18 or later (this is ${process.versions.node}).\nRun it with the project's own Node, node_modules/.bin/node (npm scripts and npx do).\n`);
    process.exit(2);
  }
  entry = sources;
} else if (!existsSync(entry)) {
  process.stderr.write('stepwright: the compiled program (lib/) is missing from this installation; reinstall the package.\n');
  process.exit(2);
}
// A reader that stops early (`stepwright check | head`) closes the pipe: stop quietly, as command-line tools do,
// instead of a stack trace for a write nobody reads any more.
for (const stream of [process.stdout, process.stderr]) {
  stream.on('error', (error) => {
    if (error.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    process.exitCode = 2;
  });
}
const { main } = await import(entry.href);
// Standard input is read only when a command is given the path '-'.
const stdin = async () => {
  const chunks = [];
  for await (const chunk of process.stdin) chunks.push(chunk);
  return Buffer.concat(chunks).toString('utf8');
};
process.exitCode = await main(process.argv.slice(2), { stdout: process.stdout, stderr: process.stderr, cwd: process.cwd(), env: process.env, stdin });
