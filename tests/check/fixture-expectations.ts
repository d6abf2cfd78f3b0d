// Reads the `expect: rule-id` markers written inside fixture files.
export interface Expectation {
  line: number;
  rule: string;
}

const marker = /(?:#|<!--)\s*expect:\s*([a-z0-9,\s-]+?)\s*(?:-->)?\s*$/;

export function expectationsIn(text: string): Expectation[] {
  const out: Expectation[] = [];
  text.split('\n').forEach((line, i) => {
    const m = marker.exec(line);
    if (!m) return;
    for (const rule of m[1].split(',').map((s) => s.trim()).filter(Boolean)) out.push({ line: i + 1, rule });
  });
  return out;
}
