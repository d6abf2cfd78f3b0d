// `stepwright schema [--out FILE]`: prints or writes the JSON Schema of the front-matter for editors.
import { resolve } from 'node:path';
import { writeOutputFile } from './output-file.ts';
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
  // An earlier schema of the same kind carries the same title.
  const title = /^ {2}"title": .*$/m.exec(text)?.[0] ?? text;
  writeOutputFile(resolve(io.cwd, values.out), text, io.cwd, {
    what: `a ${values.register ? 'register' : 'procedure'} schema written by 'stepwright schema'`,
    isOwn: (existing) => existing.includes(title),
  });
  io.stdout.write(`Wrote ${values.out}\n`);
  return 0;
}
