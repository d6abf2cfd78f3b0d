// The front-matter schema as JSON Schema (draft-07, the dialect editors' YAML support understands best).
import { z } from 'zod';
import { procedureSchema } from './schema.ts';
import { registerFileSchema } from './register-schema.ts';

export function procedureJsonSchema(): Record<string, unknown> {
  const generated = z.toJSONSchema(procedureSchema, { target: 'draft-7', unrepresentable: 'any' }) as Record<string, unknown>;
  const { $schema, ...rest } = generated;
  return {
    $schema,
    title: 'Stepwright procedure front-matter',
    description: 'The YAML front-matter of one operating procedure. Generated from src/model/schema.ts by `npm run schema`; do not edit.',
    ...rest,
  };
}

/** The committed file's text: stable key order and a final newline, so a stale copy shows up as a diff. */
export function procedureJsonSchemaText(): string {
  return `${JSON.stringify(procedureJsonSchema(), null, 2)}\n`;
}

/** The JSON Schema of one plant register file, for editors (published as schema/register.schema.json). */
export function registerJsonSchema(): Record<string, unknown> {
  const generated = z.toJSONSchema(registerFileSchema, { target: 'draft-7', unrepresentable: 'any' }) as Record<string, unknown>;
  const { $schema, ...rest } = generated;
  return {
    $schema,
    title: 'Stepwright plant register file',
    description: 'One YAML file of the plant register (docs/register.md). Generated from src/model/register-schema.ts by `npm run schema`; do not edit.',
    ...rest,
  };
}

export function registerJsonSchemaText(): string {
  return `${JSON.stringify(registerJsonSchema(), null, 2)}\n`;
}
