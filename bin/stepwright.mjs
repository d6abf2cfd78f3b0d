#!/usr/bin/env node
// Entry point for the `stepwright` command: runs the TypeScript CLI through tsx on the project's Node.
import { register } from 'tsx/esm/api';
register();
const { main } = await import('../src/cli/main.ts');
process.exitCode = await main(process.argv.slice(2), { stdout: process.stdout, stderr: process.stderr, cwd: process.cwd(), env: process.env });
