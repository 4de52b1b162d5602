/**
 * The catalogue of unit kinds and its lookups: for each kind of equipment, its ports, the
 * measurements it needs and its parameters with SI units and defaults.
 *
 * Pure data plus lookups. The admin screens, the completeness check (./status.ts), the model file
 * (./model.ts) and the hourly engine all read this one table, so a kind is declared once. The kind
 * names come from the one list of src/lib/kinds.ts; the parts live in
 *   ./port-terms.ts      what a port carries and what a link measures
 *   ./kind-spec.ts       the shape of an entry
 *   ./kind-parts.ts      the building blocks entries share
 *   ./kind-catalogue.ts  the entries
 */
import { UNIT_KINDS, type FluidKind, type UnitKind } from '../kinds';
import { SPECS } from './kind-catalogue';
import type { KindSpec, MeasurementSpec, ParamSpec, ParamValue, PortSlot } from './kind-spec';
import type { LinkQuantity } from './port-terms';

export { UNIT_KINDS, UNIT_KIND_LABELS, isUnitKind, type UnitKind } from '../kinds';
export * from './port-terms';
export type * from './kind-spec';

/** The catalogue entry of a kind. */
export function kindSpec(kind: UnitKind): KindSpec {
  const spec = SPECS[kind];
  if (!spec) throw new Error(`Unknown unit kind '${String(kind)}'. Kinds: ${UNIT_KINDS.join(', ')}.`);
  return spec;
}

/** The port slot of a kind, or undefined. */
export function portSlot(kind: UnitKind, slotName: string): PortSlot | undefined {
  return kindSpec(kind).ports.find((s) => s.slot === slotName);
}

/** The parameter spec of a kind, or undefined. */
export function paramSpec(kind: UnitKind, key: string): ParamSpec | undefined {
  return kindSpec(kind).params.find((s) => s.key === key);
}

/** Every parameter of a kind with its default, for a new unit (parameters without a default are left out). */
export function defaultParameters(kind: UnitKind): Record<string, ParamValue> {
  const out: Record<string, ParamValue> = {};
  for (const s of kindSpec(kind).params) if (s.default !== undefined) out[s.key] = s.default;
  return out;
}

/** The measurements a port of this slot may carry, given its fluid (onlyFor filters). */
export function measurementsFor(slotSpec: PortSlot, fluid: FluidKind | null): MeasurementSpec[] {
  return slotSpec.measurements.filter((m) => !m.onlyFor || (fluid !== null && m.onlyFor.includes(fluid)));
}

/** Link quantities a port of this slot (with this fluid) may take, or the unit itself when slotSpec is null. */
export function allowedQuantities(kind: UnitKind, slotSpec: PortSlot | null, fluid: FluidKind | null): LinkQuantity[] {
  const ms = slotSpec ? measurementsFor(slotSpec, fluid) : kindSpec(kind).unitMeasurements;
  return [...new Set(ms.flatMap((m) => m.anyOf))];
}
