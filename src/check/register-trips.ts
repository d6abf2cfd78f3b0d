// Register trips and relief devices on a signal that a procedure does not name: they act in the plant whether or
// not the procedure lists them, so setpoints and parameters are checked against them too.
import { parseCondition } from '../analysis/conditions/parse.ts';
import type { Condition } from '../analysis/conditions/ast.ts';
import { resolveCondition } from '../analysis/conditions/resolve.ts';
import { namesIn } from '../analysis/conditions/parse.ts';
import type { Procedure } from '../model/procedure.ts';
import type { PlantRegister } from '../model/register.ts';
import type { Report } from './define-rule.ts';

export interface UnnamedTrip {
  tag: string;
  text: string;
  condition: Condition;
  related: NonNullable<Report['related']>[number];
}

/** One register trip or relief device whose condition reads: its condition and the signals it names. */
interface RegisterTrip {
  tag: string;
  text: string;
  file: string;
  path: readonly (string | number)[];
  condition: Condition;
  names: ReadonlySet<string>;
}

/**
 * The register's trips and relief devices with their conditions read, in register order: made once per register
 * (which is never changed once built), where every setpoint of every procedure used to read them again.
 */
const tripsOfRegister = new WeakMap<PlantRegister, RegisterTrip[]>();

function registerTrips(register: PlantRegister): RegisterTrip[] {
  let trips = tripsOfRegister.get(register);
  if (trips) return trips;
  trips = [];
  const add = (tag: string, text: string, file: string, path: readonly (string | number)[]) => {
    const parsed = parseCondition(text);
    if (!parsed.ok) return;
    trips!.push({ tag, text, file, path, condition: parsed.condition, names: new Set(namesIn(parsed.condition).map((n) => n.name)) });
  };
  for (const fn of register.safetyFunctions.values()) if (fn.tripsWhen) add(fn.id, fn.tripsWhen.value, fn.file, fn.tripsWhen.path);
  for (const device of register.reliefDevices.values()) {
    if (device.signal && device.setPressure.value) add(device.id, `${device.signal} >= ${device.setPressure.value}`, device.file, device.setPressure.path);
  }
  tripsOfRegister.set(register, trips);
  return trips;
}

/** The register's trips and relief devices whose condition names `signal` and that the procedure does not declare or use. */
export function unnamedRegisterTrips(register: PlantRegister | undefined, procedure: Procedure, signal: string): UnnamedTrip[] {
  if (!register) return [];
  const out: UnnamedTrip[] = [];
  let named: Set<string> | undefined;
  for (const trip of registerTrips(register)) {
    if (!trip.names.has(signal)) continue;
    named ??= new Set(procedure.interlocks.map((i) => i.tag));
    if (named.has(trip.tag)) continue;
    // A condition the register cannot resolve is register-entry-invalid's; it is not guessed at here.
    if (resolveCondition(trip.condition, procedure.signals).length) continue;
    const range = register.sources.find((s) => s.file === trip.file)?.source.rangeOf(trip.path);
    out.push({
      tag: trip.tag, text: trip.text, condition: trip.condition,
      related: { file: trip.file, ...(range ? { range } : {}), message: `${trip.tag} in the plant register` },
    });
  }
  return out;
}
