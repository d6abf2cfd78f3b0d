// Collects every quantity written for a signal (setpoints, operating limits) and what is wrong with it.
import type { PathKey } from '../parse/read-source.ts';
import type { Procedure } from '../model/procedure.ts';
import type { StepPlace } from '../model/walk-steps.ts';
import { isKnownUnit, parseQuantity, sameDimension, unitHint } from './units.ts';

export type QuantityProblem =
  | { kind: 'undeclared-name'; message: string; hint: string }
  | { kind: 'unit-mismatch'; message: string; hint: string }
  | { kind: 'unknown-unit'; message: string; hint: string }
  | { kind: 'bad-quantity'; message: string; hint: string };

export interface QuantitySite {
  /** `param`: a step parameter that names a signal, or that the register gives to a signal (its `params`). */
  role: 'setpoint' | 'param' | 'limit-low' | 'limit-high';
  /** For a parameter: its name as written (the signal may be another name). */
  param?: string;
  signal: string;
  text: string;
  path: PathKey[];
  /** The step that sets it (for setpoints). */
  step?: string;
  quantity?: { value: number; unit: string };
  problems: QuantityProblem[];
  /** The register entry the limit came from (its own problems are reported in the register file). */
  fromRegister?: string;
}

export function collectQuantities(procedure: Procedure, steps: StepPlace[]): QuantitySite[] {
  const sites: QuantitySite[] = [];
  const add = (role: QuantitySite['role'], signal: string, text: string, path: PathKey[], step?: string, fromRegister?: string, param?: string) => {
    const problems: QuantityProblem[] = [];
    const declared = procedure.signals[signal];
    if (!declared) {
      problems.push({
        kind: 'undeclared-name',
        message: `'${signal}' is not a declared signal.`,
        hint: `Declare it under 'signals' with its text, unit and range, or correct the name.`,
      });
    }
    const parsed = parseQuantity(text);
    let quantity: QuantitySite['quantity'];
    if (!parsed.ok) {
      const unitOnly = text.trim().split(/\s+/).slice(1).join(' ');
      problems.push(unitOnly && !isKnownUnit(unitOnly)
        ? { kind: 'unknown-unit', message: `'${unitOnly}' is not a unit Stepwright knows.`, hint: unitHint(unitOnly, declared?.unit && isKnownUnit(declared.unit) ? { unit: declared.unit, name: signal } : undefined) }
        : { kind: 'bad-quantity', message: `'${text}' is not a quantity: ${parsed.message}`, hint: parsed.hint });
    } else {
      quantity = { value: parsed.value, unit: parsed.unit };
      if (declared?.unit && !sameDimension(parsed.unit, declared.unit)) {
        problems.push({
          kind: 'unit-mismatch',
          message: `'${text}' is in ${parsed.unit}, which cannot be converted to ${signal}'s unit ${declared.unit}.`,
          hint: `Write the value in ${declared.unit} or a unit of the same kind.`,
        });
      } else if (declared && !declared.unit) {
        problems.push({
          kind: 'unit-mismatch',
          message: `'${signal}' has no unit, so it cannot take the quantity '${text}'.`,
          hint: `Give the signal a unit and range under 'signals'.`,
        });
      }
    }
    sites.push({ role, signal, text, path, step, quantity, problems, ...(fromRegister ? { fromRegister } : {}), ...(param ? { param } : {}) });
  };
  for (const { step } of steps) {
    for (const s of step.set) add('setpoint', s.signal, s.quantity, s.path, step.id);
    // A parameter is a setpoint in other words when it names a signal (or the register gives its name to one).
    for (const p of step.params) {
      const signal = procedure.signals[p.name] ? p.name : procedure.paramSignals?.[p.name];
      if (signal && typeof p.value !== 'boolean') add('param', signal, String(p.value), p.path, step.id, undefined, p.name);
    }
  }
  for (const limit of procedure.limits) {
    if (limit.low) add('limit-low', limit.signal, limit.low.value, limit.low.path, undefined, limit.from?.id);
    if (limit.high) add('limit-high', limit.signal, limit.high.value, limit.high.path, undefined, limit.from?.id);
  }
  return sites;
}
