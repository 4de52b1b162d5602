/**
 * Ideal gases and ideal-gas mixtures from the NASA Glenn 9-coefficient polynomials.
 *
 * All quantities are SI: T in K, p in Pa, molar properties per mol, specific properties per kg.
 * Enthalpies are absolute in the NASA sense: h(298.15 K) equals the enthalpy of formation from the
 * reference elements, so reacting balances close without extra bookkeeping.
 *
 * Gas constant: the exact SI value R = N_A k = 8.31446261815324 J/(mol K) (CODATA 2018: 8.314462618). The NASA computed check values
 * in docs/reference/check-values.md were evaluated with R = 8.314472 J/(mol K); the relative
 * difference (1.1e-6) is far below the printed digits of those tables.
 *
 * @see McBride, Zehe & Gordon, NASA/TP-2002-211556 (2002), eqs. 4.9-4.11 (9-coefficient form).
 */
import { ThermoRangeError } from './errors';
import {
  P_MAX_Pa,
  P_MIN_Pa,
  P_REF_Pa,
  R_J_per_molK,
  T_MAX_K,
  T_MIN_K,
  T_REF_K,
  checkP,
  checkT,
  evalCp,
  evalH,
  evalS,
  pick,
  scalePolynomial,
  scaleRange,
  solveT,
  type ScaledPolynomial,
} from './nasa-polynomial';
import { NASA_SPECIES, type Element, type NasaSpeciesData } from './species-data';

export { P_MAX_Pa, P_MIN_Pa, P_REF_Pa, R_J_per_molK, T_MAX_K, T_MIN_K, T_REF_K };


/** Names of the gas species with NASA data in the property core. */
export type SpeciesName = keyof typeof NASA_SPECIES;
export const SPECIES_NAMES = Object.keys(NASA_SPECIES) as SpeciesName[];

/** One pure ideal-gas species. */
export interface Species {
  readonly name: SpeciesName;
  /** molar mass [kg/mol] */
  readonly M_kg_per_mol: number;
  /** enthalpy of formation at 298.15 K [J/mol] */
  readonly hf298_J_per_mol: number;
  /** atoms per molecule */
  readonly elements: Readonly<Partial<Record<Element, number>>>;
  /** isobaric molar heat capacity [J/(mol K)] at T_K [K], 200..6000 K */
  cpMolar(T_K: number): number;
  /** absolute molar enthalpy [J/mol] (includes formation enthalpy) at T_K [K], 200..6000 K */
  hMolar(T_K: number): number;
  /** standard molar entropy at 1 bar [J/(mol K)] at T_K [K], 200..6000 K */
  s0Molar(T_K: number): number;
}


function makeSpecies(name: SpeciesName): Species {
  const data: NasaSpeciesData = NASA_SPECIES[name];
  const poly = scalePolynomial(data, R_J_per_molK);
  const ctx = `ideal gas ${name}`;
  return Object.freeze({
    name,
    M_kg_per_mol: data.M_g_per_mol / 1000,
    hf298_J_per_mol: data.hf298_J_per_mol,
    elements: Object.freeze({ ...data.elements }),
    cpMolar(T_K: number) {
      checkT(T_K, ctx);
      return evalCp(pick(poly, T_K), T_K);
    },
    hMolar(T_K: number) {
      checkT(T_K, ctx);
      return evalH(pick(poly, T_K), T_K);
    },
    s0Molar(T_K: number) {
      checkT(T_K, ctx);
      return evalS(pick(poly, T_K), T_K);
    },
  });
}

/** Pure-species data and property functions, keyed by species name. */
export const species: Readonly<Record<SpeciesName, Species>> = Object.freeze(
  Object.fromEntries(SPECIES_NAMES.map((n) => [n, makeSpecies(n)])) as Record<SpeciesName, Species>,
);

/**
 * Isobaric molar heat capacity of a pure species.
 * @param name species name
 * @param T_K temperature [K], 200..6000
 * @returns cp [J/(mol K)]
 * @throws ThermoRangeError outside 200..6000 K
 * @see NASA/TP-2002-211556 eq. 4.9
 */
