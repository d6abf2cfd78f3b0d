// YAML merge keys ('<<: *anchor'). Front-matter is read as YAML 1.2 (the `yaml` library without its `merge` option),
// where '<<' is an ordinary key: the keys of the anchored mapping are not copied into the mapping that names it.
// The checker says so where '<<' is written, instead of treating it as a misspelt key or a name.
import type { PathKey } from './read-source.ts';

export const mergeKey = '<<';

export const mergeKeyMessage = "'<<' is a YAML merge key, which Stepwright does not read: the keys of the mapping it names are not copied here, so this entry does not have them.";
export const mergeKeyHint = 'Write the keys out here in full. An alias for a whole value (key: *anchor) does work; a merge into a mapping does not.';

/** The path of every '<<' key in front-matter data, in reading order (a mapping reached twice through an alias is walked once). */
export function mergeKeyPaths(data: unknown): PathKey[][] {
  const out: PathKey[][] = [];
  const seen = new Set<object>();
  const stack: Array<{ value: unknown; path: PathKey[] }> = [{ value: data, path: [] }];
  while (stack.length) {
    const { value, path } = stack.pop()!;
    if (value === null || typeof value !== 'object' || seen.has(value)) continue;
    seen.add(value);
    const entries: Array<[PathKey, unknown]> = Array.isArray(value) ? value.map((v, i) => [i, v]) : Object.entries(value);
    for (const [key] of entries) if (key === mergeKey) out.push([...path, key]);
    for (let i = entries.length - 1; i >= 0; i--) stack.push({ value: entries[i][1], path: [...path, entries[i][0]] });
  }
  return out;
}
