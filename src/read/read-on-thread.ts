// What the reading thread (read/source-reader.ts) does with one file: reads its parts, as readSource would, and checks
// their data against the procedure schema, as readProcedure would. Plain data only, to be sent to the main thread.
import { partsToBytes, readSourceParts, type PositionTable } from '../parse/read-source.ts';
import { holdsKeys, validateFrontMatter, type SchemaIssue } from '../model/validate.ts';

/** The parts as bytes, their table of positions (undefined: made when first asked for), and the schema's findings. */
export type ReadOnThread = [bytes: Uint8Array, positions: PositionTable | null | undefined, schemaIssues: SchemaIssue[] | undefined];

export function readOnThread(file: string, text: string): ReadOnThread {
  const parts = readSourceParts(file, text);
  // Checked only where readProcedure would: data read without a problem, a mapping of keys.
  return [partsToBytes(parts), parts.positions, holdsKeys(parts.data) ? validateFrontMatter(parts.data) : undefined];
}
