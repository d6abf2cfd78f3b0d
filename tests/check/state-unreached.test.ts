// The plant-state check says where it stops: a step the sequence reaches but no worked-out state does (an until on
// a valve that no step's state opens) is named, since hazards after it were never judged. A hold test's signal may
// fall while the test runs, so both of its outcomes are followed.
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';

const procedure = (openStep: string, holdTest = true) => `---
id: FX-NE-001
title: Drain and test tank T-900
kind: normal
revision: 0
status: draft
signals:
  XV-901: { text: Drain valve, values: [open, closed] }
  LI-900: { text: Tank level, unit: percent, range: [0, 100] }
  PI-900: { text: Tank pressure, unit: kPaa, range: [0, 600] }
line-up: [XV-901 == closed, PI-900 >= 250 kPaa]
hazards:
  - { level: caution, hazard: Spill at the drain, consequence: Minor injury, avoid: Keep clear of the drain, when: 'XV-901 == open and LI-900 > 50 percent' }
steps:
${openStep}
  - step: drain
    do: Drain the tank
    until: LI-900 <= 5 percent
  - step: close-drain
    do: Close drain valve XV-901
    state: { XV-901: closed }
    until: XV-901 == closed
  - step: hold
    do: Hold the tank pressure for the test
    until: elapsed >= 30 min
${holdTest ? '    max-drop: { PI-900: 5 kPa }\n' : ''}  - choose:
      - when: PI-900 >= 245 kPaa
        steps:
          - { step: record, do: Record the hold test, confirm: Recorded }
      - when: PI-900 < 245 kPaa
        steps:
          - { step: find-leak, do: Find the leak with leak-detection fluid, confirm: Leaks tagged }
---
`;
const unreached = (text: string) => checkSources([{ file: 'p.md', text }], { today: '2026-12-01' }).diagnostics
  .filter((d) => d.rule === 'state-not-analysed').map((d) => d.message);

describe('steps the plant-state check does not reach', () => {
  it('names the first step after an until on a valve that no step opens, and how many follow', () => {
    const found = unreached(procedure('  - step: open-drain\n    do: Open drain valve XV-901\n    until: XV-901 == open'));
    expect(found).toEqual([
      "The plant-state check finds no run that reaches step 'drain' (nor 4 other steps it leads to): no state worked out before it makes XV-901 == open true, so hazards, needs, latched trips and end states were not checked there.",
    ]);
    // The step that opens the valve says so with its state: everything is reached, nothing is said.
    expect(unreached(procedure('  - step: open-drain\n    do: Open drain valve XV-901\n    state: { XV-901: open }\n    until: XV-901 == open'))).toEqual([]);
  });

  it('follows both outcomes of a hold test, and says so when a pressure that nothing lowers cannot fail it', () => {
    const opened = '  - step: open-drain\n    do: Open drain valve XV-901\n    state: { XV-901: open }\n    until: XV-901 == open';
    expect(unreached(procedure(opened, true))).toEqual([]);
    // Without max-drop the step names nothing that lowers the pressure: the leak branch is never reached, and said.
    expect(unreached(procedure(opened, false))).toEqual([
      "The plant-state check finds no run that reaches step 'find-leak': no state worked out before it makes elapsed >= 30 min and PI-900 < 245 kPaa true, so hazards, needs, latched trips and end states were not checked there.",
    ]);
  });

  it('says so also for a procedure without hazards whose end states are judged (it moves equipment)', () => {
    const text = procedure('  - step: open-drain\n    do: Open drain valve XV-901\n    until: XV-901 == open').replace(/^hazards:\n.*\n/m, '');
    expect(text).not.toContain('hazards:');
    expect(unreached(text)).toHaveLength(1);
    // Without any step that moves equipment or trips on purpose, no plant-state rule follows it: nothing is said.
    expect(unreached(text.replace(/    state: \{ XV-901: closed \}\n/, ''))).toEqual([]);
  });
});
