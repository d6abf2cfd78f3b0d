// A corpus of well-written and badly written plant instructions: the writing rules must pass every good one
// (false-positive budget: zero) and catch every bad one with the expected rule.
import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { rules } from '../../src/check/rules/index.ts';

const writingRules = Object.values(rules).filter((r) => r.meta.category === 'writing' || ['caution-holds-action', 'notice-for-injury', 'caution-for-serious-injury'].includes(r.meta.id));

// Our own words, for the fictional Alder Reach Chemicals Unit 2 (kettle K-210, heater H-220, blend tank T-230,
// nitrogen header, unloading bay). Sources of the writing rules: DOE-STD-1029-92, UK HSE HSG48, ASD-STE100.
const goodActions = [
  'Open hot-oil supply valve XV-2101 to the K-210 jacket',
  'Close cooling-oil valve XV-2105',
  'Start agitator M-210 at low speed',
  'Stop pump P-211',
  'Vent the kettle to the scrubber through XV-2103',
  'Purge the charge line with nitrogen at 2 bar',
  'Charge 420 kg of xylene through FV-211',
  'Sample the resin at sample point SP-210',
  'Set temperature controller TIC-210 to 230 degC',
  'Raise the hot-oil supply temperature to 270 degC',
  'Hold the kettle at 230 degC under xylene reflux',
  'Wait for the lab acid value',
  'Record the acid value on the batch sheet',
  'Check that the oxygen content on AI-210 is below 2 percent',
  'Check the vent and drain valves on the charge line',
  'Tip 1480 kg of phthalic anhydride into the charge chute',
  'Draw a 100 g sample from SP-210 into a clean labelled tin',
  'Transfer the resin to blend tank T-230 with pump P-211',
  'Switch the jacket to cooling oil from cooler E-222',
  'Drain the condensate from decanter D-215 to the recovery drum',
  'Flush the transfer line with 200 L of xylene',
  'Isolate heater H-220 at its local panel',
  'Lock out pump P-251 at motor control centre MCC-2',
  'Connect the earthing clamp to the tank truck',
  'Connect the unloading hose to the truck outlet and the bay coupling',
  'Line up the unloading route from the bay to tank T-250',
  'Top up the seal pot of P-221A with thermal oil',
  'Set blanket pressure controller PIC-210 to 110 kPa',
  'Announce the shutdown on unit radio channel 2',
  'Call the site fire team on emergency extension 2222',
  'Press emergency stop HS-2190 on the K-210 panel',
  'Depressure the nitrogen header to 0.5 bar through HV-2301',
  'Steam out tank T-230 for 4 h',
  'Dose 12 kg of inhibitor into T-230',
  'Cool the kettle contents to 150 degC',
  'Heat the blend in T-230 to 60 degC',
  'Run the clean-in-place pump P-231 for 20 min',
  'Inspect the bursting disc holder on K-210 for leaks',
  'Report the charge totals to the shift supervisor',
  'Sign the batch record for the completed batch',
  'If TI-210 exceeds 245 degC, open cooling-oil valve XV-2105',
  'When the truck is empty, stop pump P-251',
  'Bump-start agitator M-210 to check its direction of rotation',
  'Re-inert K-210 with nitrogen to U2-K210-INERT-001',
  'Do not open sample point SP-210 above 200 degC',
  'Brief the incoming shift on the state of K-210',
  'Fit 2 new gaskets to the manway of T-230',
  'Keep the agitator running and the cooling oil flowing',
  'Add approximately 5 kg of filter aid to T-230',
  'Open the bottom outlet valve of T-230 by 3 turns',
];

const goodNotes = [
  'Reaction water starts to distil to decanter D-215 above 150 degC.',
  'Controller TIC-210 keeps the cook temperature while the lab works.',
  'The bag-tip scale totalises the net mass tipped; a full pallet holds 1500 kg.',
  'A 25 m3 truck empties in 40 to 45 min at 600 L/min.',
  'K-210 is inerted to U2-K210-INERT-001 before every batch.',
  'Charge totals are recorded automatically by the batch system.',
  'Steam tracing keeps the drain line above 40 degC.',
  'Sample results usually come back within 30 min.',
];

