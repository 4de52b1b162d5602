/**
 * Incompressible liquids of constant heat capacity and density (thermal oil, glycol loops, cooling
 * water where IF97 is not wanted):
 *
 *   h(T, p) = cp (T - T_ref) + v (p - p_ref),   s(T) = cp ln(T / T_ref),   v = 1 / rho,
 *
 * so that the flow exergy relative to a dead state (T0, p0) of the same liquid is
 *
 *   psi = cp [(T - T0) - T0 ln(T / T0)] + v (p - p0).
 *
 * The reference point (T_ref, p_ref) cancels in every difference; it only fixes the zero of h and s.
 * @see docs/domain.md s.5; Bejan, Tsatsaronis & Moran (1996), incompressible-substance model.
 */
import { ThermoRangeError, requireRange } from './errors';

/** Reference temperature of h = 0, s = 0 [K]. */
export const LIQUID_T_REF_K = 298.15;
/** Reference pressure of h = 0 [Pa]. */
export const LIQUID_P_REF_Pa = 101325;
/** Accepted temperature range [K]; whether the liquid exists there is the caller's judgement. */
export const LIQUID_T_MIN_K = 150;
export const LIQUID_T_MAX_K = 900;
/** Accepted pressure range [Pa]. */
export const LIQUID_P_MIN_Pa = 0;
export const LIQUID_P_MAX_Pa = 1e8;

/** Parameters of an incompressible liquid. */
export interface LiquidSpec {
  /** specific heat capacity [J/(kg K)], > 0 */
  cp_J_per_kgK: number;
  /** density [kg/m3], > 0 */
  rho_kg_per_m3: number;
  /** name shown to people */
  label?: string;
}

/** State of an incompressible liquid (SI: p Pa, T K, h J/kg, s J/(kg K), v m3/kg, cp J/(kg K)). */
export interface LiquidState {
  readonly p: number;
  readonly T: number;
  readonly h: number;
  readonly s: number;
  readonly v: number;
  readonly cp: number;
}

/** An incompressible liquid with its property functions. */
export interface IncompressibleLiquid {
  readonly label: string;
  readonly cp_J_per_kgK: number;
  readonly rho_kg_per_m3: number;
  /** specific volume [m3/kg] */
  readonly v_m3_per_kg: number;
  /** specific enthalpy [J/kg] at T_K [K], p_Pa [Pa] */
  h(T_K: number, p_Pa: number): number;
  /** specific entropy [J/(kg K)] at T_K [K] (independent of p) */
  s(T_K: number): number;
  /** full state at p_Pa [Pa], T_K [K] */
  pt(p_Pa: number, T_K: number): LiquidState;
  /** temperature [K] from h_J_per_kg [J/kg] at p_Pa [Pa] */
  T_ph(p_Pa: number, h_J_per_kg: number): number;
}

/**
 * Builds an incompressible liquid.
 * @param spec cp [J/(kg K)] and rho [kg/m3], both positive
 * @returns property functions valid for 150..900 K and 0..100 MPa
 * @throws ThermoRangeError for a non-positive cp or density
 * @see docs/domain.md s.5
 */
export function liquid(spec: LiquidSpec): IncompressibleLiquid {
  const label = spec.label ?? 'incompressible liquid';
  requireRange('cp_J_per_kgK', spec.cp_J_per_kgK, 1, 1e5, 'J/(kg K)', label);
  requireRange('rho_kg_per_m3', spec.rho_kg_per_m3, 1, 3e4, 'kg/m3', label);
  const cp = spec.cp_J_per_kgK;
  const v = 1 / spec.rho_kg_per_m3;
  const checkT = (T_K: number) => requireRange('T_K', T_K, LIQUID_T_MIN_K, LIQUID_T_MAX_K, 'K', label);
  const checkP = (p_Pa: number) => requireRange('p_Pa', p_Pa, LIQUID_P_MIN_Pa, LIQUID_P_MAX_Pa, 'Pa', label);
  const h = (T_K: number, p_Pa: number) => {
    checkT(T_K);
    checkP(p_Pa);
    return cp * (T_K - LIQUID_T_REF_K) + v * (p_Pa - LIQUID_P_REF_Pa);
  };
  const s = (T_K: number) => {
    checkT(T_K);
    return cp * Math.log(T_K / LIQUID_T_REF_K);
  };
  return Object.freeze({
    label,
    cp_J_per_kgK: cp,
    rho_kg_per_m3: spec.rho_kg_per_m3,
    v_m3_per_kg: v,
    h,
    s,
    pt(p_Pa: number, T_K: number): LiquidState {
      return Object.freeze({ p: p_Pa, T: T_K, h: h(T_K, p_Pa), s: s(T_K), v, cp });
    },
    T_ph(p_Pa: number, h_J_per_kg: number): number {
      checkP(p_Pa);
      const T = LIQUID_T_REF_K + (h_J_per_kg - v * (p_Pa - LIQUID_P_REF_Pa)) / cp;
      if (!(T >= LIQUID_T_MIN_K && T <= LIQUID_T_MAX_K)) {
        throw new ThermoRangeError('h_J_per_kg', h_J_per_kg, `values giving ${LIQUID_T_MIN_K}..${LIQUID_T_MAX_K} K`, label);
      }
      return T;
    },
  });
}

/**
 * Flow exergy of an incompressible liquid, closed form (no kinetic or potential part):
 * psi = cp [(T - T0) - T0 ln(T/T0)] + v (p - p0).
 * @param liq the liquid
 * @param T_K stream temperature [K]
 * @param p_Pa stream pressure [Pa]
 * @param T0_K dead-state temperature [K]
 * @param p0_Pa dead-state pressure [Pa]
 * @returns psi [J/kg]
 * @throws ThermoRangeError outside the liquid's range
 * @see docs/domain.md s.5
 */
export function liquidFlowExergy(liq: IncompressibleLiquid, T_K: number, p_Pa: number, T0_K: number, p0_Pa: number): number {
  requireRange('T_K', T_K, LIQUID_T_MIN_K, LIQUID_T_MAX_K, 'K', liq.label);
  requireRange('T0_K', T0_K, LIQUID_T_MIN_K, LIQUID_T_MAX_K, 'K', liq.label);
  requireRange('p_Pa', p_Pa, LIQUID_P_MIN_Pa, LIQUID_P_MAX_Pa, 'Pa', liq.label);
  requireRange('p0_Pa', p0_Pa, LIQUID_P_MIN_Pa, LIQUID_P_MAX_Pa, 'Pa', liq.label);
  return liq.cp_J_per_kgK * (T_K - T0_K - T0_K * Math.log(T_K / T0_K)) + liq.v_m3_per_kg * (p_Pa - p0_Pa);
}
