// The live-preview diagnostics view, the cycle-time section and the caller/callee links of procedure pages.
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { buildDiagnosticsView } from '../../src/render/diagnostics-view.ts';
import { buildCycleTimeView } from '../../src/render/cycle-time-view.ts';
import { buildCallLinksView } from '../../src/render/call-links-view.ts';
import type { Procedure } from '../../src/model/procedure.ts';

const doc = (id: string, steps: string, status = 'draft') => `---\nid: ${id}\ntitle: Case ${id}\nkind: normal\nrevision: 3\nstatus: ${status}\nsteps:\n${steps}\n---\n`;
const manual = checkSources([
  { file: 'caller.md', text: doc('U2-CALLER', `  - step: check
    do: Check the kettle
    confirm: Checked
    expect: 5 min
  - step: inert
    do: Inert the kettle
    call: { procedure: U2-SHARED, revision: 2 }
  - step: heat
    do: Heat the kettle
    until: TI-9 >= 80 degC
    expect: 20 min`) },
  { file: 'shared.md', text: doc('U2-SHARED', '  - { step: purge, do: Purge with nitrogen, confirm: Purged, expect: 10 min }\n  - { step: vent, do: Vent the kettle, confirm: Vented, expect: 2..4 min }') },
], { today: '2026-12-01' });
const file = (name: string) => manual.files.find((f) => f.file === name)!;
const all = manual.files.map((f) => f.procedure!).filter(Boolean) as Procedure[];
const lookup = (id: string) => all.find((p) => p.id === id);

describe('buildDiagnosticsView', () => {
  it('lists each finding as file:line:column with its rule, and files it under the step whose lines hold it', () => {
    const view = buildDiagnosticsView(file('caller.md'));
    const undeclared = view.items.find((d) => d.rule === 'undeclared-name')!;
    expect(undeclared.place).toBe('caller.md:17:12');
    expect(undeclared.stepId).toBe('heat');
    expect(view.byStep.get('heat')?.map((d) => d.rule)).toContain('undeclared-name');
    expect(view.counts.error).toBeGreaterThan(0);
    expect(view.items.find((d) => d.rule === 'call-revision-mismatch')?.stepId).toBe('inert');
    const severities = view.items.map((d) => d.severity);
    expect(severities).toEqual([...severities].sort((a, b) => ['error', 'warning', 'info'].indexOf(a) - ['error', 'warning', 'info'].indexOf(b)));
  });
});

describe('buildCycleTimeView', () => {
  it('counts the called procedure and links called steps to the call step row', () => {
    const view = buildCycleTimeView(file('caller.md').procedure!, lookup)!;
    // 5 + (10 + 3) + 20 = 38 typical; 5 + 12 + 20 = 37 shortest; 5 + 14 + 20 = 39 longest
    expect([view.shortest, view.typical, view.longest]).toEqual(['37 min', '38 min', '39 min']);
    expect(view.criticalPath.map((s) => [s.label, s.number, s.href])).toEqual([
      ['check', '1', '#step-check'], ['inert → purge', '2', '#step-inert'], ['inert → vent', '2', '#step-inert'], ['heat', '3', '#step-heat'],
    ]);
    expect(view.inlined).toEqual(['U2-SHARED']);
    expect(view.timelineSvg).toContain('href="#step-inert"');
  });

  it('shows nothing when no step has an expected duration', () => {
    const bare = checkSources([{ file: 'b.md', text: doc('U2-BARE', '  - { step: a, do: Open XV-1, confirm: Open }') }], { today: '2026-12-01' });
    expect(buildCycleTimeView(bare.files[0].procedure!, () => undefined)).toBeUndefined();
  });
});

describe('buildCallLinksView', () => {
  const urlOf = (id: string) => `/procedures/${id.toLowerCase()}/`;
  it('links the caller to the callee with the pin, and the callee back to the caller step', () => {
    const caller = buildCallLinksView(lookup('U2-CALLER')!, all, urlOf);
    expect(caller.calls).toEqual([{ stepId: 'inert', stepNumber: '2', procedureId: 'U2-SHARED', title: 'Case U2-SHARED', status: 'draft', revision: 3, pinned: 2, url: '/procedures/u2-shared/' }]);
    expect(caller.calledBy).toEqual([]);
    const callee = buildCallLinksView(lookup('U2-SHARED')!, all, urlOf);
    expect(callee.calledBy.map((l) => [l.procedureId, l.stepId, l.stepNumber, l.url])).toEqual([['U2-CALLER', 'inert', '2', '/procedures/u2-caller/']]);
  });
});
