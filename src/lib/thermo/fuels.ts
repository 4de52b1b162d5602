/**
 * Fuels and heating values: a fuel described per kg by its atoms (C, H, O, N, S, Ar), moisture and
 * ash, built from a gas composition, from an ultimate analysis, or from a fuel type with a typical
 * composition when only the heating value is known.
 *
 * Heating values at 25 degC (ideal gas, combustion reference 298.15 K) are computed from the NASA
 * formation enthalpies in gas.ts: LHV with water vapour in the products, HHV with liquid water.
 * The combustion mass balance that burns a fuel is in combustion.ts, which re-exports this module.
 * @see ISO 6976:2016 (natural gas calorific values) for the definitions and check values.
 */
import { ThermoRangeError, requireRange } from './errors';
import { normaliseFractions, species, type Composition, type SpeciesName } from './gas';
import type { Element } from './species-data';
/** Atomic masses [kg/mol], consistent with the molar masses of the NASA data (IUPAC 2001 values). */
export const ATOMIC_MASS_kg_per_mol: Readonly<Record<Element, number>> = Object.freeze({
  C: 12.0107e-3,
  H: 1.00794e-3,
  O: 15.9994e-3,
  N: 14.0067e-3,
  S: 32.065e-3,
  Ar: 39.948e-3,
});

const ELEMENTS: readonly Element[] = ['C', 'H', 'O', 'N', 'S', 'Ar'];

/**
 * Enthalpy of formation of liquid water at 298.15 K [J/mol]: CODATA Key Values (Cox, Wagman & Medvedev
 * 1989), -285.830 kJ/mol, from memory (as noted in check-values.md). Used only for HHV - LHV.
 */
export const HF_H2O_LIQUID_J_per_mol = -285830;

/** Enthalpy of vaporisation of water at 298.15 K from the formation enthalpies [J/mol] (44.004 kJ/mol). */
export const DH_VAP_H2O_298_J_per_mol = species.H2O.hf298_J_per_mol - HF_H2O_LIQUID_J_per_mol;

/** Fuel types that may be given by heating value only. */
export type FuelType = 'natural-gas' | 'light-fuel-oil' | 'heavy-fuel-oil' | 'bituminous-coal';

/** Ultimate analysis as received, mass fractions [-] (moisture and ash included; must sum to 1). */
export interface UltimateAnalysis {
  C: number;
  H: number;
  O?: number;
  N?: number;
  S?: number;
  moisture?: number;
  ash?: number;
}

/**
 * Typical compositions for fuels known only by heating value. *Common practice*, not a published
 * standard: replace them with the site's fuel analysis whenever one exists. Natural gas: a high-methane
 * pipeline gas (mole fractions); oils and coal: ultimate analysis as received (mass fractions).
 */
export const TYPICAL_FUELS: Readonly<{
  'natural-gas': Readonly<Composition>;
  'light-fuel-oil': Readonly<UltimateAnalysis>;
  'heavy-fuel-oil': Readonly<UltimateAnalysis>;
  'bituminous-coal': Readonly<UltimateAnalysis>;
}> = Object.freeze({
  'natural-gas': Object.freeze({ CH4: 0.925, C2H6: 0.035, C3H8: 0.01, CO2: 0.01, N2: 0.02 }),
  'light-fuel-oil': Object.freeze({ C: 0.86, H: 0.136, S: 0.002, O: 0.001, N: 0.001 }),
  'heavy-fuel-oil': Object.freeze({ C: 0.855, H: 0.11, S: 0.025, O: 0.005, N: 0.005 }),
  'bituminous-coal': Object.freeze({ C: 0.65, H: 0.042, O: 0.075, N: 0.013, S: 0.01, moisture: 0.1, ash: 0.11 }),
});

/** A fuel, described per kg. */
export interface Fuel {
  readonly label: string;
  readonly phase: 'gas' | 'condensed';
  /** the fuel type when built from a type, else undefined */
  readonly fuelType?: FuelType;
  /** gas fuels: mole fractions [-] */
  readonly moleFractions?: Readonly<Composition>;
  /** gas fuels: molar mass [kg/mol] */
  readonly M_kg_per_mol?: number;
  /** condensed fuels: ultimate analysis [-] */
  readonly ultimate?: Readonly<UltimateAnalysis>;
  /** atoms per kg of fuel [mol/kg] (moisture's H and O included) */
  readonly atoms_mol_per_kg: Readonly<Record<Element, number>>;
  /** moisture (liquid water in a condensed fuel) [kg/kg] */
  readonly moisture_kg_per_kg: number;
  /** incombustible ash [kg/kg] */
  readonly ash_kg_per_kg: number;
  /** lower heating value at 25 degC [J/kg] */
  readonly LHV_J_per_kg: number;
  /** higher heating value at 25 degC [J/kg] */
  readonly HHV_J_per_kg: number;
  /** gas fuels: lower heating value [J/mol] */
  readonly LHV_J_per_mol?: number;
  /** gas fuels: higher heating value [J/mol] */
  readonly HHV_J_per_mol?: number;
  /** stoichiometric oxygen demand [mol O2 per kg fuel] */
  readonly O2min_mol_per_kg: number;
}

