// Reads a procedure against the plant register: the entries it uses (under `uses`, or by naming a register
// signal in a condition or setpoint) supply their declarations, so the analyses and pages see one definition.
import type { PathKey } from '../parse/read-source.ts';
import type { FromRegister, Interlock, Procedure, RegisterUse, Signal } from './procedure.ts';
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

  return { ...procedure, signals, limits, interlocks, registerUses: uses, ...(Object.keys(paramSignals).length ? { paramSignals } : {}) };
}

/** A register safety function as the interlock a procedure shows: its trip and one description of what it does. */
export function tripOf(fn: RegisterSafetyFunction, register: PlantRegister, path: PathKey[]): Interlock {
  return {
    from: { id: fn.id, file: fn.file, path: fn.path },
    tag: fn.id,
    tripsWhen: { value: fn.tripsWhen?.value ?? '', path },
    action: describeSafetyFunction(fn, register),
    latches: fn.latches ?? (fn.starts ? register.safetyFunctions.get(fn.starts)?.latches : undefined) ?? false,
    holds: heldOutputs(fn, register, path),
    path,
  };
}

/** The outputs a safety function forces, as states of register signals that can take those values. */
function heldOutputs(fn: RegisterSafetyFunction, register: PlantRegister, path: PathKey[]): Interlock['holds'] {
  const out: Interlock['holds'] = [];
  const add = (tags: string[], value: string) => {
    for (const tag of tags) {
      const values = register.signals.get(tag)?.values?.map(String);
      if (values?.includes(value)) out.push({ signal: tag, value, path });
    }
  };
  add(fn.closes, 'closed');
  add(fn.opens, 'open');
  add(fn.stops, 'stopped');
  add(fn.keepsRunning, 'running');
  return out;
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
