/**
 * A port as a balance takes it (flow and state given or to be found) and as it comes out of
 * resolution (./resolve.ts). Kept apart from ./balance.ts so resolution and assembly import it
 * without importing each other.
 */
import type { Fluid, FluidSpec, PortMeasurement, PortState } from './fluids';

/** How a port's state is given to a balance. */
export type PortStateInput =
  | PortMeasurement
  /** unknown: from the energy balance at the given pressure (wet turbine exhaust, valve outlet) */
  | { fromEnergyBalance: true; p_Pa: number; velocity_m_per_s?: number; elevation_m?: number }
  /** the port is at the dead state (T0, p0), e.g. combustion air drawn from the environment */
  | 'ambient';

/** How a port's mass flow is given [kg/s]. */
export type PortFlowInput =
  | number
  /** closes the mass balance of the port's group (at most one per group) */
  | 'mass-balance'
  /** closes the energy balance (at most one per unit) */
  | 'energy-balance'
  /** boiler air and flue gas: fuel flow times the combustion ratio from the measured O2 */
  | 'fuel-ratio';

/** A port as given to a balance function. */
export interface BalancePort {
  /** unique name of the port within the unit (used in labels, flags and results) */
  name: string;
  direction: 'in' | 'out';
  fluid: FluidSpec | Fluid;
  mDot_kg_per_s: PortFlowInput;
  /** measurements, an energy-balance placeholder, or 'ambient' */
  measured: PortStateInput;
  /** an already computed state (skips `measured`; the hourly engine passes memoised states) */
  state?: PortState;
  /** kind-specific role: hot/cold (heat exchanger), fuel/air/flue-gas/water/blowdown (boiler), ... */
  role?: string;
  /** mass-balance group (separate lines of one unit: hot/cold side, HP and reheat) */
  group?: string;
}

/** A port after resolution: flow and state known. */
export interface ResolvedPort {
  name: string;
  direction: 'in' | 'out';
  fluid: Fluid;
  mDot: number;
  state: PortState;
  role: string | undefined;
  group: string;
}