function emptyAtoms(): Record<Element, number> {
  return { C: 0, H: 0, O: 0, N: 0, S: 0, Ar: 0 };
}

/** Stoichiometric O2 demand [mol per kg of fuel]; refuses a fuel that needs none (it does not burn). */
function o2Demand(atoms: Record<Element, number>, label: string): number {
  const O2min = atoms.C + atoms.H / 4 + atoms.S - atoms.O / 2;
  if (!(O2min > 0)) throw new ThermoRangeError('stoichiometric O2 demand', O2min, '> 0 mol/kg', `${label} does not burn`);
  return O2min;
}

/**
 * Heating value released by burning one mole of a species to CO2, H2O(g) and SO2 at 298.15 K.
 * @returns LHV [J/mol] (0 for species that do not burn)
 */
function speciesLHV_J_per_mol(name: SpeciesName): number {
  const sp = species[name];
  const e = sp.elements as Partial<Record<Element, number>>;
  const products =
    (e.C ?? 0) * species.CO2.hf298_J_per_mol +
    ((e.H ?? 0) / 2) * species.H2O.hf298_J_per_mol +
    (e.S ?? 0) * species.SO2.hf298_J_per_mol;
  return sp.hf298_J_per_mol - products; // O2 consumed has zero formation enthalpy
}

/**
 * Lower and higher heating value of a pure gas species at 25 degC (ideal gas) from NASA formation
 * enthalpies; HHV - LHV = (H atoms / 2) * 44.004 kJ/mol.
 * @param name species name
 * @returns { LHV_J_per_mol, HHV_J_per_mol, LHV_J_per_kg, HHV_J_per_kg }
 * @see ISO 6976:2016, ideal molar calorific values at 25 degC (definitions)
 */
export function heatingValues(name: SpeciesName): {
  LHV_J_per_mol: number;
  HHV_J_per_mol: number;
  LHV_J_per_kg: number;
  HHV_J_per_kg: number;
} {
  const sp = species[name];
  const LHV = speciesLHV_J_per_mol(name);
  const HHV = LHV + ((sp.elements as Partial<Record<Element, number>>).H ?? 0) / 2 * DH_VAP_H2O_298_J_per_mol;
  return { LHV_J_per_mol: LHV, HHV_J_per_mol: HHV, LHV_J_per_kg: LHV / sp.M_kg_per_mol, HHV_J_per_kg: HHV / sp.M_kg_per_mol };
}

/**
 * A gaseous fuel from its composition (CH4, C2H6, C3H8, H2, CO, CO2, N2, O2, Ar, H2O, SO2).
 * Heating values are computed from the formation enthalpies (ideal gas, 25 degC).
 * @param moleFractions mole fractions [-], summing to 1 within 1e-6
 * @param label name shown to people
 * @throws ThermoRangeError for a bad composition or a mixture that cannot burn
 * @see ISO 6976:2016 (mixture heating value = mole-weighted sum of the components' values)
 */
export function gaseousFuel(moleFractions: Composition, label = 'fuel gas'): Fuel {
  const x = normaliseFractions(moleFractions, 'fuel mole fractions');
  let M = 0;
  let LHVm = 0;
  let HHVm = 0;
  const perMol = emptyAtoms();
  for (const [n, xi] of Object.entries(x) as [SpeciesName, number][]) {
    M += xi * species[n].M_kg_per_mol;
    const hv = heatingValues(n);
    LHVm += xi * hv.LHV_J_per_mol;
    HHVm += xi * hv.HHV_J_per_mol;
    for (const [el, k] of Object.entries(species[n].elements) as [Element, number][]) perMol[el] += xi * k;
  }
  const atoms = emptyAtoms();
  for (const el of ELEMENTS) atoms[el] = perMol[el] / M;
  const O2min = o2Demand(atoms, label);
  return Object.freeze({
    label,
    phase: 'gas' as const,
    moleFractions: Object.freeze(x),
    M_kg_per_mol: M,
    atoms_mol_per_kg: Object.freeze(atoms),
    moisture_kg_per_kg: 0,
    ash_kg_per_kg: 0,
    LHV_J_per_kg: LHVm / M,
    HHV_J_per_kg: HHVm / M,
    LHV_J_per_mol: LHVm,
    HHV_J_per_mol: HHVm,
    O2min_mol_per_kg: O2min,
  });
}