const goodMessages = [
  { level: 'warning', hazard: 'Resin and vapour at up to 245 degC at sample point SP-210', consequence: 'Severe burns to face and hands', avoid: 'Wear a face shield and heat-resistant gauntlets at SP-210' },
  { level: 'danger', hazard: 'Nitrogen in K-210 after inerting', consequence: 'Asphyxiation and death on entry', avoid: 'Do not enter K-210 without a confined-space permit' },
  { level: 'caution', hazard: 'Phthalic anhydride dust at the bag-tip station', consequence: 'Irritation of eyes, skin and airways', avoid: 'Run the dust extraction and wear the FFP3 respirator' },
  { level: 'notice', hazard: 'Agitator M-210 running with the impeller uncovered', consequence: 'Damage to the bottom steady bearing and the seal', avoid: 'Do not run M-210 with the kettle level below 20 percent' },
  { level: 'notice', hazard: 'Pump P-251 running dry after the truck is empty', consequence: 'The mechanical seal of P-251 overheats and fails', avoid: 'Stop P-251 within 1 min of low flow on FI-251' },
  { level: 'warning', hazard: 'Hot oil at up to 280 degC in the jacket drains', consequence: 'Severe burns', avoid: 'Do not open the jacket drains while H-220 runs' },
  { level: 'caution', hazard: 'Caustic cleaning solution at 2 percent in the CIP return', consequence: 'Skin and eye irritation', avoid: 'Wear chemical goggles and gloves at the CIP return' },
  { level: 'notice', hazard: 'Steam flashing in decanter D-225', consequence: 'D-225 foams over and P-221A cavitates', avoid: 'Keep the decanter level above 30 percent' },
];

const goodChecks = [
  'Sample is labelled with the batch number and handed to the lab',
  'P-211 shows stopped on the panel',
  'Free volume of T-250 exceeds the delivery volume by 5 m3 or more',
  'Volume on the sheet matches the delivery note within 0.3 m3',
  'Shift supervisor acknowledges on the radio',
];

const goodConditions = [
  'TI-210 >= 205 degC',
  'elapsed >= 60 min and TI-210 >= 225 degC',
  '(TI-210 >= 180 degC and PI-210 <= 250 kPa) or elapsed >= 2 h',
  'AI-210 <= 2 percent or (elapsed >= 30 min and PI-210 >= 105 kPa)',
];

/** Each bad text, the field it is written in, and the rule that must catch it. */
const bad: Array<{ text: string; field: 'do' | 'note' | 'hazard' | 'until'; rule: string }> = [
  { field: 'do', rule: 'step-starts-with-verb', text: 'The hot-oil valve XV-2101 is opened to the jacket' },
  { field: 'do', rule: 'step-starts-with-verb', text: 'Opening of cooling-oil valve XV-2105' },
  { field: 'do', rule: 'step-starts-with-verb', text: 'Agitator M-210 to be started at low speed' },
  { field: 'do', rule: 'step-starts-with-verb', text: 'Nitrogen purge of the charge line at 2 bar' },
  { field: 'do', rule: 'step-starts-with-verb', text: 'Xylene charge of 420 kg through FV-211' },
  { field: 'do', rule: 'one-action-per-step', text: 'Open XV-2101 and start pump P-211' },
  { field: 'do', rule: 'one-action-per-step', text: 'Drain the condensate, then flush the line with xylene' },
  { field: 'do', rule: 'one-action-per-step', text: 'Close XV-2101; open XV-2105' },
  { field: 'do', rule: 'one-action-per-step', text: 'Isolate pump P-251 and lock it out' },
  { field: 'do', rule: 'one-action-per-step', text: 'Stop the agitator and vent the kettle to the scrubber' },
  { field: 'do', rule: 'one-action-per-step', text: 'Record the acid value. Sign the batch sheet.' },
  { field: 'do', rule: 'sentence-too-long', text: 'Open the hot-oil supply valve XV-2101 slowly over about two minutes while you watch the jacket pressure on PI-2102 for any sudden rise in pressure' },
  { field: 'do', rule: 'sentence-too-long', text: 'Draw a sample from sample point SP-210 into one of the clean labelled tins kept in the cabinet next to the kettle for the lab' },
  { field: 'note', rule: 'sentence-too-long', text: 'The reaction water that distils over from the kettle above about 150 degC collects in decanter D-215 where the xylene separates from it and flows back to the kettle through the overflow line.' },
  { field: 'do', rule: 'number-without-unit', text: 'Set temperature controller TIC-210 to 45' },
  { field: 'do', rule: 'number-without-unit', text: 'Raise the kettle temperature to 180 before sampling' },
  { field: 'do', rule: 'number-without-unit', text: 'Hold the blend for 30 before the transfer' },
  { field: 'do', rule: 'number-without-unit', text: 'Pressurise the nitrogen header to 6' },
  { field: 'do', rule: 'vague-term', text: 'Purge the kettle with nitrogen as required' },
  { field: 'do', rule: 'vague-term', text: 'Heat the kettle sufficiently before the charge' },
  { field: 'do', rule: 'vague-term', text: 'Wait several minutes for the lab result' },
  { field: 'do', rule: 'vague-term', text: 'Add approximately the right amount of filter aid' },
  { field: 'do', rule: 'vague-term', text: 'Check the seal pot level periodically' },
  { field: 'note', rule: 'note-holds-action', text: 'Close the jacket drains before heating.' },
  { field: 'note', rule: 'note-holds-action', text: 'Do not exceed 200 degC on TI-210.' },
  { field: 'note', rule: 'note-holds-action', text: 'The operator must check the seal pot before start-up.' },
  { field: 'note', rule: 'note-holds-action', text: 'Ensure the earthing clamp is on the truck.' },
  { field: 'hazard', rule: 'caution-holds-action', text: 'Open the jacket drains only when H-220 is stopped' },
  { field: 'hazard', rule: 'caution-holds-action', text: 'Wear a face shield at sample point SP-210' },
  { field: 'until', rule: 'mixed-and-or', text: 'TI-210 <= 60 degC and PI-210 <= 110 kPa or elapsed >= 2 h' },
  { field: 'until', rule: 'mixed-and-or', text: 'AI-210 <= 2 percent or PI-210 >= 105 kPa and elapsed >= 30 min' },
];

