/**
 * Water and steam at a port (IAPWS-IF97): single phase from (p, T), flagged 'near-saturation' within
 * a tolerance of Tsat(p); two-phase only from a vapour fraction x or an enthalpy h.
 */
import { deadState, water } from '../thermo';
import { BalanceInputError, requireInput } from './errors';
import { Memo2, finishState, need } from './fluid-common';
import type { DeadValues, Environment, Fluid, FluidSpec, PortFlag, PortMeasurement, PortState } from './fluid-types';
import { upTo } from '../format';

/** Default tolerance of the near-saturation flag [K] (common practice: about the RTD uncertainty). */
export const SATURATION_TOLERANCE_K = 1;

const PC_Pa = 22.064e6;
/** Lowest temperature of IAPWS-IF97 [K]. */
const WATER_T_MIN_K = 273.15;
const P_TRIPLE_Pa = 611.213;

export class WaterFluid implements Fluid {
  readonly family = 'water' as const;
  private memo = new Memo2<DeadValues>();
  constructor(readonly spec: Extract<FluidSpec, { kind: 'water' }>) {}
  withO2(): Fluid {
    return this;
  }
  deadValues(env: Environment): DeadValues {
    const hit = this.memo.find(env.T0_K, env.p0_Pa);
    if (hit) return hit;
    if (env.T0_K < WATER_T_MIN_K) {
      throw new BalanceInputError(
        'IMPOSSIBLE_INPUT',
        'T0_K',
        `water's dead state needs T0 >= ${upTo(WATER_T_MIN_K, 2)} K, got ${upTo(env.T0_K, 2)} K (IAPWS-IF97 has no liquid below 0 degC); use a fixed site T0 for water units in frost`,
      );
    }
    return this.memo.put(env.T0_K, env.p0_Pa, { dead: deadState.water(env.T0_K, env.p0_Pa), eCh: null });
  }
  state(m: PortMeasurement, env: Environment): PortState {
    const p = need(m, 'p_Pa', 'water');
    const V = m.velocity_m_per_s ?? 0;
    const z = m.elevation_m ?? 0;
    if (m.h_J_per_kg !== undefined) return this.statePH(p, m.h_J_per_kg, env, V, z);
    const dv = this.deadValues(env);
    if (m.x !== undefined) {
      requireInput('x', m.x, 0, 1, '[-]', 'vapour fraction');
      const st = water.px(p, m.x);
      return finishState(p, st.T, st.h, st.s, m.x, 'two-phase', dv, env, V, z, []);
    }
    const T = need(m, 'T_K', 'water (give T_K, or x or h_J_per_kg for wet steam)');
    const st = water.pt(p, T);
    const flags: PortFlag[] = [];
    if (p > P_TRIPLE_Pa && p < PC_Pa) {
      const tol = this.spec.saturationTolerance_K ?? SATURATION_TOLERANCE_K;
      if (Math.abs(T - water.tsat(p)) <= tol) flags.push('near-saturation');
    }
    return finishState(p, T, st.h, st.s, null, st.phase, dv, env, V, z, flags);
  }
  statePH(p: number, h: number, env: Environment, V = 0, z = 0): PortState {
    const st = water.ph(p, h);
    const twoPhase = st.x !== null && st.x > 0 && st.x < 1;
    return finishState(p, st.T, st.h, st.s, st.x, twoPhase ? 'two-phase' : st.phase, this.deadValues(env), env, V, z, []);
  }
  hIsentropic(p: number, s: number): number {
    return water.h_ps(p, s);
  }
}
