// Prints diagnostics as one SARIF 2.1.0 log (OASIS Static Analysis Results Interchange Format), the format
// code-scanning views read. One run, one tool driver listing every rule that reported, one result per diagnostic.
import type { Diagnostic } from '../parse/diagnostic.ts';

export const sarifSchema = 'https://json.schemastore.org/sarif-2.1.0.json';

const level = { error: 'error', warning: 'warning', info: 'note' } as const;

export interface SarifOptions {
  version: string;
  /** Maps a file name to a path relative to the repository root (the URI base `%SRCROOT%`). */
  pathOf?: (file: string) => string;
  /** Rule id → short description, for the driver's rule list. */
  describe?: (rule: string) => string | undefined;
}

export function formatSarif(diagnostics: Diagnostic[], options: SarifOptions): string {
  const pathOf = options.pathOf ?? ((f: string) => f);
  const ids = [...new Set(diagnostics.map((d) => d.rule))].sort();
  const index = new Map(ids.map((id, i) => [id, i]));
  const log = {
    $schema: sarifSchema,
    version: '2.1.0',
    runs: [{
      tool: {
        driver: {
          name: 'stepwright',
          version: options.version,
          informationUri: 'https://www.npmjs.com/package/stepwright',
          rules: ids.map((id) => {
            const text = options.describe?.(id);
            return { id, ...(text ? { shortDescription: { text } } : {}) };
          }),
        },
      },
      originalUriBaseIds: { '%SRCROOT%': { description: { text: 'The root of the repository that holds the procedures.' } } },
      results: diagnostics.map((d) => ({
        ruleId: d.rule,
        ruleIndex: index.get(d.rule),
        level: level[d.severity],
        message: { text: d.hint ? `${d.message}\n${d.hint}` : d.message },
        locations: [{
          physicalLocation: {
            artifactLocation: { uri: encodeURI(pathOf(d.file)), uriBaseId: '%SRCROOT%' },
            region: {
              startLine: Math.max(1, d.line), startColumn: Math.max(1, d.column),
              endLine: Math.max(d.line, d.endLine, 1),
              ...(d.endLine === d.line && d.endColumn > d.column ? { endColumn: d.endColumn } : {}),
            },
          },
        }],
        ...(d.related?.length ? {
          relatedLocations: d.related.map((r, i) => ({
            id: i,
            message: { text: r.message },
            physicalLocation: { artifactLocation: { uri: encodeURI(pathOf(r.file)), uriBaseId: '%SRCROOT%' }, region: { startLine: Math.max(1, r.line), startColumn: Math.max(1, r.column) } },
          })),
        } : {}),
      })),
    }],
  };
  return `${JSON.stringify(log, null, 2)}\n`;
}
