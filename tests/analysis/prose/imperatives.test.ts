// Reading instructions: action verbs at the head of a step, chained instructions, and instructions hidden in notes.
import { describe, expect, it } from 'vitest';
import { chainedImperatives, givesInstruction, plantVerbs, startsWithActionVerb } from '../../../src/analysis/prose/imperatives.ts';
import { splitSentences } from '../../../src/analysis/prose/words.ts';

const first = (text: string) => splitSentences(text)[0];

describe('startsWithActionVerb', () => {
  it.each([
    'Vent the kettle to the scrubber', 'Purge K-210 with nitrogen', 'Open XV-2101', 'Close the valve', 'Start pump P-211',
    'Stop agitator M-210', 'Charge 420 kg of xylene', 'Sample the resin at SP-210', 'Remove pump P-211 from its base',
    'If TI-210 exceeds 245 degC, open XV-2105', 'IF the pump trips THEN close XV-2101', 'Do not open the hatch', 'Re-inert K-210',
  ])('accepts "%s"', (text) => expect(startsWithActionVerb(first(text))).toBe(true));

  it.each([
    'The valve is opened', 'Opening the valve', 'Xylene charge of 420 kg through FV-211', 'Agitator M-210 to be started',
    'Nitrogen purge of the line',
  ])('rejects "%s"', (text) => expect(startsWithActionVerb(first(text))).toBe(false));

  // Common practice: these plant verbs are what compromise 14 reads as nouns; the curated list must cover them.
  it('knows the plant verbs the English model misreads', () => {
    for (const v of ['vent', 'purge', 'flush', 'dose', 'steam', 'depressure']) expect(plantVerbs.has(v)).toBe(true);
    for (const v of ['open', 'close', 'start', 'stop', 'charge', 'sample']) expect(plantVerbs.has(v)).toBe(false);
  });
});

describe('chainedImperatives', () => {
  it.each([
    ['Open XV-2101 and start pump P-211', ['start']],
    ['Drain the line, then flush it with water', ['flush']],
    ['Close XV-2101; open XV-2105', ['open']],
    ['Open and close the valve', ['close']],
    ['Charge xylene and glycol', []],
    ['Check the vent and drain valves', []],
    ['Check that P-211 runs and the valve is open', []],
    ['Wait until the level drops and the pump stops', []],
    ['Record the acid value and time', []],
    ['Wear gloves, goggles and a face shield', []],
  ])('"%s" chains %j', (text, verbs) => {
    const s = first(text);
    expect(chainedImperatives(s).map((i) => s.words[i].lower)).toEqual(verbs);
  });
});

describe('givesInstruction', () => {
  it.each(['Close the jacket drains before heating.', 'Do not exceed 200 degC.', 'Ensure the clamp is on.', 'Operators must wear gloves.'])(
    'finds the instruction in "%s"', (text) => expect(givesInstruction(first(text))).not.toBeNull());
  it.each(['Charge totals are recorded automatically.', 'Sample results come back in 20 min.', 'Pump P-251 running dry after the truck is empty',
    'Steam flashing makes D-225 foam over', 'Oil on gratings and floors around the leak'])(
    'reads "%s" as information', (text) => expect(givesInstruction(first(text))).toBeNull());
});
