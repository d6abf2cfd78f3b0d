// Shows the path of steps that leads to a finding, shortened in the middle when it is long.
export function showPath(path: string[]): string {
  if (!path.length) return 'at the start';
  const shown = path.length > 14 ? [...path.slice(0, 4), '…', ...path.slice(-9)] : path;
  return shown.join(' → ');
}
