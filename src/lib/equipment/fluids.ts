/**
 * Fluids at the ports of a unit and the port state built from a port's measurements.
 *
 * A fluid is plain data (`FluidSpec`, JSON-safe, so a plant model can be stored as it is); `prepareFluid`
 * turns it once into property functions of the property core (src/lib/thermo): IAPWS-IF97 water,
 * NASA-polynomial ideal-gas mixtures, fuels and combustion, incompressible liquids. `portState` gives
 * the state of one port: p, T, h, s, phase, and the flow exergy against the substance's own dead state
 * (physical, with kinetic and potential parts) plus, for gases and fuels, the standard chemical exergy
 * of the stream relative to the reference environment of Szargut, Morris & Steward (1988).
 *
 * Water near saturation: p and T do not fix a two-phase state, and a (p, T) pair within a tolerance of
 * Tsat(p) cannot tell wet steam from saturated liquid or vapour. Such a port state is computed as the
 * single-phase state on the measured side and flagged 'near-saturation' (the caller decides); a
 * two-phase state comes only from a vapour fraction x or an enthalpy h, never from (p, T).
 *
 * @see docs/domain.md sections 2, 4, 5; Bejan, Tsatsaronis & Moran, Thermal Design and Optimization
 *   (Wiley, 1996), ch. 3 (flow exergy, chemical exergy of ideal-gas mixtures).
 *
 * The parts: ./fluid-types.ts (the shapes), ./fluid-common.ts (fuels, air, the last step of a state),
 * one file per family of prepared fluid (./fluid-water.ts, ./fluid-gas.ts, ./fluid-liquid.ts); this
 * module prepares a fluid of any kind and is the one to import.
 */
import { dryAir, gaseousFuel, liquid, mixture, T_REF_K } from '../thermo';
import { BalanceInputError } from './errors';
import { airMoleFractions, buildFuel, fuelEnthalpy298_J_per_kg } from './fluid-common';
import { CondensedFuelFluid, FlueGasFamily, GasFluid } from './fluid-gas';
import { LiquidFluid } from './fluid-liquid';
import type { Environment, Fluid, FluidSpec, FuelSpec, PortMeasurement, PortState } from './fluid-types';
import { WaterFluid } from './fluid-water';

export type { Environment, Fluid, FluidSpec, FuelSpec, PortFlag, PortMeasurement, PortPhase, PortState } from './fluid-types';
export { FLUID_SPEC_MATCHES_FLUID_SPEC_KINDS } from './fluid-types';
export { airMoleFractions, buildFuel, fuelEnthalpy298_J_per_kg, fuelSpecOf } from './fluid-common';
export { SATURATION_TOLERANCE_K } from './fluid-water';

/**
 * Prepares a fluid once (mixtures precombined, fuels built); the result memoises its dead states.
 * @param spec the fluid as plain data
 * @param fuelOverride for a flue gas without its own fuel: the fuel it comes from (a boiler's fuel port)
 * @throws BalanceInputError for an incomplete spec; ThermoRangeError for bad compositions
 */
export function prepareFluid(spec: FluidSpec, fuelOverride?: FuelSpec): Fluid {
  switch (spec.kind) {
    case 'water':
      return new WaterFluid(spec);
    case 'gas':
      return new GasFluid(spec, mixture(spec.fractions, spec.basis), { kind: 'mixture', strict: false });
    case 'air': {
      const x = airMoleFractions(spec.humidity);
      return new GasFluid(spec, spec.humidity ? mixture(x, 'mole') : dryAir, { kind: 'mixture', strict: true });
    }
    case 'fuel-gas': {
      const fuel = gaseousFuel(spec.composition);
      return new GasFluid(spec, mixture(spec.composition, 'mole'), { kind: 'fuel', fuel }, 0, fuel);
    }
    case 'fuel': {
      const fuel = buildFuel(spec.fuel);
      if (fuel.phase === 'condensed') return new CondensedFuelFluid(spec, fuel);
      const mix = mixture(fuel.moleFractions!, 'mole');
      // Heating-value fuels: the typical composition gives cp and s, the stated LHV gives h.
      const hOffset = fuel.fuelType ? fuelEnthalpy298_J_per_kg(fuel) - mix.h(T_REF_K) : 0;
      return new GasFluid(spec, mix, { kind: 'fuel', fuel }, hOffset, fuel);
    }
    case 'flue-gas': {
      const fs = spec.fuel ?? fuelOverride;
      if (!fs) throw new BalanceInputError('MISSING_INPUT', 'fuel', 'a flue-gas fluid needs the fuel it comes from');
      return new FlueGasFamily(spec, buildFuel(fs));
    }
    case 'liquid':
      return new LiquidFluid(spec, liquid({ cp_J_per_kgK: spec.cp_J_per_kgK, rho_kg_per_m3: spec.rho_kg_per_m3 }));
    default:
      throw new BalanceInputError('INVALID_MODEL', 'fluid.kind', `unknown fluid kind '${(spec as { kind: string }).kind}'`);
  }
}

const prepared = new WeakMap<FluidSpec, Fluid>();

/** A prepared Fluid for a spec (memoised per spec object), or the Fluid itself. */
export function fluidOf(f: FluidSpec | Fluid): Fluid {
  if ('family' in f && typeof (f as Fluid).state === 'function') return f as Fluid;
  const spec = f as FluidSpec;
  let fl = prepared.get(spec);
  if (!fl) {
    fl = prepareFluid(spec);
    prepared.set(spec, fl);
  }
  return fl;
}

/**
 * State of the fluid at one port from its measurements.
 *
 * - water: (p_Pa, T_K) single phase, flagged 'near-saturation' when |T - Tsat(p)| <= tolerance;
 *   (p_Pa, x) two-phase; (p_Pa, h_J_per_kg) any phase. T is not used when x or h is given.
 * - gas, air, fuel-gas, gaseous fuel: (p_Pa, T_K) or (p_Pa, h_J_per_kg); eCh from Szargut 1988.
 * - flue-gas: as gas, plus O2_fraction [-] on the fluid's basis (composition by complete combustion).
 * - condensed fuel: taken at the dead state (psi = 0, eCh from the property core's correlations).
 * - liquid: (p_Pa, T_K) or (p_Pa, h_J_per_kg).
 *
 * @param fluid a FluidSpec (prepared once and memoised per object) or a prepared Fluid
 * @param m measurements in SI: p_Pa [Pa], T_K [K], x [-], h_J_per_kg [J/kg], O2_fraction [-],
 *   velocity_m_per_s [m/s], elevation_m [m]
 * @param env dead state: T0_K [K], p0_Pa [Pa]
 * @returns the port state (SI), with psi against the substance's own dead state
 * @throws BalanceInputError naming a missing measurement; ThermoRangeError outside a property range
 * @see docs/domain.md s.2 (psi), s.3 (wet steam), s.5 (formulations)
 */
export function portState(fluid: FluidSpec | Fluid, m: PortMeasurement, env: Environment): PortState {
  return fluidOf(fluid).state(m, env);
}

