// Reads a procedure against the plant register: the entries it uses (under `uses`, or by naming a register
// signal in a condition or setpoint) supply their declarations, so the analyses and pages see one definition.
import type { PathKey } from '../parse/read-source.ts';
import type { FromRegister, Interlock, Procedure, RegisterUse, Signal, UnheldOutput } from './procedure.ts';
import { describeSafetyFunction, type PlantRegister, type RegisterEntry, type RegisterReliefDevice, type RegisterSafetyFunction, type RegisterSignal } from './register.ts';
import { walkBlocks, walkSteps } from './walk-steps.ts';

const namePattern = /[A-Za-z][A-Za-z0-9_-]*/g;

/**
 * The procedure with the register's declarations added where the procedure does not declare them itself.
 * A local declaration always stays as written (a conflict with the register is the rules' business).
 */
export function applyRegister(procedure: Procedure, register: PlantRegister | undefined): Procedure {
  if (!register) return procedure;
  const uses: RegisterUse[] = [];
  const seen = new Set<string>();
  const signals: Record<string, Signal> = { ...procedure.signals };
  const limits = [...procedure.limits];
  const interlocks = [...procedure.interlocks];
  const localLimit = new Set(procedure.limits.map((l) => l.signal));
  const localTrip = new Set(procedure.interlocks.map((i) => i.tag));

  const use = (id: string, path: PathKey[], explicit: boolean) => {
    if (seen.has(id)) return;
    const entry = register.entries.get(id);
    if (!entry && !explicit) return;
    seen.add(id);
    uses.push({ id, path, explicit, ...(entry ? { entry } : {}) });
    if (!entry) return;
    bring(entry, path);
  };

  const bringSignal = (signal: RegisterSignal, path: PathKey[]) => {
    const from: FromRegister = { id: signal.id, file: signal.file, path: signal.path };
    if (!signals[signal.id]) {
      signals[signal.id] = { from, name: signal.id, text: signal.text, unit: signal.unit, range: signal.range, values: signal.values, path };
    }
    if (signal.limits && !localLimit.has(signal.id) && (signal.limits.low || signal.limits.high)) {
      limits.push({
        from: { ...from, path: signal.limits.path },
        signal: signal.id,
        low: signal.limits.low && { value: signal.limits.low.value, path },
        high: signal.limits.high && { value: signal.limits.high.value, path },
        consequence: signal.limits.consequence,
        correction: signal.limits.correction,
        path,
      });
      localLimit.add(signal.id);
    }
  };

  const bringNamesIn = (text: string, path: PathKey[]) => {
    for (const [name] of text.matchAll(namePattern)) if (register.signals.has(name)) use(name, path, false);
  };

  const bring = (entry: RegisterEntry, path: PathKey[]) => {
    switch (entry.section) {
      case 'signals':
        bringSignal(entry, path);
        return;
      case 'safety-functions':
        if (entry.tripsWhen && !localTrip.has(entry.id)) {
          interlocks.push(tripOf(entry, register, path));
          localTrip.add(entry.id);
        }
        if (entry.tripsWhen) bringNamesIn(entry.tripsWhen.value, path);
        return;
      case 'relief-devices':
        if (entry.signal && entry.setPressure.value && !localTrip.has(entry.id)) {
          interlocks.push(reliefOf(entry, path));
          localTrip.add(entry.id);
        }
        if (entry.signal) use(entry.signal, path, false);
        return;
      default:
        return;
    }
  };

  for (const u of procedure.uses) use(u.value, u.path, true);
  // Register signals the procedure names without declaring them are read from the register.
  const steps = walkSteps(procedure.steps);
  const paramSignals: Record<string, string> = {};
  const byParam = new Map<string, string>();
  for (const signal of register.signals.values()) for (const name of signal.params) if (!byParam.has(name)) byParam.set(name, signal.id);
  for (const { step } of steps) {
    for (const s of step.set) if (register.signals.has(s.signal)) use(s.signal, s.path, false);
    for (const param of step.params) {
      if (register.signals.has(param.name)) use(param.name, param.path, false);
      const target = byParam.get(param.name);
      if (target && !procedure.signals[param.name]) {
        paramSignals[param.name] = target;
        use(target, param.path, false);
      }
    }
    if (step.until) bringNamesIn(step.until.value, step.until.path);
  }
  for (const block of walkBlocks(procedure.steps)) {
    if (block.kind === 'choose') for (const b of block.branches) if (b.when) bringNamesIn(b.when.value, b.when.path);
  }
  for (const i of procedure.interlocks) bringNamesIn(i.tripsWhen.value, i.tripsWhen.path);
  for (const l of procedure.limits) if (register.signals.has(l.signal)) use(l.signal, l.path, false);
  for (const [name, s] of Object.entries(procedure.signals)) if (register.signals.has(name)) use(name, s.path, false);
  for (const i of procedure.interlocks) if (register.entries.has(i.tag)) use(i.tag, i.path, false);
  procedure.equipment.forEach((tag, i) => use(tag, ['equipment', i], false));

  // A register trip's held outputs are mapped onto the procedure's signals once every declaration is in.
  for (let i = 0; i < interlocks.length; i++) {
    const trip = interlocks[i];
    const fn = trip.from && !procedure.interlocks.includes(trip) ? register.safetyFunctions.get(trip.tag) : undefined;
    if (!fn) continue;
    const { holds, unheld } = heldOutputs(fn, register, signals, trip.path);
    const { unheld: _before, ...rest } = trip;
    interlocks[i] = { ...rest, holds, ...(unheld.length ? { unheld } : {}) };
  }

  return { ...procedure, signals, limits, interlocks, registerUses: uses, ...(Object.keys(paramSignals).length ? { paramSignals } : {}) };
}