export function cpMolar(name: SpeciesName, T_K: number): number {
  return getSpecies(name).cpMolar(T_K);
}

/**
 * Absolute molar enthalpy of a pure species (formation enthalpy at 298.15 K included).
 * @param name species name
 * @param T_K temperature [K], 200..6000
 * @returns h [J/mol]
 * @throws ThermoRangeError outside 200..6000 K
 * @see NASA/TP-2002-211556 eq. 4.10
 */
export function hMolar(name: SpeciesName, T_K: number): number {
  return getSpecies(name).hMolar(T_K);
}

/**
 * Standard molar entropy (at p = 1 bar) of a pure species.
 * @param name species name
 * @param T_K temperature [K], 200..6000
 * @returns s0 [J/(mol K)]
 * @throws ThermoRangeError outside 200..6000 K
 * @see NASA/TP-2002-211556 eq. 4.11
 */
export function s0Molar(name: SpeciesName, T_K: number): number {
  return getSpecies(name).s0Molar(T_K);
}

function getSpecies(name: SpeciesName): Species {
  const sp = (species as Record<string, Species | undefined>)[name];
  if (!sp) throw new ThermoRangeError('species', NaN, `one of ${SPECIES_NAMES.join(', ')}`, `unknown species '${name}'`);
  return sp;
}

/** Composition by species: mole or mass fractions [-]. */
export type Composition = Partial<Record<SpeciesName, number>>;

/** An ideal-gas mixture of fixed composition. Specific properties are per kg of mixture. */
export interface GasMixture {
  /** mole fractions [-], summing to 1, zero entries removed */
  readonly moleFractions: Readonly<Composition>;
  /** mass fractions [-], summing to 1, zero entries removed */
  readonly massFractions: Readonly<Composition>;
  /** molar mass [kg/mol] */
  readonly M_kg_per_mol: number;
  /** specific gas constant [J/(kg K)] */
  readonly R_J_per_kgK: number;
  /** isobaric specific heat capacity [J/(kg K)] at T_K [K] */
  cp(T_K: number): number;
  /** absolute specific enthalpy [J/kg] (formation enthalpies included) at T_K [K] */
  h(T_K: number): number;
  /** specific entropy [J/(kg K)] at T_K [K] and p_Pa [Pa], with the mixing term */
  s(T_K: number, p_Pa: number): number;
  /** isobaric molar heat capacity [J/(mol K)] */
  cpMolar(T_K: number): number;
  /** absolute molar enthalpy [J/mol] */
  hMolar(T_K: number): number;
  /** molar entropy [J/(mol K)], with the mixing term */
  sMolar(T_K: number, p_Pa: number): number;
  /** temperature [K] at which h(T) = h_J_per_kg (Newton iteration) */
  T_h(h_J_per_kg: number): number;
  /** temperature [K] at which s(T, p_Pa) = s_J_per_kgK (Newton iteration) */
  T_ps(p_Pa: number, s_J_per_kgK: number): number;
}

/** Largest allowed deviation of the fraction sum from 1 before it is an error [-]. */
export const FRACTION_SUM_TOLERANCE = 1e-6;

/**
 * Validates fractions and scales them to sum to exactly 1 (tiny drift only).
 * @throws ThermoRangeError for unknown names, negative or non-finite entries, or a sum off by more than 1e-6
 */
export function normaliseFractions(fractions: Composition, what = 'fractions'): Composition {
  // for-in visits a plain object's own keys in the order of Object.entries, without an array per entry
  let sum = 0;
  for (const name in fractions) {
    const x = fractions[name as SpeciesName];
    if (!(name in NASA_SPECIES)) {
      throw new ThermoRangeError(`${what}.${name}`, x ?? NaN, `a species of ${SPECIES_NAMES.join(', ')}`, 'unknown species');
    }
    if (x === undefined) continue;
    if (!Number.isFinite(x) || x < 0) throw new ThermoRangeError(`${what}.${name}`, x, '0..1 [-]');
    sum += x;
  }
  if (!(Math.abs(sum - 1) <= FRACTION_SUM_TOLERANCE)) {
    throw new ThermoRangeError(`sum of ${what}`, sum, `1 ± ${FRACTION_SUM_TOLERANCE} [-]`);
  }
  const out: Composition = {};
  for (const key in fractions) {
    const name = key as SpeciesName;
    const x = fractions[name];
    if (x !== undefined && x > 0) out[name] = x / sum;
  }
  return out;
}

