/**
 * Site atmospheric pressure from elevation, for gauge readings (src/lib/units adds p_atm_Pa to them).
 *
 * Standard-atmosphere barometric formula of the troposphere (constant lapse rate):
 *   p = p_b (1 - L h / T_b)^(g0 M / (R L))
 * with p_b = 101325 Pa, T_b = 288.15 K, L = 0.0065 K/m, g0 = 9.80665 m/s2, M = 0.0289644 kg/mol,
 * R = 8.3144598 J/(mol K) (the constants of the standard, which give the exponent 5.25588).
 *
 * @see U.S. Standard Atmosphere, 1976 (NOAA/NASA/USAF), eq. 33a and Table 4, geopotential altitude
 *      below 11 km; the same model as ISO 2533:1975 and ICAO Doc 7488.
 */

/** Sea-level standard pressure [Pa] (U.S. Standard Atmosphere 1976). */
export const P_SEA_LEVEL_Pa = 101325;
/** Sea-level standard temperature [K]. */
export const T_SEA_LEVEL_K = 288.15;
/** Tropospheric lapse rate [K/m]. */
export const LAPSE_RATE_K_per_m = 0.0065;
/** Standard gravity [m/s2]. */
export const G0_m_per_s2 = 9.80665;
/** Molar mass of air in the standard [kg/mol]. */
export const M_AIR_kg_per_mol = 0.0289644;
/** Gas constant as the 1976 standard states it [J/(mol K)]. */
export const R_STAR_J_per_molK = 8.3144598;

/** Elevations a plant may sit at [m]: the Dead Sea shore to high mountain sites. */
export const ELEVATION_MIN_m = -500;
export const ELEVATION_MAX_m = 6000;

/**
 * Standard-atmosphere pressure at an elevation.
 *
 * @param elevation_m elevation above mean sea level [m], -500..6000
 * @returns atmospheric pressure [Pa]
 * @throws RangeError outside -500..6000 m
 * @see U.S. Standard Atmosphere, 1976, eq. 33a (lapse-rate layer)
 */
export function pressureAtElevation(elevation_m: number): number {
  if (!(elevation_m >= ELEVATION_MIN_m && elevation_m <= ELEVATION_MAX_m)) {
    throw new RangeError(`elevation_m = ${elevation_m} m is outside ${ELEVATION_MIN_m}..${ELEVATION_MAX_m} m.`);
  }
  const exponent = (G0_m_per_s2 * M_AIR_kg_per_mol) / (R_STAR_J_per_molK * LAPSE_RATE_K_per_m);
  return P_SEA_LEVEL_Pa * Math.pow(1 - (LAPSE_RATE_K_per_m * elevation_m) / T_SEA_LEVEL_K, exponent);
}
