/**
 * Dead states, flow exergy, heat exergy and the steady-state exergy balance of a control volume.
 *
 *   psi = (h - h0) - T0 (s - s0) + V^2/2 + g z            (specific flow exergy, J/kg)
 *   X_Q = (1 - T0/Tb) Q                                    (exergy carried by heat at boundary Tb)
 *   0   = sum (1 - T0/Tj) Qj - W + sum_in m psi - sum_out m psi - X_D
 *
 * with Q into the volume and W out of the volume positive.
 * @see docs/domain.md s.2; Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (1996), ch. 3.
 */
import { ThermoRangeError, requireRange } from './errors';
import type { GasMixture } from './gas';
import type { IncompressibleLiquid } from './liquid';
import { water } from './water';

/** Standard acceleration of gravity [m/s2] (CGPM 1901, exact). */
export const G_m_per_s2 = 9.80665;

/** Dead state of one substance: T0 [K], p0 [Pa], h0 [J/kg], s0 [J/(kg K)]. */
export interface DeadState {
  readonly T0: number;
  readonly p0: number;
  readonly h0: number;
  readonly s0: number;
}

/** Accepted dead-state range: T0 [K] and p0 [Pa]. */
export const T0_MIN_K = 200;
export const T0_MAX_K = 400;
export const P0_MIN_Pa = 5e4;
export const P0_MAX_Pa = 1.2e5;

function checkDead(T0_K: number, p0_Pa: number, what: string): void {
  requireRange('T0_K', T0_K, T0_MIN_K, T0_MAX_K, 'K', `dead state (${what})`);
  requireRange('p0_Pa', p0_Pa, P0_MIN_Pa, P0_MAX_Pa, 'Pa', `dead state (${what})`);
}

/**
 * Dead states per substance: h0 and s0 are the substance's own properties at (T0, p0), so that a
 * stream's psi is measured against the environment in thermal and mechanical equilibrium.
 */
export const deadState = Object.freeze({
  /**
   * Water at (T0, p0), from IAPWS-IF97 (compressed liquid at ordinary ambient conditions).
   * @param T0_K dead-state temperature [K], 200..400
   * @param p0_Pa dead-state pressure [Pa], 50..120 kPa
   * @throws ThermoRangeError outside those ranges or the water formulation's range
   * @see IAPWS R7-97(2012)
   */
  water(T0_K: number, p0_Pa: number): DeadState {
    checkDead(T0_K, p0_Pa, 'water');
    const st = water.pt(p0_Pa, T0_K);
    return Object.freeze({ T0: T0_K, p0: p0_Pa, h0: st.h, s0: st.s });
  },
  /**
   * An ideal-gas mixture of the stream's own composition at (T0, p0).
   * @param mix the gas mixture
   * @param T0_K dead-state temperature [K], 200..400
   * @param p0_Pa dead-state pressure [Pa], 50..120 kPa
   * @throws ThermoRangeError outside those ranges
   */
  gas(mix: GasMixture, T0_K: number, p0_Pa: number): DeadState {
    checkDead(T0_K, p0_Pa, 'gas');
    return Object.freeze({ T0: T0_K, p0: p0_Pa, h0: mix.h(T0_K), s0: mix.s(T0_K, p0_Pa) });
  },
  /**
   * An incompressible liquid at (T0, p0).
   * @param liq the liquid
   * @param T0_K dead-state temperature [K], 200..400
   * @param p0_Pa dead-state pressure [Pa], 50..120 kPa
   * @throws ThermoRangeError outside those ranges
   */
  liquid(liq: IncompressibleLiquid, T0_K: number, p0_Pa: number): DeadState {
    checkDead(T0_K, p0_Pa, 'liquid');
    return Object.freeze({ T0: T0_K, p0: p0_Pa, h0: liq.h(T0_K, p0_Pa), s0: liq.s(T0_K) });
  },
});

/** Kinetic and potential parts of a stream. */
export interface FlowExergyOptions {
  /** stream velocity [m/s], default 0 */
  velocity_m_per_s?: number;
  /** elevation above the reference level [m], default 0 */
  elevation_m?: number;
}

/**
 * Specific flow exergy (physical + kinetic + potential; no chemical part).
 * psi = (h - h0) - T0 (s - s0) + V^2/2 + g z, g = 9.80665 m/s2.
 * @param state the stream's h [J/kg] and s [J/(kg K)]
 * @param dead dead state of the same substance (same zero of h and s)
 * @param options velocity_m_per_s [m/s] and elevation_m [m], default 0
 * @returns psi [J/kg]
 * @throws ThermoRangeError for non-finite inputs
 * @see docs/domain.md s.2
 */