/**
 * Builds an ideal-gas mixture. Coefficients are precombined, so h(T), cp(T) and s(T, p) each cost
 * one polynomial evaluation.
 *
 * s(T, p) = sum_i x_i s0_i(T) - R sum_i x_i ln(x_i p / p_ref), p_ref = 1e5 Pa (per mol; divided by M).
 *
 * @param fractions mole or mass fractions [-] per species; must sum to 1 within 1e-6 (drift is normalised)
 * @param basis 'mole' or 'mass'
 * @returns a GasMixture valid for 200..6000 K and 1 Pa..100 MPa (ideal-gas model)
 * @throws ThermoRangeError for unknown species, negative fractions, or a bad sum
 * @see NASA/TP-2002-211556 eqs. 4.9-4.11; mixture entropy as an ideal solution of ideal gases
 */
export function mixture(fractions: Composition, basis: 'mole' | 'mass'): GasMixture {
  const given = normaliseFractions(fractions, basis === 'mole' ? 'mole fractions' : 'mass fractions');
  const { x, w } = bothBases(given, basis);
  const names = Object.keys(x) as SpeciesName[];
  let M = 0;
  for (const n of names) M += x[n]! * species[n].M_kg_per_mol;
  const lo = combinedRange(x, names, 0);
  const hi = combinedRange(x, names, 1);
  const molar: ScaledPolynomial = {
    low: scaleRange(lo.a, lo.b, R_J_per_molK),
    high: scaleRange(hi.a, hi.b, R_J_per_molK),
  };
  const perKg: ScaledPolynomial = {
    low: scaleRange(lo.a, lo.b, R_J_per_molK / M),
    high: scaleRange(hi.a, hi.b, R_J_per_molK / M),
  };
  let sumXlnX = 0;
  for (const n of names) sumXlnX += x[n]! * Math.log(x[n]!);
  return mixtureOf({ x, w, M, molar, perKg, sumXlnX });
}

/** Mole and mass fractions of a normalised composition given on either basis. */
function bothBases(given: Composition, basis: 'mole' | 'mass'): { x: Composition; w: Composition } {
  const names = Object.keys(given) as SpeciesName[];
  const x: Composition = {};
  const w: Composition = {};
  if (basis === 'mole') {
    let M = 0;
    for (const n of names) M += given[n]! * species[n].M_kg_per_mol;
    for (const n of names) {
      x[n] = given[n]!;
      w[n] = (given[n]! * species[n].M_kg_per_mol) / M;
    }
  } else {
    let nTot = 0;
    for (const n of names) nTot += given[n]! / species[n].M_kg_per_mol;
    for (const n of names) {
      w[n] = given[n]!;
      x[n] = given[n]! / species[n].M_kg_per_mol / nTot;
    }
  }
  return { x, w };
}

/** Mole-weighted NASA coefficients of the mixture in one temperature range (0: low, 1: high). */
function combinedRange(x: Composition, names: readonly SpeciesName[], r: 0 | 1): { a: number[]; b: number[] } {
  const a = [0, 0, 0, 0, 0, 0, 0];
  const b = [0, 0];
  for (const n of names) {
    const rr = NASA_SPECIES[n].ranges[r];
    for (let k = 0; k < 7; k++) a[k] += x[n]! * rr.a[k];
    b[0] += x[n]! * rr.b[0];
    b[1] += x[n]! * rr.b[1];
  }
  return { a, b };
}