/**
 * A solid or liquid fuel from its ultimate analysis (as received) and its measured lower heating value.
 * HHV = LHV + n_H2O * 44.004 kJ/mol, with n_H2O the water formed from H and the fuel's moisture.
 * @param ultimate mass fractions [-] of C, H, O, N, S, moisture, ash, summing to 1 within 1e-6
 * @param LHV_J_per_kg lower heating value as received [J/kg], > 0
 * @param label name shown to people
 * @throws ThermoRangeError for negative fractions, a bad sum, or a non-positive LHV
 */
export function condensedFuel(ultimate: UltimateAnalysis, LHV_J_per_kg: number, label = 'fuel'): Fuel {
  const u = checkUltimate(ultimate);
  requireRange('LHV_J_per_kg', LHV_J_per_kg, 1, 2e8, 'J/kg', label);
  const MH2O = species.H2O.M_kg_per_mol;
  const atoms = emptyAtoms();
  atoms.C = u.C / ATOMIC_MASS_kg_per_mol.C;
  atoms.H = u.H / ATOMIC_MASS_kg_per_mol.H + (2 * (u.moisture ?? 0)) / MH2O;
  atoms.O = (u.O ?? 0) / ATOMIC_MASS_kg_per_mol.O + (u.moisture ?? 0) / MH2O;
  atoms.N = (u.N ?? 0) / ATOMIC_MASS_kg_per_mol.N;
  atoms.S = (u.S ?? 0) / ATOMIC_MASS_kg_per_mol.S;
  const O2min = o2Demand(atoms, label);
  return Object.freeze({
    label,
    phase: 'condensed' as const,
    ultimate: Object.freeze(u),
    atoms_mol_per_kg: Object.freeze(atoms),
    moisture_kg_per_kg: u.moisture ?? 0,
    ash_kg_per_kg: u.ash ?? 0,
    LHV_J_per_kg,
    HHV_J_per_kg: LHV_J_per_kg + (atoms.H / 2) * DH_VAP_H2O_298_J_per_mol,
    O2min_mol_per_kg: O2min,
  });
}

function checkUltimate(u: UltimateAnalysis): UltimateAnalysis {
  const keys: (keyof UltimateAnalysis)[] = ['C', 'H', 'O', 'N', 'S', 'moisture', 'ash'];
  let sum = 0;
  for (const k of keys) {
    const v = u[k] ?? 0;
    if (!Number.isFinite(v) || v < 0) throw new ThermoRangeError(`ultimate.${k}`, v, '0..1 [-]');
    sum += v;
  }
  if (!(Math.abs(sum - 1) <= 1e-6)) throw new ThermoRangeError('sum of ultimate analysis', sum, '1 ± 1e-6 [-]');
  const out: UltimateAnalysis = { C: u.C / sum, H: u.H / sum };
  for (const k of ['O', 'N', 'S', 'moisture', 'ash'] as const) if (u[k] !== undefined) out[k] = u[k]! / sum;
  return out;
}

/**
 * A fuel known only by its lower heating value: the stoichiometry comes from the type's typical
 * composition (TYPICAL_FUELS, common practice), the energy from the given LHV.
 * @param fuelType 'natural-gas' | 'light-fuel-oil' | 'heavy-fuel-oil' | 'bituminous-coal'
 * @param LHV_J_per_kg lower heating value [J/kg], > 0
 * @throws ThermoRangeError for a non-positive LHV
 */
export function fuelByHeatingValue(fuelType: FuelType, LHV_J_per_kg: number): Fuel {
  requireRange('LHV_J_per_kg', LHV_J_per_kg, 1, 2e8, 'J/kg', fuelType);
  if (fuelType === 'natural-gas') {
    const base = gaseousFuel(TYPICAL_FUELS['natural-gas'], 'natural gas (typical composition)');
    const M = base.M_kg_per_mol!;
    const HHV_J_per_kg = LHV_J_per_kg + (base.atoms_mol_per_kg.H / 2) * DH_VAP_H2O_298_J_per_mol;
    return Object.freeze({
      ...base,
      fuelType,
      LHV_J_per_kg,
      HHV_J_per_kg,
      LHV_J_per_mol: LHV_J_per_kg * M,
      HHV_J_per_mol: HHV_J_per_kg * M,
    });
  }
  const ultimate = TYPICAL_FUELS[fuelType];
  if (!ultimate) throw new ThermoRangeError('fuelType', NaN, Object.keys(TYPICAL_FUELS).join(' | '), `unknown fuel type '${fuelType}'`);
  return Object.freeze({ ...condensedFuel(ultimate, LHV_J_per_kg, `${fuelType} (typical composition)`), fuelType });
}
