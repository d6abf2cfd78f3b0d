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

/** The register's trips and relief devices whose condition names `signal` and that the procedure does not declare or use. */
export function unnamedRegisterTrips(register: PlantRegister | undefined, procedure: Procedure, signal: string): UnnamedTrip[] {
  if (!register) return [];
  const named = new Set(procedure.interlocks.map((i) => i.tag));
  const out: UnnamedTrip[] = [];
  const add = (tag: string, text: string, file: string, path: readonly (string | number)[]) => {
    if (named.has(tag)) return;
    const parsed = parseCondition(text);
    if (!parsed.ok || !namesIn(parsed.condition).some((n) => n.name === signal)) return;
    // A condition the register cannot resolve is register-entry-invalid's; it is not guessed at here.
    if (resolveCondition(parsed.condition, procedure.signals).length) return;
    const range = register.sources.find((s) => s.file === file)?.source.rangeOf(path);
    out.push({ tag, text, condition: parsed.condition, related: { file, ...(range ? { range } : {}), message: `${tag} in the plant register` } });
  };
  for (const fn of register.safetyFunctions.values()) if (fn.tripsWhen) add(fn.id, fn.tripsWhen.value, fn.file, fn.tripsWhen.path);
  for (const device of register.reliefDevices.values()) {
    if (device.signal && device.setPressure.value) add(device.id, `${device.signal} >= ${device.setPressure.value}`, device.file, device.setPressure.path);
  }
  return out;
}