/** What a mixture's property functions close over. */
interface MixtureParts {
  readonly x: Composition;
  readonly w: Composition;
  readonly M: number;
  readonly molar: ScaledPolynomial;
  readonly perKg: ScaledPolynomial;
  /** sum_i x_i ln x_i, the mixing term of the entropy [-] */
  readonly sumXlnX: number;
}

/** The GasMixture of precombined polynomials: each property one polynomial evaluation. */
function mixtureOf({ x, w, M, molar, perKg, sumXlnX }: MixtureParts): GasMixture {
  const Rs = R_J_per_molK / M;
  const ctx = 'ideal-gas mixture';
  const kg = polynomialProperties(perKg, Rs, sumXlnX, ctx);
  const mol = polynomialProperties(molar, R_J_per_molK, sumXlnX, ctx);
  const mix: GasMixture = {
    moleFractions: Object.freeze(x),
    massFractions: Object.freeze(w),
    M_kg_per_mol: M,
    R_J_per_kgK: Rs,
    cp: kg.cp,
    h: kg.h,
    s: kg.s,
    cpMolar: mol.cp,
    hMolar: mol.h,
    sMolar: mol.s,
    T_h(h_J_per_kg) {
      const hLo = mix.h(T_MIN_K);
      const hHi = mix.h(T_MAX_K);
      if (!(h_J_per_kg >= hLo && h_J_per_kg <= hHi)) {
        throw new ThermoRangeError('h_J_per_kg', h_J_per_kg, `${hLo}..${hHi} J/kg (200..6000 K)`, ctx);
      }
      return solveT((T) => mix.h(T) - h_J_per_kg, (T) => mix.cp(T), 'T(h) of an ideal-gas mixture');
    },
    T_ps(p_Pa, s_J_per_kgK) {
      checkP(p_Pa, ctx);
      const sLo = mix.s(T_MIN_K, p_Pa);
      const sHi = mix.s(T_MAX_K, p_Pa);
      if (!(s_J_per_kgK >= sLo && s_J_per_kgK <= sHi)) {
        throw new ThermoRangeError('s_J_per_kgK', s_J_per_kgK, `${sLo}..${sHi} J/(kg K) (200..6000 K)`, ctx);
      }
      return solveT((T) => mix.s(T, p_Pa) - s_J_per_kgK, (T) => mix.cp(T) / T, 'T(p,s) of an ideal-gas mixture');
    },
  };
  return Object.freeze(mix);
}

/**
 * cp, h and s of a mixture from one precombined polynomial: per kg with the specific gas constant,
 * per mol with R; s includes the pressure and mixing terms, R (ln(p / p_ref) + sum x_i ln x_i).
 */
function polynomialProperties(poly: ScaledPolynomial, R: number, sumXlnX: number, ctx: string) {
  return {
    cp(T_K: number): number {
      checkT(T_K, ctx);
      return evalCp(pick(poly, T_K), T_K);
    },
    h(T_K: number): number {
      checkT(T_K, ctx);
      return evalH(pick(poly, T_K), T_K);
    },
    s(T_K: number, p_Pa: number): number {
      checkT(T_K, ctx);
      checkP(p_Pa, ctx);
      return evalS(pick(poly, T_K), T_K) - R * (Math.log(p_Pa / P_REF_Pa) + sumXlnX);
    },
  };
}

/**
 * Standard dry air: the NASA thermo.inp 'Air' composition (Gordon 1982), mole fractions
 * N2 0.78084, O2 0.209476, Ar 0.009365, CO2 0.000319; M = 28.9651 g/mol.
 * @see docs/reference/check-values.md, section 2 'Dry air'
 */
export const DRY_AIR_MOLE_FRACTIONS: Readonly<Composition> = Object.freeze({
  N2: 0.78084,
  O2: 0.209476,
  Ar: 0.009365,
  CO2: 0.000319,
});

/** Standard dry air as an ideal-gas mixture (see DRY_AIR_MOLE_FRACTIONS). */
export const dryAir: GasMixture = mixture(DRY_AIR_MOLE_FRACTIONS, 'mole');
