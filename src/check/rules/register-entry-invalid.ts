// Reports register entries whose values cannot be used: a quantity or unit that does not read, a trip condition
// that names no register signal, a reference to an entry that does not exist. Procedures that use such an entry
// are not checked against the value, so the message says what was left unchecked.
import { closest, distance } from 'fastest-levenshtein';
import { parseCondition } from '../../analysis/conditions/parse.ts';
import { resolveCondition } from '../../analysis/conditions/resolve.ts';
import { checkUnit, parseQuantity, pressureReference, sameDimension, toBase, unitDimension } from '../../analysis/units.ts';
import type { PathKey } from '../../parse/read-source.ts';
import type { SourceRange } from '../../parse/diagnostic.ts';
import type { PlantRegister, RegisterQuantity, RegisterSignal } from '../../model/register.ts';
import { defineManualRule, type ManualContext } from '../define-rule.ts';

export default defineManualRule(
  {
    id: 'register-entry-invalid',
    summary: 'A register entry holds a value that cannot be used: a bad quantity or unit, a trip on an unknown signal, a reference to nothing.',
    category: 'limits',
    defaultSeverity: 'error',
    source: 'NIST SP 811, Appendix B (units and conversion factors); OSHA 29 CFR 1910.119(d)(3)(i)(B) and (f)(1)(ii): safe upper and lower limits',
    docs: `The register supplies limits, alarms, trips and relief set pressures to every procedure that uses it.
A value the checker cannot read would otherwise be skipped quietly in all of them, so it is reported here, once,
at its line in the register file, with what was left unchecked. The rule reports:

- a signal unit Stepwright does not know, or a range written backwards;
- a limit, alarm or relief set pressure that is not a quantity, has an unknown unit, or a unit of another kind
  than the signal's (\`250 degC\` on a pressure); a low limit or alarm above the high one;
- a trip condition that does not parse, names a signal the register does not define, or uses a wrong unit;
- a relief device whose set pressure is not a pressure, or whose \`signal\` is not a register pressure signal;
- \`starts\` naming no safety function (or a chain of \`starts\` that comes back to itself), a signal's
  \`equipment\`, an equipment's \`area\` or a relief device's \`protects\` naming nothing in the register;
- a safety function that neither trips on anything nor does anything, or whose \`proof-test\` interval is not a
  number of days, weeks, months or years (\`12 months\`);
- one phase parameter name given to two signals.

Duplicate ids are \`register-duplicate-entry\`; unknown keys and wrong value types are \`register-invalid\`.`,
    examples: {
      bad: 'signals:\n  TI-210: { text: Kettle temperature, unit: degC, limits: { high: 245 C } }\nsafety-functions:\n  TSHH-210: { trips-when: TI-201 >= 255 degC, starts: ESD-201 }',
      good: 'signals:\n  TI-210: { text: Kettle temperature, unit: degC, limits: { high: 245 degC } }\nsafety-functions:\n  TSHH-210: { trips-when: TI-210 >= 255 degC, starts: ESD-210 }',
    },
  },
  (ctx) => {
    const register = ctx.register;
    if (!register) return;
    const users = usersOf(ctx);
    const report: Reporter = (file, path, message, hint, part, range) =>
      ctx.reportInRegister(file, range ? { range, message, hint } : { path, part, message, hint });

    for (const signal of register.signals.values()) checkSignal(signal, register, users, report);
    checkSafetyFunctions(register, users, report);
    for (const device of register.reliefDevices.values()) {
      const who = unchecked(users, device.id);
      const q = parseQuantity(device.setPressure.value);
      if (!device.setPressure.value.trim()) {
        report(device.file, device.path, `Relief device ${device.id} has no set pressure${who}.`, 'Give its set pressure with a gauge or absolute unit, e.g. set-pressure: 250 kPag.', 'key');
      } else if (!q.ok) {
        report(device.file, device.setPressure.path, `The set pressure of ${device.id} ('${device.setPressure.value}') does not read: ${q.message}${who}`, q.hint);
      } else if (unitDimension(q.unit) !== 'pressure') {
        report(device.file, device.setPressure.path, `The set pressure of ${device.id} is in ${q.unit}, which is not a pressure${who}.`, 'Write it in a gauge (kPag, barg, psig) or absolute (kPaa, bara, psia) pressure unit.');
      }
      if (device.signal !== undefined) {
        const signal = register.signals.get(device.signal);
        if (!signal) {
          report(device.file, [...device.path, 'signal'], `Relief device ${device.id} names signal '${device.signal}', which the register does not define, so its set pressure is compared with no limit or trip.`, nearHint(device.signal, [...register.signals.keys()]));
        } else if (signal.unit && !checkUnit(signal.unit) && pressureReference(signal.unit) === null) {
          report(device.file, [...device.path, 'signal'], `Relief device ${device.id} names signal '${device.signal}', whose unit ${signal.unit} is not a pressure.`, 'Name the pressure signal of the protected equipment.');
        }
      }
      device.protects.forEach((tag, i) => {
        if (!register.entries.has(tag)) report(device.file, [...device.path, 'protects', i], `Relief device ${device.id} protects '${tag}', which the register does not define.`, nearHint(tag, [...register.equipment.keys()]));
      });
    }
    for (const item of register.equipment.values()) {
      if (item.area !== undefined && !register.areas.has(item.area)) {
        report(item.file, [...item.path, 'area'], `Equipment ${item.id} stands in area '${item.area}', which the register does not define, so the manual cannot name its area.`, nearHint(item.area, [...register.areas.keys()]));
      }
    }
    checkParamNames(register, report);
  },
);

