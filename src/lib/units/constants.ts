/**
 * Exact defining constants behind the conversion factors. Each factor in the registry is built from
 * these, so the digits are those of the definitions, not of a rounded table.
 *
 * @see NIST Special Publication 811 (2008), Guide for the Use of the International System of Units,
 *      Appendix B.8 (factors listed alphabetically) and B.9 (by kind of quantity).
 * @see BIPM, The International System of Units, 9th ed. (2019), Table 2 (defining constants).
 */

/** International foot [m], exact (international yard and pound agreement, 1959). */
export const FOOT_m = 0.3048;
/** Inch [m], exact. */
export const INCH_m = 0.0254;
/** Pound, avoirdupois [kg], exact (1959 agreement). */
export const POUND_kg = 0.45359237;
/** Standard acceleration of free fall g_n [m/s2], exact (3rd CGPM, 1901). */
export const STANDARD_GRAVITY_m_per_s2 = 9.80665;
/** Pound-force [N] = lb x g_n, exact. */
export const POUND_FORCE_N = POUND_kg * STANDARD_GRAVITY_m_per_s2;
/** Standard atmosphere [Pa], exact (10th CGPM, 1954). */
export const STANDARD_ATMOSPHERE_Pa = 101325;
/** International Table calorie [J], exact (5th International Conference on the Properties of Steam, 1956). */
export const CALORIE_IT_J = 4.1868;
/**
 * British thermal unit, International Table [J] = 1 cal_IT/(g K) x 1 lb x 1 degR, i.e. 4.1868 x 453.59237 x 5/9
 * = 1055.05585262 J exactly; NIST SP 811 B.8 prints 1.055056 E+03.
 */
export const BTU_IT_J = (CALORIE_IT_J * 1000 * POUND_kg * 5) / 9;
/** Conventional density of mercury for manometric units [kg/m3] (mmHg, inHg, conventional). */
export const MERCURY_CONVENTIONAL_kg_per_m3 = 13595.1;
/** Conventional density of water for manometric units [kg/m3] (mmH2O, inH2O, conventional). */
export const WATER_CONVENTIONAL_kg_per_m3 = 1000;
/** Celsius zero [K], exact. */
export const CELSIUS_ZERO_K = 273.15;
/** Molar gas constant R [J/(mol K)], exact since the 2019 SI (N_A k, both exact). */
export const MOLAR_GAS_CONSTANT_J_per_molK = 8.31446261815324;
