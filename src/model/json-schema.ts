// The front-matter schema as JSON Schema (draft-07, the dialect editors' YAML support understands best).
import { z } from 'zod';
import { procedureSchema } from './schema.ts';

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
