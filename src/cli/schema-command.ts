// `stepwright schema [--out FILE]`: prints or writes the JSON Schema of the front-matter for editors.
import { writeFileSync, mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { procedureJsonSchemaText, registerJsonSchemaText } from '../model/json-schema.ts';
import type { CliIo } from './io.ts';
import { schemaHelp } from './command-help.ts';

export { schemaHelp };

export async function runSchema(argv: string[], io: CliIo): Promise<number> {
  const { values } = parseArgs({ args: argv, options: { out: { type: 'string' }, register: { type: 'boolean', default: false }, help: { type: 'boolean', short: 'h' } }, strict: true });
  if (values.help) {
    io.stdout.write(schemaHelp);
    return 0;
  }
  const text = values.register ? registerJsonSchemaText() : procedureJsonSchemaText();
  if (!values.out) {
    io.stdout.write(text);
    return 0;
  }
  const target = resolve(io.cwd, values.out);
  mkdirSync(dirname(target), { recursive: true });
  writeFileSync(target, text);
  io.stdout.write(`Wrote ${values.out}\n`);
  return 0;
}
