/**
 * Standard chemical exergy: one named table only, Szargut, Morris & Steward (1988), reference
 * environment at T0 = 298.15 K, p0 = 101.325 kPa. Values of other tables (Ahrendts, Szargut 2007)
 * rest on different reference environments and must not be mixed with these.
 *
 * @see J. Szargut, D. R. Morris, F. R. Steward, Exergy Analysis of Thermal, Chemical and Metallurgical
 *   Processes, Hemisphere, New York, 1988 (values as listed in docs/reference/check-values.md, s.3).
 */
import type { Fuel, UltimateAnalysis } from './combustion';
import { ThermoRangeError, requireRange } from './errors';
import { R_J_per_molK, normaliseFractions, species, type Composition, type SpeciesName } from './gas';

/** Temperature of the standard reference environment [K]. */
export const T0_STD_K = 298.15;
/** Pressure of the standard reference environment [Pa]. */
export const P0_STD_Pa = 101325;

/** Substances of the table: the gas species of gas.ts plus liquid water and graphite. */
export type ChemicalExergySubstance = SpeciesName | 'H2O(l)' | 'C(graphite)';

/**
 * Standard chemical exergy [J/mol], Szargut, Morris & Steward 1988. H2O is the vapour (9.5 kJ/mol),
 * 'H2O(l)' the liquid. C(graphite) 410.26 kJ/mol is from memory, reproduced from CO2 and dGf(CO2)
 * (see check-values.md s.3, consistency checks). SO2 313.4 kJ/mol is from the same 1988 tabulation
 * (libChemExSzargut1988, TU Berlin) but not among the check-values rows.
 */
export const SZARGUT_1988_J_per_mol: Readonly<Record<ChemicalExergySubstance, number>> = Object.freeze({
  N2: 720,
  O2: 3970,
  CO2: 19870,
  H2O: 9500,
  'H2O(l)': 900,
  Ar: 11690,
  CH4: 831650,
  C2H6: 1495840,
  C3H8: 2154000,
  H2: 236100,
  CO: 275100,
  SO2: 313400,
  'C(graphite)': 410260,
});

/** Name of the table, for reports. */
export const CHEMICAL_EXERGY_TABLE = 'Szargut, Morris & Steward 1988 (T0 = 298.15 K, p0 = 101.325 kPa)';

/**
 * Standard chemical exergy of one substance.
 * @param name substance
 * @returns e_ch [J/mol] at T0 = 298.15 K, p0 = 101.325 kPa
 * @throws ThermoRangeError for a substance not in the table
 * @see Szargut, Morris & Steward 1988
 */
export function standardChemicalExergy(name: ChemicalExergySubstance): number {
  const e = (SZARGUT_1988_J_per_mol as Record<string, number | undefined>)[name];
  if (e === undefined) {
    throw new ThermoRangeError('substance', NaN, Object.keys(SZARGUT_1988_J_per_mol).join(', '), `no standard chemical exergy for '${name}'`);
  }
  return e;
}

/**
 * Chemical exergy of an ideal-gas mixture (ideal solution):
 *   e_ch = sum x_i e_i + R T0 sum x_i ln x_i.
 * The tabulated e_i belong to T0 = 298.15 K; using another T0_K changes only the mixing term, which is
 * the usual approximation for dead states near standard conditions.
 * @param moleFractions mole fractions [-] of gas species, summing to 1 within 1e-6
 * @param T0_K dead-state temperature [K], 250..330 (default 298.15)
 * @returns { J_per_mol, J_per_kg } chemical exergy per mol and per kg of mixture
 * @throws ThermoRangeError for a bad composition or T0 outside 250..330 K
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (1996), eq. 3.20 (mixture form)
 */
export function mixtureChemicalExergy(moleFractions: Composition, T0_K = T0_STD_K): { J_per_mol: number; J_per_kg: number } {
  requireRange('T0_K', T0_K, 250, 330, 'K', 'chemical exergy');
  const x = normaliseFractions(moleFractions, 'mole fractions');
  let e = 0;
  let M = 0;
  for (const key in x) {
    const n = key as SpeciesName;
    const xi = x[n]!;
    e += xi * standardChemicalExergy(n) + R_J_per_molK * T0_K * xi * Math.log(xi);
    M += xi * species[n].M_kg_per_mol;
  }
  return { J_per_mol: e, J_per_kg: e / M };
}

