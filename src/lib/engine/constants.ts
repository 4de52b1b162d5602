/**
 * The engine's method constants (common practice, docs/domain.md s.6), in one place for the engine's
 * steps (compute.ts, checks.ts, linkset.ts).
 */

/** Bumped whenever the engine's method changes, so that every stored hour is recomputed once. */
export const ENGINE_VERSION = 'lossline-engine-2';

/** First-law closure tolerance [-] of the energy throughput. Common practice (docs/domain.md s.6). */
export const ENERGY_CLOSURE_TOLERANCE = 0.05;
/** |D - T0 Sgen| tolerance as a share of D [-]. Lossline's default; common practice, not a published figure. */
export const ENTROPY_CHECK_TOLERANCE = 0.1;
/** Spread limits of fractions, absolute [-]: O2 2 %-points, vapour fraction 0.05. Common practice. */
export const SPREAD_O2_ABS = 0.02;
export const SPREAD_X_ABS = 0.05;
/** Dead-state temperatures the balances accept [K] (src/lib/equipment checkEnv). */
export const T0_RANGE_K: [number, number] = [200, 400];
/** Contributors listed in the audit trail. */
export const TOP_CONTRIBUTORS = 6;
/** The key of the unit's load among the steady-state test's tags. */
export const LOAD_KEY = 'load';

/** A unit's numeric parameter, or the fallback when it is absent or not a finite number. */
export function num(v: unknown, fallback: number): number {
  return typeof v === 'number' && Number.isFinite(v) ? v : fallback;
}

/** Null for what JSON and the database cannot hold (NaN, infinities, undefined). */
export const finiteOrNull = (v: number | null | undefined) => (v === null || v === undefined || !Number.isFinite(v) ? null : v);