function procedure(steps: string, hazards = ''): string {
  return `---
id: U2-CORPUS-001
title: Writing corpus on kettle K-210
kind: normal
revision: 1
status: draft
ppe: [Face shield]
signals:
  TI-210: { text: Kettle temperature, unit: degC, range: [0, 300] }
  PI-210: { text: Kettle pressure, unit: kPa, range: [0, 600] }
  AI-210: { text: Kettle oxygen, unit: percent, range: [0, 25] }
limits:
  TI-210: { low: 15 degC, high: 245 degC, consequence: The resin degrades, correction: Cool the kettle }
interlocks:
  - { tag: TSHH-210, trips-when: TI-210 >= 255 degC, action: Closes XV-2101 }
hazards:
${hazards || '  - { level: warning, hazard: Hot resin, consequence: Severe burns, avoid: Wear a face shield }'}
steps:
${steps}
---
`;
}

const quote = (s: string) => JSON.stringify(s);
const check = (text: string) => checkSources([{ file: 'corpus.md', text }], { today: '2026-12-01', rules: writingRules }).diagnostics;

describe('writing corpus: well-written text raises no writing warning', () => {
  const total = goodActions.length + goodNotes.length + goodMessages.length + goodChecks.length + goodConditions.length;
  it(`has at least 60 good items (${total})`, () => expect(total).toBeGreaterThanOrEqual(60));

  it('good actions, notes, checks and conditions', () => {
    const steps = [
      ...goodActions.map((a, i) => `  - { step: a${i}, do: ${quote(a)}, confirm: Done }`),
      ...goodNotes.map((n, i) => `  - { step: n${i}, do: Wait for the lab result, note: ${quote(n)}, confirm: Done }`),
      ...goodChecks.map((c, i) => `  - { step: c${i}, do: Check the reading, confirm: ${quote(c)} }`),
      ...goodConditions.map((c, i) => `  - { step: u${i}, do: Hold the kettle at 230 degC, until: ${quote(c)} }`),
    ].join('\n');
    const found = check(procedure(steps)).map((d) => `${d.rule}: ${d.message}`);
    expect(found).toEqual([]);
  });

  it('good safety messages', () => {
    const hazards = goodMessages.map((m) => `  - { level: ${m.level}, hazard: ${quote(m.hazard)}, consequence: ${quote(m.consequence)}, avoid: ${quote(m.avoid)} }`).join('\n');
    const found = check(procedure('  - { step: a, do: Close XV-2101, confirm: Done }', hazards)).map((d) => `${d.rule}: ${d.message}`);
    expect(found).toEqual([]);
  });
});

describe('writing corpus: badly written text raises the expected rule', () => {
  it('has at least 30 bad items', () => expect(bad.length).toBeGreaterThanOrEqual(30));
  for (const item of bad) {
    it(`${item.rule}: ${item.text}`, () => {
      const step = item.field === 'do' ? `  - { step: s, do: ${quote(item.text)}, confirm: Done }`
        : item.field === 'note' ? `  - { step: s, do: Wait for the lab result, note: ${quote(item.text)}, confirm: Done }`
        : item.field === 'until' ? `  - { step: s, do: Hold the kettle at 230 degC, until: ${quote(item.text)} }`
        : '  - { step: s, do: Close XV-2101, confirm: Done }';
      const hazards = item.field === 'hazard' ? `  - { level: warning, hazard: ${quote(item.text)}, consequence: Severe burns, avoid: Keep clear }` : '';
      const rulesFound = check(procedure(step, hazards)).map((d) => d.rule);
      expect(rulesFound).toContain(item.rule);
    });
  }
});