export function flowExergy(
  state: { h: number; s: number },
  dead: DeadState,
  { velocity_m_per_s = 0, elevation_m = 0 }: FlowExergyOptions = {},
): number {
  requireFinite('h', state.h);
  requireFinite('s', state.s);
  requireFinite('velocity_m_per_s', velocity_m_per_s);
  requireFinite('elevation_m', elevation_m);
  return state.h - dead.h0 - dead.T0 * (state.s - dead.s0) + 0.5 * velocity_m_per_s ** 2 + G_m_per_s2 * elevation_m;
}

function requireFinite(name: string, v: number, context = ''): void {
  if (!Number.isFinite(v)) throw new ThermoRangeError(name, v, 'a finite number', context);
}

/**
 * Exergy carried by heat crossing a boundary at temperature Tb: (1 - T0/Tb) Q.
 * Below T0 the factor is negative: heat into a cold volume carries exergy out of it.
 * @param Q_W heat flow [W] (sign kept)
 * @param Tb_K boundary temperature [K], > 0
 * @param T0_K dead-state temperature [K], > 0
 * @returns exergy flow [W], same sign convention as Q_W
 * @throws ThermoRangeError for non-positive temperatures
 * @see docs/domain.md s.2
 */
export function heatExergy(Q_W: number, Tb_K: number, T0_K: number): number {
  requireFinite('Q_W', Q_W);
  requireRange('Tb_K', Tb_K, 1e-6, 1e5, 'K', 'heat exergy');
  requireRange('T0_K', T0_K, 1e-6, 1e5, 'K', 'heat exergy');
  return (1 - T0_K / Tb_K) * Q_W;
}

/** A stream crossing the control-volume boundary. */
export interface BalanceStream {
  mDot_kg_per_s: number;
  h_J_per_kg: number;
  s_J_per_kgK: number;
  /** the stream's flow exergy [J/kg], from flowExergy (chemical part added by the caller if any) */
  psi_J_per_kg: number;
  direction: 'in' | 'out';
  label?: string;
  /** velocity [m/s] and elevation [m] for the energy balance; must match those used for psi */
  velocity_m_per_s?: number;
  elevation_m?: number;
}

/** A heat flow at a boundary temperature; into the volume positive. */
export interface BalanceHeat {
  Q_W: number;
  Tb_K: number;
  label?: string;
}

/** A power flow; out of the volume positive. */
export interface BalancePower {
  power_W: number;
  label?: string;
}

export interface ControlVolumeInput {
  T0_K: number;
  streams: BalanceStream[];
  heat?: BalanceHeat[];
  /** net power out of the volume [W], or a list of labelled entries (out positive) */
  power_W?: number | BalancePower[];
}

/** One term of the balance; every flow is signed as seen by the volume (into the volume positive). */
export interface BalanceTerm {
  kind: 'stream' | 'heat' | 'power';
  label: string;
  /** exergy into the volume [W] (negative: out of it) */
  exergy_W: number;
  /** energy into the volume [W] */
  energy_W: number;
  /** entropy into the volume [W/K] (power carries none) */
  entropy_W_per_K: number;
  /** mass into the volume [kg/s] */
  mass_kg_per_s: number;
}

export interface ControlVolumeResult {
  /** X_D from the exergy balance [W] */
  exergyDestroyed_W: number;
  /** S_gen from the entropy balance [W/K] */
  entropyGeneration_W_per_K: number;
  /** X_D - T0 S_gen [W]; zero when mass and energy close (Gouy-Stodola) */
  gouyStodolaGap_W: number;
  /** sum in - sum out of mass [kg/s] */
  massResidual_kg_per_s: number;
  /** Q - W + sum_in m (h + V^2/2 + g z) - sum_out m (...) [W] */
  energyResidual_W: number;
  /** sum of the exergy terms entering the volume [W] */
  exergyIn_W: number;
  /** sum of the exergy terms leaving the volume [W] (positive number) */
  exergyOut_W: number;
  terms: BalanceTerm[];
}

