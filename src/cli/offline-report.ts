// The build's lines about the offline copy: what a tablet keeps, and what an update from the last build costs.
import { formatBytes } from '../render/offline-manifest.ts';
import type { OfflineCopySummary } from './write-offline-copy.ts';

const plural = (n: number, word: string) => `${n.toLocaleString('en-US')} ${word}${n === 1 ? '' : 's'}`;

export function offlineReport(summary: OfflineCopySummary): string {
  const lines = [`Offline copy: ${plural(summary.files, 'file')}, ${formatBytes(summary.bytes)} (version ${summary.version}).`];
  const frame = summary.list.files.filter((f) => !f.area);
  const always = summary.list.files.filter((f) => f.always);
  if (summary.list.areas.length > 0) {
    lines.push(`  Kept on every tablet: the lists, search and styles (${plural(frame.length, 'file')}, ${formatBytes(frame.reduce((n, f) => n + f.bytes, 0))})`
      + ` and the emergency procedures (${plural(always.length, 'file')}, ${formatBytes(always.reduce((n, f) => n + f.bytes, 0))}).`);
    for (const a of summary.list.areas) lines.push(`  ${a.area}: ${plural(a.procedures, 'procedure')}, ${plural(a.files, 'file')}, ${formatBytes(a.bytes)}.`);
  }
  const u = summary.update;
  if (!u) lines.push('  No earlier build in the output folder: a tablet downloads the whole copy once.');
  else if (u.fetched === 0 && u.removed === 0) lines.push('  Update from the previous build: nothing changed.');
  else {
    lines.push(`  Update from the previous build: ${plural(u.fetched, 'file')} to download, ${formatBytes(u.fetchedBytes)}`
      + ` (${u.changed} changed, ${u.added} new), ${plural(u.removed, 'file')} to delete.`);
  }
  return `${lines.join('\n')}\n`;
}
