import { FLUID_LABELS, type FluidKind } from '~/lib/kinds';
import type { Fluid } from '~/lib/plant/model';
import { showComposition, parseComposition } from '../common';

/** The fields of the add-a-port form that describe its fluid or heat boundary, as typed. */
export interface FluidFields {
  fluid: string;
  composition: string;
  cp: string;
  rho: string;
  fuelFrom: string;
}

/** The fluid the fields describe, null for none, or a sentence saying what is missing. */
export function fluidOf(v: FluidFields): Fluid | null | string {
  switch (v.fluid as FluidKind | '') {
    case '':
      return null;
    case 'fuel-gas':
    case 'gas-mixture': {
      const c = parseComposition(v.composition);
      return c ? ({ kind: v.fluid, moleFractions: c } as Fluid) : 'Write species=fraction pairs, e.g. CH4=0.9, N2=0.1.';
    }
    case 'liquid': {
      const cp = Number(v.cp) * 1000;
      const rho = Number(v.rho);
      return cp > 0 && rho > 0 ? { kind: 'liquid', cp_J_per_kgK: cp, rho_kg_per_m3: rho } : 'Give cp [kJ/(kg K)] and density [kg/m3].';
    }
    case 'flue-gas':
      return v.fuelFrom ? { kind: 'flue-gas', fuelFrom: v.fuelFrom } : { kind: 'flue-gas' };
    default:
      return { kind: v.fluid } as Fluid;
  }
}

/** A port's fluid in words. */
export function describeFluid(f: Fluid | undefined): string {
  if (!f) return '—';
  switch (f.kind) {
    case 'fuel-gas':
    case 'gas-mixture':
      return `${FLUID_LABELS[f.kind]}: ${showComposition(f.moleFractions)}`;
    case 'liquid':
      return `liquid, cp ${f.cp_J_per_kgK / 1000} kJ/(kg K), ${f.rho_kg_per_m3} kg/m3`;
    case 'flue-gas':
      return f.fuelFrom ? `flue gas of ${f.fuelFrom}` : 'flue gas';
    default:
      return FLUID_LABELS[f.kind];
  }
}
