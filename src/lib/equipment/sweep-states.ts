/**
 * Moved water states of the uncertainty sweep (./sweep-kernel.ts), written into a scratch state that
 * lives for one evaluation of the kernel: the figures WaterFluid.state / statePH and finishState give
 * (./fluid-water.ts, ./fluid-common.ts) from one IF97 call, with no objects made and no flags (the
 * flags are the point's; the sweep reads none).
 */
import { G_m_per_s2, flowExergy, water } from '../thermo';
import type { Environment, Fluid, PortState } from './fluids';

export type Mutable<T> = { -readonly [K in keyof T]: T[K] };

const NO_FLAGS: readonly [] = Object.freeze([]) as readonly [];

/** A scratch state of a port with velocity V [m/s] and elevation z [m]. */
export function scratchState(V: number, z: number): Mutable<PortState> {
  return { p: NaN, T: NaN, h: NaN, s: NaN, x: null, phase: 'liquid', psi: NaN, ePh: NaN, eCh: null, h0: NaN, velocity_m_per_s: V, elevation_m: z, flags: NO_FLAGS };
}

/** The exergy figures of st (h and s set) against the water's dead state, as finishState sums them. */
function finish(st: Mutable<PortState>, fluid: Fluid, env: Environment): PortState {
  const dv = fluid.deadValues(env);
  const ePh = flowExergy(st, dv.dead);
  const V = st.velocity_m_per_s;
  st.ePh = ePh;
  st.psi = ePh + 0.5 * V * V + G_m_per_s2 * st.elevation_m;
  st.eCh = dv.eCh;
  st.h0 = dv.dead.h0;
  return st;
}

/** A moved water (p, T) state: one water.pt evaluation (water.hs_pt). */
export function movedWaterPT(st: Mutable<PortState>, fluid: Fluid, env: Environment, p: number, T: number): PortState {
  st.phase = water.hs_pt(p, T, st);
  st.p = p;
  st.T = T;
  return finish(st, fluid, env);
}

/** A water state from the energy balance at (p, h): one IF97 (p, h) solve (water.ths_ph). */
export function movedWaterPH(st: Mutable<PortState>, fluid: Fluid, env: Environment, p: number, h: number): PortState {
  st.phase = water.ths_ph(p, h, st);
  st.p = p;
  return finish(st, fluid, env);
}