type Reporter = (file: string, path: PathKey[], message: string, hint: string, part?: 'key' | 'value', range?: SourceRange) => void;

/** How many procedures use each register entry (a shutdown function counts the users of the trips that start it). */
function usersOf(ctx: ManualContext): Map<string, number> {
  const count = new Map<string, number>();
  for (const f of ctx.files) {
    const ids = new Set((f.procedure?.registerUses ?? []).map((u) => u.id));
    for (const id of [...ids]) {
      const started = ctx.register?.safetyFunctions.get(id)?.starts;
      if (started) ids.add(started);
    }
    for (const id of ids) count.set(id, (count.get(id) ?? 0) + 1);
  }
  return count;
}

/** ", so it is not checked against the setpoints of the 3 procedures that use TI-210" or the like. */
function unchecked(users: Map<string, number>, id: string): string {
  const n = users.get(id) ?? 0;
  return n === 0
    ? `; nothing that uses ${id} can be checked against it`
    : `; the ${n} procedure${n === 1 ? '' : 's'} using ${id} ${n === 1 ? 'is' : 'are'} not checked against it`;
}

function checkSignal(signal: RegisterSignal, register: PlantRegister, users: Map<string, number>, report: Reporter): void {
  const who = unchecked(users, signal.id);
  const unitProblem = signal.unit !== undefined ? checkUnit(signal.unit) : null;
  if (unitProblem) report(signal.file, [...signal.path, 'unit'], `Signal ${signal.id} has unit '${signal.unit}': ${unitProblem.message.replace(/\.$/, '')}${who}.`, unitProblem.hint);
  if (signal.range && signal.range[0] > signal.range[1]) {
    report(signal.file, [...signal.path, 'range'], `The range of ${signal.id} runs backwards ([${signal.range.join(', ')}]).`, `Write the low end first: [${signal.range[1]}, ${signal.range[0]}].`);
  }
  if (signal.equipment !== undefined && !register.entries.has(signal.equipment)) {
    report(signal.file, [...signal.path, 'equipment'], `Signal ${signal.id} measures '${signal.equipment}', which the register does not define.`, nearHint(signal.equipment, [...register.equipment.keys()]));
  }
  const usable = signal.unit !== undefined && !unitProblem;
  const readings: Partial<Record<string, number>> = {};
  const quantities: Array<[string, RegisterQuantity | undefined]> = [
    ['low operating limit', signal.limits?.low], ['high operating limit', signal.limits?.high],
    ['low alarm', signal.alarms?.low], ['high alarm', signal.alarms?.high],
  ];
  for (const [what, q] of quantities) {
    if (!q) continue;
    const parsed = parseQuantity(q.value, usable ? { unit: signal.unit!, name: signal.id } : undefined);
    if (!parsed.ok) {
      report(signal.file, q.path, `The ${what} of ${signal.id} ('${q.value}') does not read: ${parsed.message.replace(/\.$/, '')}${who}.`, parsed.hint);
      continue;
    }
    if (signal.unit === undefined) {
      report(signal.file, q.path, `Signal ${signal.id} has a ${what} (${q.value}) but no unit, so the ${what} means nothing${who}.`, "Give the signal its unit (and range) under 'unit'.");
      continue;
    }
    if (usable && !sameDimension(parsed.unit, signal.unit)) {
      report(signal.file, q.path, `The ${what} of ${signal.id} is in ${parsed.unit}, which cannot be converted to the signal's unit ${signal.unit}${who}.`, `Write it in ${signal.unit} or a unit of the same kind.`);
      continue;
    }
    const base = toBase(parsed.value, parsed.unit);
    if (base !== null) readings[what] = base;
  }
  for (const kind of ['operating limit', 'alarm']) {
    const low = readings[`low ${kind}`];
    const high = readings[`high ${kind}`];
    if (low !== undefined && high !== undefined && low > high) {
      const path = kind === 'alarm' ? signal.alarms!.low!.path : signal.limits!.low!.path;
      report(signal.file, path, `The low ${kind} of ${signal.id} is above its high ${kind}, so no value lies within them.`, 'Swap the two values, or correct the one that is wrong.');
    }
  }
}

