// The one front door for reading a procedure: source text → parsed source → model → facts.
// The checker, the site, the history views and every command read procedures through here.
import { readSource, type ParsedSource, type PositionsWhen, type ReadParts } from '../parse/read-source.ts';
import { buildProcedure } from '../model/build-procedure.ts';
import type { Procedure } from '../model/procedure.ts';
import { holdsKeys, validateFrontMatter, type SchemaIssue } from '../model/validate.ts';
import { applyRegister } from '../model/apply-register.ts';
import type { PlantRegister } from '../model/register.ts';
import { collectFacts, type ProcedureFacts } from '../analysis/procedure-facts.ts';

export interface ReadProcedure {
  source: ParsedSource;
  /** Null when the front-matter is missing or is not a mapping (the checker says why). */
  procedure: Procedure | null;
  schemaIssues: ReturnType<typeof validateFrontMatter>;
  facts: ProcedureFacts | null;
}

/**
 * What was read from a file's text elsewhere: its parts, read on another thread (read/source-reader.ts) or kept from
 * an earlier run, and, from the thread, what the schema found in their data.
 */
export interface GivenReading {
  parts: ReadParts;
  schemaIssues?: SchemaIssue[];
}

/**
 * Reads one source; with a plant register, the procedure takes its declarations from the entries it uses. `given`:
 * what was read from the same text elsewhere (then only assembled here). `positions`:
 * when the table of where each value is written is made (parse/read-source.ts); a file the rules check takes it
 * 'now'. `onRead` is given the parts when the text was read here.
 */
export function readProcedure(file: string, text: string, register?: PlantRegister, given?: GivenReading, positions?: PositionsWhen, onRead?: (parts: ReadParts) => void): ReadProcedure {
  const source = readSource(file, text, given?.parts, positions, onRead);
  // Data is there only when the front-matter was read without a problem (the YAML document itself is not needed).
  const readable = holdsKeys(source.data);
  // The problems the schema finds are found at once for a file the rules check; for a file read for its model
  // alone, only when asked for (the rules that ask check the file itself).
  let schemaIssues = readable ? given?.schemaIssues : undefined;
  if (positions === 'now' && readable) schemaIssues ??= validateFrontMatter(source.data);
  const procedure = readable ? applyRegister(buildProcedure(file, source.data, source.body, source.bodyText), register) : null;
  // The facts (conditions resolved, units converted, the step graph) are worked out when first asked for: a
  // reader that only needs the model, such as the placing of waived diagnostics, does not pay for them.
  let facts: ProcedureFacts | null | undefined;
  return {
    source, procedure,
    get schemaIssues() {
      schemaIssues ??= readable ? validateFrontMatter(source.data) : [];
      return schemaIssues;
    },
    get facts() {
      if (facts === undefined) facts = procedure ? collectFacts(procedure) : null;
      return facts;
    },
  };
}
