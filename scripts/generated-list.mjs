// Shared by the scripts that write generated TypeScript modules: a list of items, a few to a line.

/** The items (already written as code, each with its comma) on lines of at most 116 characters, indented by two. */
export function wrappedItems(items) {
  const lines = [];
  let line = '';
  for (const item of items) {
    if (line && line.length + item.length + 1 > 116) {
      lines.push(`  ${line}`);
      line = '';
    }
    line += (line ? ' ' : '') + item;
  }
  if (line) lines.push(`  ${line}`);
  return lines.join('\n');
}
