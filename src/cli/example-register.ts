// The part of the demo register that an example procedure names under `uses`, as one register file for a new
// plant repository: without it the example would refer to entries that exist nowhere and fail its own check.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse, stringify } from 'yaml';
import { splitFrontMatter } from '../parse/split-front-matter.ts';

const header = `# Plant register: every piece of equipment, signal, limit, trip, relief device, chemical and area defined once
# and read by every procedure that lists it under 'uses' (see docs/register.md in the stepwright package).
# Written by 'stepwright init' with the entries its example procedure uses. They are demo values of a fictional
# plant: replace them with your plant's own, from the supplier's current safety data sheets and your site's
# limits, and have them reviewed as your site's procedures require.
`;

/** The register entries named by `uses` in the procedure text, taken from the register folder; null when none. */
export function exampleRegisterText(procedureText: string, registerFolder: string): { text: string; names: string[] } | null {
  const { yaml } = splitFrontMatter(procedureText);
  const uses: unknown = yaml ? (parse(yaml) as { uses?: unknown } | null)?.uses : undefined;
  const wanted = new Set(Array.isArray(uses) ? uses.filter((u): u is string => typeof u === 'string') : []);
  if (!wanted.size) return null;
  const kept: Record<string, Record<string, unknown>> = {};
  const found: string[] = [];
  for (const name of readdirSync(registerFolder).filter((n) => /\.ya?ml$/.test(n)).sort()) {
    const data = parse(readFileSync(join(registerFolder, name), 'utf8')) as Record<string, unknown> | null;
    for (const [section, entries] of Object.entries(data ?? {})) {
      if (!entries || typeof entries !== 'object' || Array.isArray(entries)) continue;
      for (const [key, entry] of Object.entries(entries as Record<string, unknown>)) {
        if (!wanted.has(key)) continue;
        (kept[section] ??= {})[key] = entry;
        found.push(key);
      }
    }
  }
  if (!found.length) return null;
  return { text: `${header}${stringify(kept, { lineWidth: 0 })}`, names: found.sort() };
}
