// The floor for `stepwright check`: read every .md file under a folder, split off the front-matter and parse it
// with `yaml` keeping positions (a LineCounter), nothing else. Run as its own process by bench/check-scale.ts.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { LineCounter, parseDocument } from 'yaml';

const root = process.argv[2];
let files = 0;
let nodes = 0;
const walk = (dir: string) => {
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = join(dir, entry.name);
    if (entry.isDirectory()) walk(full);
    else if (entry.name.endsWith('.md')) {
      const text = readFileSync(full, 'utf8');
      const start = text.indexOf('---\n') === 0 ? 4 : 0;
      const end = text.indexOf('\n---\n', start);
      const lineCounter = new LineCounter();
      const doc = parseDocument(text.slice(start, end === -1 ? text.length : end), { lineCounter });
      nodes += doc.contents && 'items' in doc.contents ? (doc.contents.items as unknown[]).length : 0;
      files++;
    }
  }
};
walk(root);
process.stdout.write(`${files} files, ${nodes} top-level keys\n`);