/**
 * Steady-state exergy, entropy, energy and mass balance of a control volume.
 *
 * X_D comes from the exergy balance, S_gen = sum_out m s - sum_in m s - sum Q/Tb from the entropy
 * balance, independently. Subtracting the two gives, per stream j with its own dead state,
 *   X_D - T0 S_gen = E_res - sum_in m (h0 - T0 s0)_j + sum_out m (h0 - T0 s0)_j,
 * so T0 S_gen = X_D (Gouy-Stodola) exactly when the energy balance closes (E_res = 0) and the mass of
 * every substance closes; a non-zero gouyStodolaGap_W therefore flags inconsistent input data.
 *
 * @param input T0_K [K] (200..400), streams (mDot [kg/s] >= 0, h [J/kg], s [J/(kg K)], psi [J/kg],
 *   direction), heat (Q_W [W] into the volume positive, Tb_K [K] > 0), power_W [W] (out positive)
 * @returns destruction [W], entropy generation [W/K], residuals and the signed terms
 * @throws ThermoRangeError for negative mass flows, non-finite numbers or bad temperatures
 * @see docs/domain.md s.2; Bejan, Tsatsaronis & Moran (1996) eq. 3.12 (exergy rate balance)
 */
export function controlVolumeBalance(input: ControlVolumeInput): ControlVolumeResult {
  const T0 = input.T0_K;
  requireRange('T0_K', T0, T0_MIN_K, T0_MAX_K, 'K', 'control-volume balance');
  const terms: BalanceTerm[] = [];
  for (let i = 0; i < input.streams.length; i++) {
    const st = input.streams[i]!;
    const label = st.label ?? `stream ${i + 1}`;
    requireRange('mDot_kg_per_s', st.mDot_kg_per_s, 0, 1e6, 'kg/s', label);
    requireFinite('h_J_per_kg', st.h_J_per_kg, label);
    requireFinite('s_J_per_kgK', st.s_J_per_kgK, label);
    requireFinite('psi_J_per_kg', st.psi_J_per_kg, label);
    requireFinite('velocity_m_per_s', st.velocity_m_per_s ?? 0, label);
    requireFinite('elevation_m', st.elevation_m ?? 0, label);
    if (st.direction !== 'in' && st.direction !== 'out') {
      throw new ThermoRangeError('direction', NaN, "'in' | 'out'", label);
    }
    const sign = st.direction === 'in' ? 1 : -1;
    const m = st.mDot_kg_per_s;
    const e = st.h_J_per_kg + 0.5 * (st.velocity_m_per_s ?? 0) ** 2 + G_m_per_s2 * (st.elevation_m ?? 0);
    terms.push({
      kind: 'stream',
      label,
      exergy_W: sign * m * st.psi_J_per_kg,
      energy_W: sign * m * e,
      entropy_W_per_K: sign * m * st.s_J_per_kgK,
      mass_kg_per_s: sign * m,
    });
  }
  (input.heat ?? []).forEach((q, i) => {
    const label = q.label ?? `heat ${i + 1}`;
    requireFinite('Q_W', q.Q_W, label);
    requireRange('Tb_K', q.Tb_K, 1, 1e5, 'K', label);
    terms.push({
      kind: 'heat',
      label,
      exergy_W: heatExergy(q.Q_W, q.Tb_K, T0),
      energy_W: q.Q_W,
      entropy_W_per_K: q.Q_W / q.Tb_K,
      mass_kg_per_s: 0,
    });
  });
  const powers: BalancePower[] =
    typeof input.power_W === 'number' ? [{ power_W: input.power_W, label: 'power' }] : (input.power_W ?? []);
  powers.forEach((w, i) => {
    const label = w.label ?? `power ${i + 1}`;
    requireFinite('power_W', w.power_W, label);
    terms.push({ kind: 'power', label, exergy_W: -w.power_W, energy_W: -w.power_W, entropy_W_per_K: 0, mass_kg_per_s: 0 });
  });

  let exergyIn = 0;
  let exergyOut = 0;
  let energy = 0;
  let entropyIn = 0;
  let mass = 0;
  for (const t of terms) {
    if (t.exergy_W >= 0) exergyIn += t.exergy_W;
    else exergyOut -= t.exergy_W;
    energy += t.energy_W;
    entropyIn += t.entropy_W_per_K;
    mass += t.mass_kg_per_s;
  }
  const XD = exergyIn - exergyOut;
  const Sgen = -entropyIn;
  return {
    exergyDestroyed_W: XD,
    entropyGeneration_W_per_K: Sgen,
    gouyStodolaGap_W: XD - T0 * Sgen,
    massResidual_kg_per_s: mass,
    energyResidual_W: energy,
    exergyIn_W: exergyIn,
    exergyOut_W: exergyOut,
    terms,
  };
}
