// Builds procedure source text for render tests (front-matter as JSON, which is valid YAML).
import { readProcedure } from '../../src/read/read-procedure.ts';
import type { Procedure } from '../../src/model/procedure.ts';

export function procedureText(front: Record<string, unknown>, body = ''): string {
  const base = { id: 'T-001', title: 'Test procedure', kind: 'normal', revision: 0, status: 'draft' };
  return `---\n${JSON.stringify({ ...base, ...front }, null, 1)}\n---\n${body}`;
}

export function readTestProcedure(front: Record<string, unknown>, body = ''): Procedure {
  const { procedure } = readProcedure('procedures/area/t-001.md', procedureText(front, body));
  if (!procedure) throw new Error('test procedure did not read');
  return procedure;
}
