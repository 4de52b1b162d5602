/** Fuels of the plant model as the equipment library takes them (compositions scaled to sum to 1). */
import type { FluidSpec, FuelSpec } from '../equipment';
import type { FuelDefinition } from '../plant/model';

export function normalised(fr: Record<string, number>): Record<string, number> {
  let s = 0;
  for (const v of Object.values(fr)) s += v;
  const out: Record<string, number> = {};
  for (const [k, v] of Object.entries(fr)) if (v > 0) out[k] = v / s;
  return out;
}

/** The equipment FuelSpec of a plant fuel definition (gas compositions scaled to sum to 1). */
export function fuelSpecOfDefinition(f: FuelDefinition): FuelSpec {
  if (f.by === 'composition') return { composition: normalised(f.moleFractions) as never };
  if (f.by === 'heating-value') return { fuelType: f.fuelType, LHV_J_per_kg: f.LHV_J_per_kg };
  return { ultimate: { ...f.ultimate }, LHV_J_per_kg: f.LHV_J_per_kg };
}

/** The equipment FluidSpec of a unit's fuel. */
export function fuelFluidOf(f: FuelDefinition): FluidSpec {
  if (f.by === 'composition') return { kind: 'fuel-gas', composition: normalised(f.moleFractions) as never };
  return { kind: 'fuel', fuel: fuelSpecOfDefinition(f) };
}

