// Files that ship inside the stepwright package itself (not the user's): its JSON Schema and the demo manual.
// This module sits two folders below the package root both as TypeScript (src/cli) and compiled (lib/cli).
import { existsSync } from 'node:fs';
import { relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';

export const packageRoot = fileURLToPath(new URL('../../', import.meta.url));
/** The front-matter schema, for editors. */
export const packagedSchema = fileURLToPath(new URL('../../schema/procedure.schema.json', import.meta.url));
/** The demo manual of the fictional Alder Reach Chemicals, Unit 2 (copied by `stepwright init --demo`). */
export const packagedDemo = fileURLToPath(new URL('../../procedures/', import.meta.url));
/** The demo plant register its procedures read their signals, limits and trips from (copied with the demo). */
export const packagedDemoRegister = fileURLToPath(new URL('../../register/', import.meta.url));

/**
 * How a file in `fromFolder` names the schema: a relative path when the schema lies in the same tree
 * (the project's node_modules, or this checkout), otherwise undefined (e.g. a one-off npx run from a cache).
 */
export function schemaReference(fromFolder: string, projectRoot: string): string | undefined {
  if (!existsSync(packagedSchema)) return undefined;
  const fromProject = relative(projectRoot, packagedSchema);
  if (fromProject.startsWith('..') || fromProject.startsWith(sep)) return undefined;
  return relative(fromFolder, packagedSchema).split(sep).join('/');
}
