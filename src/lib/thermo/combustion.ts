/**
 * Fuels, heating values and the combustion mass balance (complete combustion with excess air).
 *
 * A fuel is described per kg by its atoms (C, H, O, N, S, Ar), moisture and ash, built from a gas
 * composition, from an ultimate analysis, or from a fuel type with a typical composition when only
 * the heating value is known. Burning it in (optionally humid) standard dry air gives CO2, H2O, SO2,
 * N2, O2 and Ar; the excess-air ratio lambda follows from the O2 measured in the flue gas on a dry or
 * wet basis. Everything is per kg of fuel, in mol and kg.
 *
 * Heating values at 25 degC (ideal gas, combustion reference 298.15 K) are computed from the NASA
 * formation enthalpies in gas.ts: LHV with water vapour in the products, HHV with liquid water.
 * @see ISO 6976:2016 (natural gas calorific values) for the definitions and check values.
 */
import { ThermoRangeError, requireRange } from './errors';
import { DRY_AIR_MOLE_FRACTIONS, dryAir, mixture, normaliseFractions, species, type Composition, type GasMixture, type SpeciesName } from './gas';
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

function o2Demand(atoms: Record<Element, number>): number {
  return atoms.C + atoms.H / 4 + atoms.S - atoms.O / 2;
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
  const O2min = o2Demand(atoms);
  if (!(O2min > 0)) throw new ThermoRangeError('stoichiometric O2 demand', O2min, '> 0 mol/kg', `${label} does not burn`);
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
  const O2min = o2Demand(atoms);
  if (!(O2min > 0)) throw new ThermoRangeError('stoichiometric O2 demand', O2min, '> 0 mol/kg', `${label} does not burn`);
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

/** Combustion air: standard dry air plus optional water vapour (give at most one humidity). */
export interface AirSpec {
  /** water vapour per dry air [mol/mol] */
  H2O_mol_per_molDryAir?: number;
  /** humidity ratio, water vapour per dry air [kg/kg] */
  humidityRatio_kg_per_kg?: number;
}

function airHumidity_mol_per_mol(air: AirSpec | undefined): number {
  if (!air) return 0;
  if (air.H2O_mol_per_molDryAir !== undefined && air.humidityRatio_kg_per_kg !== undefined) {
    throw new ThermoRangeError('air humidity', NaN, 'one of H2O_mol_per_molDryAir or humidityRatio_kg_per_kg', 'both given');
  }
  if (air.H2O_mol_per_molDryAir !== undefined) {
    requireRange('H2O_mol_per_molDryAir', air.H2O_mol_per_molDryAir, 0, 0.2, 'mol/mol');
    return air.H2O_mol_per_molDryAir;
  }
  if (air.humidityRatio_kg_per_kg !== undefined) {
    requireRange('humidityRatio_kg_per_kg', air.humidityRatio_kg_per_kg, 0, 0.12, 'kg/kg');
    return (air.humidityRatio_kg_per_kg * dryAir.M_kg_per_mol) / species.H2O.M_kg_per_mol;
  }
  return 0;
}

/** Result of a combustion balance, per kg of fuel. */
export interface CombustionResult {
  /** excess-air ratio (air supplied / stoichiometric air) [-] */
  readonly lambda: number;
  /** excess air (lambda - 1) [-] */
  readonly excessAir: number;
  readonly O2min_mol_per_kgFuel: number;
  /** stoichiometric dry air [kg/kg fuel] */
  readonly airStoichDry_kg_per_kgFuel: number;
  /** dry air supplied [mol/kg fuel] */
  readonly airDry_mol_per_kgFuel: number;
  /** dry air supplied [kg/kg fuel] */
  readonly airDry_kg_per_kgFuel: number;
  /** humid air supplied, dry air plus its water vapour [kg/kg fuel] */
  readonly air_kg_per_kgFuel: number;
  /** flue gas moles by species [mol/kg fuel] */
  readonly flue_mol_per_kgFuel: Readonly<Composition>;
  /** wet flue gas [mol/kg fuel] */
  readonly flueWet_mol_per_kgFuel: number;
  /** dry flue gas [mol/kg fuel] */
  readonly flueDry_mol_per_kgFuel: number;
  /** wet flue gas mass [kg/kg fuel] (= 1 + air - ash) */
  readonly flue_kg_per_kgFuel: number;
  /** ash leaving as solid [kg/kg fuel] */
  readonly ash_kg_per_kgFuel: number;
  /** flue gas composition, wet basis [-] */
  readonly flueMoleFractions: Readonly<Composition>;
  /** flue gas composition, dry basis [-] */
  readonly flueDryMoleFractions: Readonly<Composition>;
  /** O2 in the flue gas, wet and dry basis [-] */
  readonly O2_wet: number;
  readonly O2_dry: number;
  /** the wet flue gas as an ideal-gas mixture */
  readonly flueGas: GasMixture;
  /** the (humid) combustion air as an ideal-gas mixture */
  readonly combustionAir: GasMixture;
}

/**
 * Complete combustion of a fuel with a given excess-air ratio.
 * Products: CO2, H2O, SO2, N2, O2, Ar; no CO, NOx or unburnt carbon (complete-combustion model).
 * @param fuel the fuel (per kg)
 * @param lambda excess-air ratio [-], 1..50
 * @param air humidity of the combustion air (default dry)
 * @throws ThermoRangeError for lambda outside 1..50 or a bad humidity
 */
export function combustionAtLambda(fuel: Fuel, lambda: number, air?: AirSpec): CombustionResult {
  requireRange('lambda', lambda, 1, 50, '-', 'combustion');
  const w = airHumidity_mol_per_mol(air);
  const A = (lambda * fuel.O2min_mol_per_kg) / DRY_AIR_MOLE_FRACTIONS.O2!;
  return balance(fuel, A, w);
}

/** O2 measured in the flue gas. */
export interface O2Measurement {
  /** O2 mole (volume) fraction [-], e.g. 0.03 for 3 % */
  O2_fraction: number;
  /** 'dry' for extractive analysers with a cooler, 'wet' for in-situ probes */
  basis: 'dry' | 'wet';
}

/**
 * Excess air and flue gas from the O2 measured in the flue gas (complete combustion).
 *
 * With A the dry air per kg fuel, O2 = A x_O2 - O2min; dry flue = K - O2min + A with
 * K = n_C + n_S + n_N/2 + n_Ar; wet flue adds n_H/2 + A w. Solving y = O2 / flue for A:
 *   dry: A = (O2min + y (K - O2min)) / (x_O2 - y)
 *   wet: A = (O2min + y (K - O2min + n_H/2)) / (x_O2 - y (1 + w))
 * @param fuel the fuel (per kg)
 * @param measurement O2 fraction [-] (0 up to about 0.2) and basis
 * @param air humidity of the combustion air (default dry)
 * @throws ThermoRangeError for an O2 fraction outside 0..0.2, or one that implies lambda > 50
 */
export function combustionFromO2(fuel: Fuel, measurement: O2Measurement, air?: AirSpec): CombustionResult {
  const y = measurement.O2_fraction;
  const xO2 = DRY_AIR_MOLE_FRACTIONS.O2!;
  requireRange('O2_fraction', y, 0, 0.2, '-', `flue-gas O2 (${measurement.basis})`);
  const w = airHumidity_mol_per_mol(air);
  const a = fuel.atoms_mol_per_kg;
  const O2min = fuel.O2min_mol_per_kg;
  const K = a.C + a.S + a.N / 2 + a.Ar;
  let A: number;
  if (measurement.basis === 'dry') {
    A = (O2min + y * (K - O2min)) / (xO2 - y);
  } else if (measurement.basis === 'wet') {
    A = (O2min + y * (K - O2min + a.H / 2)) / (xO2 - y * (1 + w));
  } else {
    throw new ThermoRangeError('basis', NaN, "'dry' | 'wet'", `unknown O2 basis '${String(measurement.basis)}'`);
  }
  const lambda = (A * xO2) / O2min;
  if (!(lambda >= 1 - 1e-12 && lambda <= 50)) {
    throw new ThermoRangeError('lambda from O2', lambda, '1..50 [-]', `flue-gas O2 ${y} (${measurement.basis})`);
  }
  return balance(fuel, A, w);
}

function balance(fuel: Fuel, A: number, w: number): CombustionResult {
  const a = fuel.atoms_mol_per_kg;
  const xa = DRY_AIR_MOLE_FRACTIONS;
  const O2min = fuel.O2min_mol_per_kg;
  const O2 = Math.max(0, A * xa.O2! - O2min);
  const moles: Composition = {
    CO2: a.C + A * (xa.CO2 ?? 0),
    H2O: a.H / 2 + A * w,
    SO2: a.S,
    N2: a.N / 2 + A * (xa.N2 ?? 0),
    O2,
    Ar: a.Ar + A * (xa.Ar ?? 0),
  };
  let wet = 0;
  let mass = 0;
  for (const [n, v] of Object.entries(moles) as [SpeciesName, number][]) {
    wet += v;
    mass += v * species[n].M_kg_per_mol;
  }
  const dry = wet - moles.H2O!;
  const wetX: Composition = {};
  const dryX: Composition = {};
  for (const [n, v] of Object.entries(moles) as [SpeciesName, number][]) {
    if (v > 0) wetX[n] = v / wet;
    if (v > 0 && n !== 'H2O') dryX[n] = v / dry;
  }
  for (const n of Object.keys(moles) as SpeciesName[]) if (!(moles[n]! > 0)) delete moles[n];
  const airDry_kg = A * dryAir.M_kg_per_mol;
  const airX: Composition = {};
  for (const [n, v] of Object.entries(xa) as [SpeciesName, number][]) airX[n] = v / (1 + w);
  if (w > 0) airX.H2O = w / (1 + w);
  return Object.freeze({
    lambda: (A * xa.O2!) / O2min,
    excessAir: (A * xa.O2!) / O2min - 1,
    O2min_mol_per_kgFuel: O2min,
    airStoichDry_kg_per_kgFuel: (O2min / xa.O2!) * dryAir.M_kg_per_mol,
    airDry_mol_per_kgFuel: A,
    airDry_kg_per_kgFuel: airDry_kg,
    air_kg_per_kgFuel: airDry_kg + A * w * species.H2O.M_kg_per_mol,
    flue_mol_per_kgFuel: Object.freeze(moles),
    flueWet_mol_per_kgFuel: wet,
    flueDry_mol_per_kgFuel: dry,
    flue_kg_per_kgFuel: mass,
    ash_kg_per_kgFuel: fuel.ash_kg_per_kg,
    flueMoleFractions: Object.freeze(wetX),
    flueDryMoleFractions: Object.freeze(dryX),
    O2_wet: O2 / wet,
    O2_dry: O2 / dry,
    flueGas: mixture(wetX, 'mole'),
    combustionAir: w > 0 ? mixture(airX, 'mole') : dryAir,
  });
}