/** A proof-test interval: a positive number and a calendar period ("12 months", "1 year", "26 weeks", "90 days"). */
const proofTestInterval = /^(?!0+(\.0+)?\s)\d+(\.\d+)?\s+(days?|weeks?|months?|years?)$/;

function checkSafetyFunctions(register: PlantRegister, users: Map<string, number>, report: Reporter): void {
  const signals = Object.fromEntries([...register.signals].map(([id, s]) => [id, { unit: s.unit !== undefined && !checkUnit(s.unit) ? s.unit : undefined, range: s.range, values: s.values }]));
  for (const fn of register.safetyFunctions.values()) {
    const who = unchecked(users, fn.id);
    if (fn.tripsWhen) {
      const parsed = parseCondition(fn.tripsWhen.value);
      const source = register.sources.find((s) => s.file === fn.file)?.source;
      const at = (from: number, to: number) => source?.rangeInScalar(fn.tripsWhen!.path, from, to);
      if (!parsed.ok) {
        report(fn.file, fn.tripsWhen.path, `The trip condition of ${fn.id} does not read: ${parsed.error.message.replace(/\.$/, '')}${who}.`, parsed.error.hint);
      } else {
        for (const problem of resolveCondition(parsed.condition, signals)) {
          const range = at(problem.span.from, problem.span.to);
          const message = problem.kind === 'undeclared-name'
            ? `The trip condition of ${fn.id} names a signal the register does not define: ${problem.message.replace(/\.$/, '')}${who}.`
            : `The trip condition of ${fn.id}: ${problem.message.replace(/\.$/, '')}${who}.`;
          report(fn.file, fn.tripsWhen.path, message, problem.hint, 'value', range);
        }
      }
    }
    if (fn.proofTest !== undefined && !proofTestInterval.test(fn.proofTest.trim())) {
      report(fn.file, [...fn.path, 'proof-test'], `The proof-test interval of ${fn.id} ('${fn.proofTest}') does not read as a number of days, weeks, months or years, so nobody can tell when the next test is due.`, 'Write it as a number and a period, e.g. proof-test: 12 months.');
    }
    if (fn.starts !== undefined) {
      if (!register.safetyFunctions.has(fn.starts)) {
        report(fn.file, [...fn.path, 'starts'], `${fn.id} starts '${fn.starts}', which is not a safety function in the register, so procedures using ${fn.id} show no action for it.`, nearHint(fn.starts, [...register.safetyFunctions.keys()]));
      } else {
        const chain = [fn.id];
        let next: string | undefined = fn.starts;
        while (next !== undefined && !chain.includes(next)) {
          chain.push(next);
          next = register.safetyFunctions.get(next)?.starts;
        }
        if (next === fn.id) report(fn.file, [...fn.path, 'starts'], `${fn.id} starts itself (${[...chain, fn.id].join(' -> ')}), so what it does is never said.`, "Let the last function of the chain close, open or stop something instead of starting another.");
      }
    }
    const acts = fn.starts !== undefined || fn.closes.length + fn.opens.length + fn.stops.length > 0 || !!fn.action?.trim();
    if (!acts && (fn.tripsWhen || fn.keepsRunning.length)) {
      report(fn.file, fn.path, `Safety function ${fn.id} does nothing: it has no 'starts', 'closes', 'opens', 'stops' or 'action'.`, 'Say what the function does when it trips, or which shutdown it starts.', 'key');
    }
  }
}

function checkParamNames(register: PlantRegister, report: Reporter): void {
  const owner = new Map<string, string>();
  for (const signal of register.signals.values()) {
    signal.params.forEach((name, i) => {
      const earlier = owner.get(name);
      if (earlier && earlier !== signal.id) {
        report(signal.file, [...signal.path, 'params', i], `Phase parameter '${name}' is given to ${earlier} and to ${signal.id}, so a procedure's '${name}' could be checked against either.`, 'Give each parameter name to one signal.');
      } else owner.set(name, signal.id);
    });
  }
}

function nearHint(name: string, candidates: string[]): string {
  const same = candidates.find((c) => c.toLowerCase() === name.toLowerCase());
  if (same) return `Did you mean '${same}'? Tags are case-sensitive.`;
  const near = candidates.length ? closest(name, candidates) : undefined;
  return near && distance(near, name) <= Math.max(2, Math.floor(name.length / 3)) ? `Did you mean '${near}'?` : 'Add the entry to the register, or correct the name.';
}