/**
 * Exergy-to-LHV ratio of natural gas, phi = e_ch / LHV = 1.04 (Kotas, The Exergy Method of Thermal
 * Plant Analysis, 1985), from memory. Methane alone gives 831.65 / 802.6 = 1.036.
 */
export const PHI_NATURAL_GAS = 1.04;

/**
 * Szargut & Styrylska (1964) correlation for liquid hydrocarbon fuels, as given by Kotas (1985),
 * coefficients from memory: phi = 1.0401 + 0.1728 h/c + 0.0432 o/c + 0.2169 s/c (1 - 2.0628 h/c),
 * with h/c, o/c, s/c mass ratios.
 * @param u ultimate analysis (mass fractions) [-]
 * @returns phi [-]
 */
export function phiLiquidFuel(u: UltimateAnalysis): number {
  const hc = u.H / u.C;
  return 1.0401 + 0.1728 * hc + 0.0432 * ((u.O ?? 0) / u.C) + 0.2169 * ((u.S ?? 0) / u.C) * (1 - 2.0628 * hc);
}

/**
 * Szargut & Styrylska (1964) correlation for dry solid fuels with o/c <= 0.667 (coal), as given by
 * Kotas (1985), coefficients from memory: phi_dry = 1.0437 + 0.1882 h/c + 0.0610 o/c + 0.0404 n/c.
 * @param u ultimate analysis (mass fractions) [-]
 * @returns phi_dry [-]
 * @throws ThermoRangeError for o/c > 0.667 (wood and peat need the other branch, not implemented)
 */
export function phiSolidFuel(u: UltimateAnalysis): number {
  const oc = (u.O ?? 0) / u.C;
  requireRange('o/c mass ratio', oc, 0, 0.667, '-', 'solid-fuel exergy correlation');
  return 1.0437 + 0.1882 * (u.H / u.C) + 0.061 * oc + 0.0404 * ((u.N ?? 0) / u.C);
}

/** Enthalpy of vaporisation of water at 25 degC [J/kg] (44.004 kJ/mol / 18.01528 g/mol). */
const H_FG_298_J_per_kg = 44004 / 0.01801528;

/**
 * Standard chemical exergy of a fuel per kg.
 * - gas fuel given by composition: mixture formula with the 1988 table (mixing term included);
 * - natural gas known only by LHV: PHI_NATURAL_GAS * LHV;
 * - oils: phiLiquidFuel(ultimate) * LHV;
 * - coal: phiSolidFuel(ultimate) * (LHV + moisture * h_fg) (Kotas' form for moist solid fuels).
 * @param fuel a Fuel from combustion.ts
 * @param T0_K dead-state temperature [K] for the mixing term of gas fuels (default 298.15)
 * @returns e_ch [J/kg of fuel]
 * @throws ThermoRangeError if the fuel has neither composition nor a known type
 */
export function fuelChemicalExergy(fuel: Fuel, T0_K = T0_STD_K): number {
  if (fuel.fuelType === 'natural-gas') return PHI_NATURAL_GAS * fuel.LHV_J_per_kg;
  if (fuel.phase === 'gas' && fuel.moleFractions) return mixtureChemicalExergy(fuel.moleFractions, T0_K).J_per_kg;
  const u = fuel.ultimate;
  if (!u) throw new ThermoRangeError('fuel', NaN, 'a gas composition or an ultimate analysis', 'no basis for chemical exergy');
  if (fuel.fuelType === 'bituminous-coal' || (u.ash ?? 0) > 0 || (u.moisture ?? 0) > 0.02) {
    return phiSolidFuel(u) * (fuel.LHV_J_per_kg + (u.moisture ?? 0) * H_FG_298_J_per_kg);
  }
  return phiLiquidFuel(u) * fuel.LHV_J_per_kg;
}
