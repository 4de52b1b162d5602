/** An incompressible liquid at a port: constant cp [J/(kg K)] and density [kg/m3]. */
import { deadState, T_REF_K, type IncompressibleLiquid } from '../thermo';
import { Memo2, finishState, need } from './fluid-common';
import type { DeadValues, Environment, Fluid, FluidSpec, PortMeasurement, PortState } from './fluid-types';

export class LiquidFluid implements Fluid {
  readonly family = 'liquid' as const;
  private memo = new Memo2<DeadValues>();
  constructor(readonly spec: FluidSpec, private readonly liq: IncompressibleLiquid) {}
  withO2(): Fluid {
    return this;
  }
  deadValues(env: Environment): DeadValues {
    return this.memo.find(env.T0_K, env.p0_Pa) ?? this.memo.put(env.T0_K, env.p0_Pa, { dead: deadState.liquid(this.liq, env.T0_K, env.p0_Pa), eCh: null });
  }
  state(m: PortMeasurement, env: Environment): PortState {
    const p = need(m, 'p_Pa', 'liquid');
    const V = m.velocity_m_per_s ?? 0;
    const z = m.elevation_m ?? 0;
    if (m.h_J_per_kg !== undefined) return this.statePH(p, m.h_J_per_kg, env, V, z);
    const T = need(m, 'T_K', 'liquid');
    return finishState(p, T, this.liq.h(T, p), this.liq.s(T), null, 'liquid-incompressible', this.deadValues(env), env, V, z, []);
  }
  statePH(p: number, h: number, env: Environment, V = 0, z = 0): PortState {
    const T = this.liq.T_ph(p, h);
    return finishState(p, T, h, this.liq.s(T), null, 'liquid-incompressible', this.deadValues(env), env, V, z, []);
  }
  /** s depends on T only, so the isentropic end state keeps T: h(T(s), p). */
  hIsentropic(p: number, s: number): number {
    return this.liq.h(T_REF_K * Math.exp(s / this.liq.cp_J_per_kgK), p);
  }
}
