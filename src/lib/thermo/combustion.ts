/**
 * The combustion mass balance (complete combustion with excess air) of a fuel of fuels.ts.
 *
 * Burning a fuel in (optionally humid) standard dry air gives CO2, H2O, SO2, N2, O2 and Ar; the
 * excess-air ratio lambda follows from the O2 measured in the flue gas on a dry or wet basis.
 * Everything is per kg of fuel, in mol and kg. Fuels and heating values live in fuels.ts and are
 * re-exported here, so `./combustion` keeps answering for both.
 */
import { ThermoRangeError, requireRange } from './errors';
import { DRY_AIR_MOLE_FRACTIONS, dryAir, mixture, species, type Composition, type GasMixture, type SpeciesName } from './gas';
import type { Fuel } from './fuels';

export * from './fuels';
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
  // The products in the order of `moles` (a fixed list rather than Object.entries: no entry arrays per
  // call, the same order of summation).
  let wet = 0;
  let mass = 0;
  for (let i = 0; i < PRODUCTS.length; i++) {
    const n = PRODUCTS[i]!;
    const v = moles[n]!;
    wet += v;
    mass += v * species[n].M_kg_per_mol;
  }
  const dry = wet - moles.H2O!;
  const wetX: Composition = {};
  const dryX: Composition = {};
  // the products present (moles > 0), in the same order; a new object instead of deleting the absent ones
  const present: Composition = {};
  for (let i = 0; i < PRODUCTS.length; i++) {
    const n = PRODUCTS[i]!;
    const v = moles[n]!;
    if (v > 0) wetX[n] = v / wet;
    if (v > 0 && n !== 'H2O') dryX[n] = v / dry;
    if (v > 0) present[n] = v;
  }
  const airDry_kg = A * dryAir.M_kg_per_mol;
  return Object.freeze({
    lambda: (A * xa.O2!) / O2min,
    excessAir: (A * xa.O2!) / O2min - 1,
    O2min_mol_per_kgFuel: O2min,
    airStoichDry_kg_per_kgFuel: (O2min / xa.O2!) * dryAir.M_kg_per_mol,
    airDry_mol_per_kgFuel: A,
    airDry_kg_per_kgFuel: airDry_kg,
    air_kg_per_kgFuel: airDry_kg + A * w * species.H2O.M_kg_per_mol,
    flue_mol_per_kgFuel: Object.freeze(present),
    flueWet_mol_per_kgFuel: wet,
    flueDry_mol_per_kgFuel: dry,
    flue_kg_per_kgFuel: mass,
    ash_kg_per_kgFuel: fuel.ash_kg_per_kg,
    flueMoleFractions: Object.freeze(wetX),
    flueDryMoleFractions: Object.freeze(dryX),
    O2_wet: O2 / wet,
    O2_dry: O2 / dry,
    flueGas: mixture(wetX, 'mole'),
    combustionAir: w > 0 ? humidAir(w) : dryAir,
  });
}

/** The products of `balance`, in the order of its `moles`. */
const PRODUCTS: readonly SpeciesName[] = ['CO2', 'H2O', 'SO2', 'N2', 'O2', 'Ar'];

/** Humid combustion air with w mol water per mol dry air, as a mixture (the last one kept: a site's air is one humidity). */
let lastAir: { w: number; mix: GasMixture } | null = null;
function humidAir(w: number): GasMixture {
  if (lastAir && lastAir.w === w) return lastAir.mix;
  const xa = DRY_AIR_MOLE_FRACTIONS;
  const airX: Composition = {};
  for (const [n, v] of Object.entries(xa) as [SpeciesName, number][]) airX[n] = v / (1 + w);
  airX.H2O = w / (1 + w);
  lastAir = { w, mix: mixture(airX, 'mole') };
  return lastAir.mix;
}
