// The name of a plant area as people on site say it: from the plant register when it names the area, else a
// readable form of the folder the procedures sit in ("k-210-resin" reads "K-210 resin"), never the bare folder.

/** What this needs of a plant register: its areas by id, each with a name (and equipment standing in an area). */
export interface AreaSource {
  areas?: ReadonlyMap<string, { name: string }>;
  equipment?: ReadonlyMap<string, { area?: string }>;
}

/** "k-210-resin" → "K-210 resin", "hot_oil" → "Hot oil", "(top level)" → "General". */
export function readableFolderName(folder: string): string {
  if (folder === '(top level)' || !folder.trim()) return 'General';
  const words = folder.trim().split(/[-_\s]+/).filter(Boolean);
  const out: string[] = [];
  for (let i = 0; i < words.length; i++) {
    const w = words[i];
    // A short letter code followed by a number is a tag: k + 210 → K-210.
    if (/^[a-z]{1,4}$/i.test(w) && /^\d+[a-z]?$/i.test(words[i + 1] ?? '')) {
      out.push(`${w.toUpperCase()}-${words[i + 1].toUpperCase()}`);
      i++;
    } else if (/\d/.test(w) && /^[a-z0-9]+$/i.test(w)) out.push(w.toUpperCase());
    else out.push(w.toLowerCase());
  }
  const text = out.join(' ');
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/**
 * The area's name for a procedure in `folder` with `equipment`: the register's area with the folder's id, else
 * the register area most of the procedure's equipment stands in, else the readable folder name.
 */
export function areaName(folder: string, equipment: readonly string[], register?: AreaSource): string {
  const areas = register?.areas;
  if (areas?.size) {
    const byId = areas.get(folder) ?? [...areas.entries()].find(([id]) => id.toLowerCase() === folder.toLowerCase())?.[1];
    if (byId?.name?.trim()) return byId.name.trim();
    const counts = new Map<string, number>();
    for (const tag of equipment) {
      const area = register?.equipment?.get(tag)?.area;
      if (area && areas.get(area)?.name?.trim()) counts.set(area, (counts.get(area) ?? 0) + 1);
    }
    const best = [...counts.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))[0];
    if (best) return areas.get(best[0])!.name.trim();
  }
  return readableFolderName(folder);
}
