/**
 * Constants of IAPWS-IF97 (IAPWS R7-97(2012), Eqs. 1-3 and section 4) in SI base units.
 * @see IAPWS R7-97(2012) Revised Release on the IAPWS Industrial Formulation 1997
 */

/** Specific gas constant of water [J/(kg K)], R7-97(2012) Eq. 1. */
export const R = 461.526;
/** Critical temperature [K], R7-97(2012) Eq. 2. */
export const TC_K = 647.096;
/** Critical pressure [Pa], R7-97(2012) Eq. 3. */
export const PC_PA = 22.064e6;
/** Critical density [kg/m3], R7-97(2012) Eq. 4. */
export const RHOC_KG_PER_M3 = 322;

/** Lowest temperature of IF97 [K]. */
export const T_MIN_K = 273.15;
/** Upper temperature of regions 1 and 3 boundary (region 1 ends here) [K]. */
export const T_13_K = 623.15;
/** Highest temperature of region 2 [K]. */
export const T_25_K = 1073.15;
/** Highest temperature of region 5 [K]. */
export const T_MAX_K = 2273.15;
/** Highest pressure of regions 1-3 [Pa]. */
export const P_MAX_PA = 100e6;
/** Highest pressure of region 5 [Pa]. */
export const P_MAX_R5_PA = 50e6;
