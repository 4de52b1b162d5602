/**
 * The shapes of the fluids at a unit's ports: a fluid as plain data (FluidSpec, FuelSpec), what is
 * measured at a port (PortMeasurement), the state computed from it (PortState) and a prepared fluid
 * (Fluid). The prepared fluids of each family are in ./fluid-water.ts, ./fluid-gas.ts and
 * ./fluid-liquid.ts; ./fluids.ts prepares them and is the module to import.
 */
import type { CombustionResult, Composition, DeadState, Fuel, FuelType, GasMixture, UltimateAnalysis, WaterPhase, AirSpec } from '../thermo';
import type { FluidFamily, FluidSpecKind } from '../kinds';

/** A fuel as plain data: a gas by mole fractions, a solid or liquid by ultimate analysis and LHV, or a type by LHV. */
export type FuelSpec =
  | { composition: Composition; label?: string }
  | { ultimate: UltimateAnalysis; LHV_J_per_kg: number; label?: string }
  | { fuelType: FuelType; LHV_J_per_kg: number };

/** The fluid at a port, as plain data. */
export type FluidSpec =
  /** water and steam (IAPWS-IF97); saturationTolerance_K [K] for the near-saturation flag, default 1 K */
  | { kind: 'water'; saturationTolerance_K?: number }
  /** an ideal-gas mixture of fixed composition, mole or mass fractions [-] */
  | { kind: 'gas'; fractions: Composition; basis: 'mole' | 'mass' }
  /** standard dry air, optionally humid (combustion air, fan and compressor air) */
  | { kind: 'air'; humidity?: AirSpec }
  /** a gaseous fuel by mole fractions [-] (physical and chemical exergy) */
  | { kind: 'fuel-gas'; composition: Composition }
  /** any fuel of the property core; condensed fuels are taken at the dead state (no physical exergy) */
  | { kind: 'fuel'; fuel: FuelSpec }
  /**
   * flue gas of complete combustion of `fuel` in (humid) air; its composition follows from the O2
   * fraction measured on `o2Basis`, given per port as PortMeasurement.O2_fraction. In a boiler the
   * fuel may be left out and is then the fuel port's.
   */
  | { kind: 'flue-gas'; fuel?: FuelSpec; o2Basis: 'dry' | 'wet'; air?: AirSpec }
  /** incompressible liquid of constant cp [J/(kg K)] and density [kg/m3] */
  | { kind: 'liquid'; cp_J_per_kgK: number; rho_kg_per_m3: number };
/** FluidSpec's kinds are exactly the one list's (src/lib/kinds.ts FLUID_SPEC_KINDS): a compile-time check. */
type SameKinds<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
export const FLUID_SPEC_MATCHES_FLUID_SPEC_KINDS: SameKinds<FluidSpec['kind'], FluidSpecKind> = true;

/** The dead state (environment) of a balance: T0 [K], p0 [Pa]. */
export interface Environment {
  T0_K: number;
  p0_Pa: number;
}

/** What is measured at a port, in SI. Which entries are needed depends on the fluid (see portState). */
export interface PortMeasurement {
  /** pressure [Pa] (absolute) */
  p_Pa?: number;
  /** temperature [K] */
  T_K?: number;
  /** water: vapour mass fraction [-], 0..1 (two-phase states) */
  x?: number;
  /** specific enthalpy [J/kg] on the fluid's own scale (IF97 for water, NASA absolute for gases) */
  h_J_per_kg?: number;
  /** flue gas: O2 mole fraction [-] on the fluid's o2Basis */
  O2_fraction?: number;
  /** velocity [m/s] for the kinetic part of the flow exergy, default 0 */
  velocity_m_per_s?: number;
  /** elevation above the reference level [m], default 0 */
  elevation_m?: number;
}

/** Phase of a port state. */
export type PortPhase = WaterPhase | 'gas' | 'liquid-incompressible' | 'condensed-fuel';

/**
 * Flags of a port state:
 * - 'near-saturation': water (p, T) within the tolerance of Tsat(p); the phase is uncertain;
 * - 'no-absolute-entropy': a condensed fuel has no absolute entropy in the property core, s is 0;
 * - 'below-dead-state': T < T0 (exergy grows while the stream warms toward T0).
 */
export type PortFlag = 'near-saturation' | 'no-absolute-entropy' | 'below-dead-state';

/**
 * State of the fluid at a port, SI base units: p [Pa], T [K], h [J/kg], s [J/(kg K)], x [-] (water
 * only, null when single-phase), psi [J/kg] flow exergy against the substance's own dead state
 * (physical + kinetic + potential), ePh [J/kg] the physical part alone, eCh [J/kg] standard chemical
 * exergy (gases and fuels; null for water and liquids, whose chemical exergy cancels in every balance).
 */
export interface PortState {
  readonly p: number;
  readonly T: number;
  readonly h: number;
  readonly s: number;
  readonly x: number | null;
  readonly phase: PortPhase;
  readonly psi: number;
  readonly ePh: number;
  readonly eCh: number | null;
  /** specific enthalpy of the same substance at the dead state [J/kg] (for energy throughput) */
  readonly h0: number;
  /** velocity [m/s] and elevation [m] used for psi (needed by the energy balance) */
  readonly velocity_m_per_s: number;
  readonly elevation_m: number;
  readonly flags: readonly PortFlag[];
}

/** Dead-state values of one fluid: h0 [J/kg], s0 [J/(kg K)], chemical exergy eCh [J/kg] or null. */
export interface DeadValues {
  readonly dead: DeadState;
  readonly eCh: number | null;
}

/** A prepared fluid: property functions of one FluidSpec. */
export interface Fluid {
  readonly spec: FluidSpec;
  /** how its state is computed (src/lib/kinds.ts FLUID_FAMILIES; 'flue-gas' is a family needing O2) */
  readonly family: FluidFamily;
  /** the ideal-gas mixture (gas family) */
  readonly mixture?: GasMixture;
  /** the fuel (fuels and flue gas) */
  readonly fuel?: Fuel;
  /** the combustion result (flue gas at a given O2) */
  readonly combustion?: CombustionResult;
  /** flue gas: the fluid at a measured O2 fraction [-] (memoised) */
  withO2(O2_fraction: number): Fluid;
  /** port state from measurements (see portState) */
  state(m: PortMeasurement, env: Environment): PortState;
  /** port state from pressure [Pa] and specific enthalpy [J/kg] (energy-balance states) */
  statePH(p_Pa: number, h_J_per_kg: number, env: Environment, velocity_m_per_s?: number, elevation_m?: number): PortState;
  /** specific enthalpy [J/kg] at p [Pa] and s [J/(kg K)] (isentropic end states) */
  hIsentropic(p_Pa: number, s_J_per_kgK: number): number;
  /** specific enthalpy [J/kg] and entropy [J/(kg K)] of this fluid at the dead state */
  deadValues(env: Environment): DeadValues;
}
