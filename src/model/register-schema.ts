// The schema of one plant register file: areas, equipment, signals with their limits, safety functions,
// relief devices and chemicals, each defined once for every procedure of the plant.
import { z } from 'zod';

const text = z.string().trim().min(1, 'must not be empty');
const quantityText = z.union([z.string(), z.number()]);
const tagList = z.array(text);

export const registerAreaSchema = z.strictObject({
  name: text.describe('The area\'s name as people on site say it, e.g. "Kettle K-210 resin line".'),
  description: z.string().optional().describe('What the area holds and where it is.'),
});

export const registerHazardSchema = z.strictObject({
  level: z.enum(['danger', 'warning', 'caution', 'notice']).describe('Signal word of the hazard: danger, warning, caution or notice.'),
  hazard: text.describe('What the hazard is, e.g. "Hot oil in the jacket at up to 280 degC".'),
  consequence: z.string().optional().describe('What happens if it is not avoided.'),
  avoid: z.string().optional().describe('How to avoid it.'),
  when: z.string().optional().describe('When the hazard is present, as a condition (e.g. "XV-2105 == open and TI-210 > 200 degC"); every procedure that handles the item is checked against it.'),
});

const registerHazards = z.array(registerHazardSchema).optional()
  .describe('Hazards of the item that every procedure handling it must state (or, with `when`, must never let happen).');

export const registerEquipmentSchema = z.strictObject({
  text: text.describe('What the item is, in plant words, e.g. "Resin kettle".'),
  type: z.string().optional().describe('Kind of item, e.g. vessel, pump, valve, heater, tank, agitator.'),
  area: z.string().optional().describe('Id of the area (under `areas`) the item stands in.'),
  feeds: tagList.optional().describe('Equipment this item delivers into, e.g. a charge valve or pump feeding a vessel: [K-210].'),
  hazards: registerHazards,
});

export const registerLimitsSchema = z.strictObject({
  low: quantityText.optional().describe('Low operating limit, a quantity such as "15 degC".'),
  high: quantityText.optional().describe('High operating limit, a quantity such as "245 degC".'),
  consequence: z.string().optional().describe('Consequence of deviating from the limit.'),
  correction: z.string().optional().describe('Steps required to correct or avoid the deviation.'),
});

export const registerAlarmsSchema = z.strictObject({
  low: quantityText.optional().describe('Low alarm, a quantity.'),
  high: quantityText.optional().describe('High alarm, a quantity.'),
});

export const registerSignalSchema = z.strictObject({
  text: text.describe('What the signal is, in plant words.'),
  unit: z.string().optional().describe('Unit of a numeric signal; pressures name gauge (kPag, barg, psig) or absolute (kPaa, bara, psia).'),
  range: z.tuple([z.number(), z.number()]).optional().describe('Range [low, high] the signal can take, in its unit.'),
  values: z.array(z.union([z.string(), z.boolean(), z.number()])).min(1).optional().describe('Allowed values of an enumerated or yes/no signal.'),
  equipment: z.string().optional().describe('Tag of the equipment the signal measures.'),
  limits: registerLimitsSchema.optional().describe('Operating limits of the signal, with consequence and correction.'),
  alarms: registerAlarmsSchema.optional().describe('Alarm levels, where the plant has them.'),
  params: z.array(z.string().regex(/^[a-z][a-z0-9-]*$/, 'must be a lower-case parameter name such as hot-oil-supply')).optional()
    .describe('Names of step parameters (`params` in a procedure) that set this signal, e.g. [hot-oil-supply]; such a parameter is checked against the signal\'s unit, limits and trips.'),
});

export const registerBypassSchema = z.strictObject({
  allowed: z.boolean().describe('Whether the function may be bypassed at all.'),
  procedure: z.string().optional().describe('Id of the procedure under which a bypass is allowed.'),
});

export const registerSafetyFunctionSchema = z.strictObject({
  text: z.string().optional().describe('Name of the safety function, e.g. "K-210 emergency shutdown".'),
  'trips-when': z.string().optional().describe('The trip condition in the condition language, e.g. "TI-210 >= 255 degC".'),
  starts: z.string().optional().describe('Id of another safety function this trip starts (e.g. the unit emergency shutdown).'),
  closes: tagList.optional().describe('Valves the function closes.'),
  opens: tagList.optional().describe('Valves the function opens.'),
  stops: tagList.optional().describe('Machines the function stops.'),
  'keeps-running': tagList.optional().describe('Machines the function leaves running on purpose.'),
  action: z.string().optional().describe('What the function does, in words, where the lists above do not say it all.'),
  latches: z.boolean().optional().describe('Whether the function stays tripped until it is reset.'),
  reset: z.string().optional().describe('How, and by whom, the function is reset.'),
  bypass: registerBypassSchema.optional().describe('Whether the function may be bypassed, and under which procedure.'),
  'proof-test': z.string().optional().describe('Proof-test interval, a duration such as "12 months".'),
});

export const registerReliefDeviceSchema = z.strictObject({
  text: z.string().optional().describe('What the device is, e.g. "Kettle relief valve".'),
  'set-pressure': quantityText.describe('Set pressure, with a gauge or absolute unit, e.g. "250 kPag".'),
  signal: z.string().optional().describe('The pressure signal the set pressure is compared with.'),
  protects: tagList.optional().describe('Equipment the device protects.'),
  'discharges-to': z.string().optional().describe('Where the device discharges.'),
});

export const registerChemicalSchema = z.strictObject({
  name: text.describe('The chemical\'s name.'),
  'hazard-statements': z.array(z.string().regex(/^(EU)?H\d{3}[A-Za-z]*(\+H\d{3}[A-Za-z]*)*$/, 'must be a GHS hazard statement code such as H226'))
    .optional().describe('GHS hazard statement codes, e.g. [H226, H304].'),
  'exposure-limits': z.array(text).optional().describe('Occupational exposure limits with their basis, as text.'),
  'first-aid': z.string().optional().describe('First aid after contact or exposure.'),
  sds: z.string().optional().describe('Where the safety data sheet is kept (a document number, path or address).'),
  hazards: registerHazards,
});

export const registerFileSchema = z.strictObject({
  areas: z.record(z.string(), registerAreaSchema).optional().describe('Plant areas, by id; the manual\'s home page groups procedures by them.'),
  equipment: z.record(z.string(), registerEquipmentSchema).optional().describe('Equipment, by tag.'),
  signals: z.record(z.string(), registerSignalSchema).optional().describe('Measurements and states, by tag, with their limits and alarms.'),
  'safety-functions': z.record(z.string(), registerSafetyFunctionSchema).optional().describe('Interlocks, trips and shutdown functions, by tag.'),
  'relief-devices': z.record(z.string(), registerReliefDeviceSchema).optional().describe('Relief valves and bursting discs, by tag.'),
  chemicals: z.record(z.string(), registerChemicalSchema).optional().describe('Chemicals handled, by id.'),
});

export type RegisterFileInput = z.infer<typeof registerFileSchema>;

/** The sections of a register file, in the order pages list them. */
export const registerSections = ['areas', 'equipment', 'signals', 'safety-functions', 'relief-devices', 'chemicals'] as const;
export type RegisterSection = (typeof registerSections)[number];