/** A register safety function as the interlock a procedure shows: its trip and one description of what it does. */
export function tripOf(fn: RegisterSafetyFunction, register: PlantRegister, path: PathKey[], signals: Readonly<Record<string, Signal>> = {}): Interlock {
  const { holds, unheld } = heldOutputs(fn, register, signals, path);
  return {
    from: { id: fn.id, file: fn.file, path: fn.path },
    tag: fn.id,
    tripsWhen: { value: fn.tripsWhen?.value ?? '', path },
    action: describeSafetyFunction(fn, register),
    latches: fn.latches ?? (fn.starts ? register.safetyFunctions.get(fn.starts)?.latches : undefined) ?? false,
    holds,
    ...(unheld.length ? { unheld } : {}),
    ...(fn.latches === undefined && fn.starts && register.safetyFunctions.get(fn.starts)?.latches ? { latchesThrough: fn.starts } : {}),
    path,
  };
}

/**
 * The words a declared value may use for the state a safety function forces. Common practice: valve positions
 * are named open/closed (or shut), machines running/stopped (or on/off).
 */
const stateWords: Record<string, string[]> = {
  closed: ['closed', 'shut', 'close'],
  open: ['open', 'opened'],
  stopped: ['stopped', 'off', 'stop'],
};

/**
 * The outputs a safety function forces, with those of the functions it starts (a trip that starts the unit
 * emergency shutdown closes what the shutdown closes), as states of the procedure's enumerated signals, named as
 * the signal names its values. `keeps-running` is not a held output: the function leaves the machine alone.
 */
export function heldOutputs(fn: RegisterSafetyFunction, register: PlantRegister, signals: Readonly<Record<string, Signal>>, path: PathKey[]): { holds: Interlock['holds']; unheld: UnheldOutput[] } {
  const holds: Interlock['holds'] = [];
  const unheld: UnheldOutput[] = [];
  const seen = new Set<string>();
  const visited = new Set<string>();
  for (let f: RegisterSafetyFunction | undefined = fn; f && !visited.has(f.id); f = f.starts ? register.safetyFunctions.get(f.starts) : undefined) {
    visited.add(f.id);
    const via = f === fn ? undefined : f.id;
    for (const [tags, state] of [[f.closes, 'closed'], [f.opens, 'open'], [f.stops, 'stopped']] as const) {
      for (const tag of tags) {
        if (seen.has(tag)) continue;
        seen.add(tag);
        const signal = Object.hasOwn(signals, tag) ? signals[tag] : undefined;
        const values = (signal?.values ?? register.signals.get(tag)?.values ?? []).map(String);
        const value = values.find((v) => stateWords[state].includes(v.toLowerCase()));
        if (value !== undefined && signal) holds.push({ signal: tag, value, path });
        else unheld.push({ signal: tag, state, why: !signal ? 'not-declared' : !values.length ? 'no-values' : 'no-matching-value', ...(via ? { via } : {}) });
      }
    }
  }
  return { holds, unheld };
}

/** A relief device as the interlock a procedure shows: it lifts when its signal reaches the set pressure. */
export function reliefOf(device: RegisterReliefDevice, path: PathKey[]): Interlock {
  return {
    from: { id: device.id, file: device.file, path: device.path },
    tag: device.id,
    tripsWhen: { value: `${device.signal} >= ${device.setPressure.value}`, path },
    action: `Relief device lifts${device.dischargesTo ? ` to ${device.dischargesTo}` : ''}${device.protects.length ? `, protecting ${device.protects.join(', ')}` : ''}.`,
    latches: false,
    holds: [],
    path,
  };
}
