/**
 * Fluids at the ports of a unit and the port state built from a port's measurements.
 *
 * A fluid is plain data (`FluidSpec`, JSON-safe, so a plant model can be stored as it is); `prepareFluid`
 * turns it once into property functions of the property core (src/lib/thermo): IAPWS-IF97 water,
 * NASA-polynomial ideal-gas mixtures, fuels and combustion, incompressible liquids. `portState` gives
 * the state of one port: p, T, h, s, phase, and the flow exergy against the substance's own dead state
 * (physical, with kinetic and potential parts) plus, for gases and fuels, the standard chemical exergy
 * of the stream relative to the reference environment of Szargut, Morris & Steward (1988).
 *
 * Water near saturation: p and T do not fix a two-phase state, and a (p, T) pair within a tolerance of
 * Tsat(p) cannot tell wet steam from saturated liquid or vapour. Such a port state is computed as the
 * single-phase state on the measured side and flagged 'near-saturation' (the caller decides); a
 * two-phase state comes only from a vapour fraction x or an enthalpy h, never from (p, T).
 *
 * @see docs/domain.md sections 2, 4, 5; Bejan, Tsatsaronis & Moran, Thermal Design and Optimization
 *   (Wiley, 1996), ch. 3 (flow exergy, chemical exergy of ideal-gas mixtures).
 */
import {
  DH_VAP_H2O_298_J_per_mol,
  DRY_AIR_MOLE_FRACTIONS,
  combustionFromO2,
  condensedFuel,
  deadState,
  dryAir,
  flowExergy,
  fuelByHeatingValue,
  fuelChemicalExergy,
  gaseousFuel,
  liquid,
  mixture,
  mixtureChemicalExergy,
  species,
  water,
  G_m_per_s2,
  T_REF_K,
  type AirSpec,
  type Composition,
  type CombustionResult,
  type DeadState,
  type Fuel,
  type FuelType,
  type GasMixture,
  type IncompressibleLiquid,
  type UltimateAnalysis,
  type WaterPhase,
} from '../thermo';
import { BalanceInputError, requireInput } from './errors';

/** A fuel as plain data: a gas by mole fractions, a solid or liquid by ultimate analysis and LHV, or a type by LHV. */
export type FuelSpec =
  | { composition: Composition; label?: string }
  | { ultimate: UltimateAnalysis; LHV_J_per_kg: number; label?: string }
  | { fuelType: FuelType; LHV_J_per_kg: number };

/** The fluid at a port, as plain data. */
export type FluidSpec =
  /** water and steam (IAPWS-IF97); saturationTolerance_K [K] for the near-saturation flag, default 1 K */
  | { kind: 'water'; saturationTolerance_K?: number }
  /** an ideal-gas mixture of fixed composition, mole or mass fractions [-] */
  | { kind: 'gas'; fractions: Composition; basis: 'mole' | 'mass' }
  /** standard dry air, optionally humid (combustion air, fan and compressor air) */
  | { kind: 'air'; humidity?: AirSpec }
  /** a gaseous fuel by mole fractions [-] (physical and chemical exergy) */
  | { kind: 'fuel-gas'; composition: Composition }
  /** any fuel of the property core; condensed fuels are taken at the dead state (no physical exergy) */
  | { kind: 'fuel'; fuel: FuelSpec }
  /**
   * flue gas of complete combustion of `fuel` in (humid) air; its composition follows from the O2
   * fraction measured on `o2Basis`, given per port as PortMeasurement.O2_fraction. In a boiler the
   * fuel may be left out and is then the fuel port's.
   */
  | { kind: 'flue-gas'; fuel?: FuelSpec; o2Basis: 'dry' | 'wet'; air?: AirSpec }
  /** incompressible liquid of constant cp [J/(kg K)] and density [kg/m3] */
  | { kind: 'liquid'; cp_J_per_kgK: number; rho_kg_per_m3: number };

/** The dead state (environment) of a balance: T0 [K], p0 [Pa]. */
export interface Environment {
  T0_K: number;
  p0_Pa: number;
}

/** What is measured at a port, in SI. Which entries are needed depends on the fluid (see portState). */
export interface PortMeasurement {
  /** pressure [Pa] (absolute) */
  p_Pa?: number;
  /** temperature [K] */
  T_K?: number;
  /** water: vapour mass fraction [-], 0..1 (two-phase states) */
  x?: number;
  /** specific enthalpy [J/kg] on the fluid's own scale (IF97 for water, NASA absolute for gases) */
  h_J_per_kg?: number;
  /** flue gas: O2 mole fraction [-] on the fluid's o2Basis */
  O2_fraction?: number;
  /** velocity [m/s] for the kinetic part of the flow exergy, default 0 */
  velocity_m_per_s?: number;
  /** elevation above the reference level [m], default 0 */
  elevation_m?: number;
}

/** Phase of a port state. */
export type PortPhase = WaterPhase | 'gas' | 'liquid-incompressible' | 'condensed-fuel';

/**
 * Flags of a port state:
 * - 'near-saturation': water (p, T) within the tolerance of Tsat(p); the phase is uncertain;
 * - 'no-absolute-entropy': a condensed fuel has no absolute entropy in the property core, s is 0;
 * - 'below-dead-state': T < T0 (exergy grows while the stream warms toward T0).
 */
export type PortFlag = 'near-saturation' | 'no-absolute-entropy' | 'below-dead-state';

/**
 * State of the fluid at a port, SI base units: p [Pa], T [K], h [J/kg], s [J/(kg K)], x [-] (water
 * only, null when single-phase), psi [J/kg] flow exergy against the substance's own dead state
 * (physical + kinetic + potential), ePh [J/kg] the physical part alone, eCh [J/kg] standard chemical
 * exergy (gases and fuels; null for water and liquids, whose chemical exergy cancels in every balance).
 */
export interface PortState {
  readonly p: number;
  readonly T: number;
  readonly h: number;
  readonly s: number;
  readonly x: number | null;
  readonly phase: PortPhase;
  readonly psi: number;
  readonly ePh: number;
  readonly eCh: number | null;
  /** specific enthalpy of the same substance at the dead state [J/kg] (for energy throughput) */
  readonly h0: number;
  /** velocity [m/s] and elevation [m] used for psi (needed by the energy balance) */
  readonly velocity_m_per_s: number;
  readonly elevation_m: number;
  readonly flags: readonly PortFlag[];
}

/** Default tolerance of the near-saturation flag [K] (common practice: about the RTD uncertainty). */
export const SATURATION_TOLERANCE_K = 1;

const PC_Pa = 22.064e6;
/** Lowest temperature of IAPWS-IF97 [K]. */
const WATER_T_MIN_K = 273.15;
const P_TRIPLE_Pa = 611.213;

/** Dead-state values of one fluid: h0 [J/kg], s0 [J/(kg K)], chemical exergy eCh [J/kg] or null. */
interface DeadValues {
  readonly dead: DeadState;
  readonly eCh: number | null;
}

/** A small least-recently-used memo of up to three entries keyed by two numbers (no closures: hot path). */
class Memo2<V> {
  private k0 = [NaN, NaN, NaN];
  private k1 = [NaN, NaN, NaN];
  private v: (V | undefined)[] = [undefined, undefined, undefined];
  private age = [0, 0, 0];
  private clock = 0;
  find(a: number, b: number): V | undefined {
    for (let i = 0; i < 3; i++) {
      if (this.k0[i] === a && this.k1[i] === b) {
        this.age[i] = ++this.clock;
        return this.v[i];
      }
    }
    return undefined;
  }
  put(a: number, b: number, value: V): V {
    let j = 0;
    if (this.age[1] < this.age[j]) j = 1;
    if (this.age[2] < this.age[j]) j = 2;
    this.k0[j] = a;
    this.k1[j] = b;
    this.v[j] = value;
    this.age[j] = ++this.clock;
    return value;
  }
}

/** A prepared fluid: property functions of one FluidSpec. */
export interface Fluid {
  readonly spec: FluidSpec;
  /** 'water' | 'gas' | 'liquid' | 'condensed-fuel' | 'flue-gas' (a family needing O2) */
  readonly family: 'water' | 'gas' | 'liquid' | 'condensed-fuel' | 'flue-gas';
  /** the ideal-gas mixture (gas family) */
  readonly mixture?: GasMixture;
  /** the fuel (fuels and flue gas) */
  readonly fuel?: Fuel;
  /** the combustion result (flue gas at a given O2) */
  readonly combustion?: CombustionResult;
  /** flue gas: the fluid at a measured O2 fraction [-] (memoised) */
  withO2(O2_fraction: number): Fluid;
  /** port state from measurements (see portState) */
  state(m: PortMeasurement, env: Environment): PortState;
  /** port state from pressure [Pa] and specific enthalpy [J/kg] (energy-balance states) */
  statePH(p_Pa: number, h_J_per_kg: number, env: Environment, velocity_m_per_s?: number, elevation_m?: number): PortState;
  /** specific enthalpy [J/kg] at p [Pa] and s [J/(kg K)] (isentropic end states) */
  hIsentropic(p_Pa: number, s_J_per_kgK: number): number;
  /** specific enthalpy [J/kg] and entropy [J/(kg K)] of this fluid at the dead state */
  deadValues(env: Environment): DeadValues;
}

/** Builds a thermo Fuel from a FuelSpec. */
export function buildFuel(spec: FuelSpec): Fuel {
  if ('composition' in spec) return gaseousFuel(spec.composition, spec.label ?? 'fuel gas');
  if ('ultimate' in spec) return condensedFuel(spec.ultimate, spec.LHV_J_per_kg, spec.label ?? 'fuel');
  if ('fuelType' in spec) return fuelByHeatingValue(spec.fuelType, spec.LHV_J_per_kg);
  throw new BalanceInputError('INVALID_MODEL', 'fuel', 'give composition, ultimate + LHV_J_per_kg, or fuelType + LHV_J_per_kg');
}

/** The FuelSpec of a fuel fluid ('fuel-gas' or 'fuel'), else undefined. */
export function fuelSpecOf(spec: FluidSpec): FuelSpec | undefined {
  if (spec.kind === 'fuel-gas') return { composition: spec.composition };
  if (spec.kind === 'fuel') return spec.fuel;
  return undefined;
}

/**
 * Absolute enthalpy of a fuel at 298.15 K on the NASA scale (formation enthalpies included) from its
 * LHV: h = LHV + sum of the formation enthalpies of its products (CO2, H2O vapour, SO2) [J/kg].
 */
export function fuelEnthalpy298_J_per_kg(fuel: Fuel): number {
  const a = fuel.atoms_mol_per_kg;
  return (
    fuel.LHV_J_per_kg +
    a.C * species.CO2.hf298_J_per_mol +
    (a.H / 2) * species.H2O.hf298_J_per_mol +
    a.S * species.SO2.hf298_J_per_mol
  );
}

/** Mole fractions of (humid) combustion air, as the property core's combustion balance builds it. */
export function airMoleFractions(humidity?: AirSpec): Composition {
  let w = 0;
  if (humidity?.H2O_mol_per_molDryAir !== undefined) w = humidity.H2O_mol_per_molDryAir;
  else if (humidity?.humidityRatio_kg_per_kg !== undefined) {
    w = (humidity.humidityRatio_kg_per_kg * dryAir.M_kg_per_mol) / species.H2O.M_kg_per_mol;
  }
  requireInput('air humidity', w, 0, 0.2, 'mol/mol');
  if (w === 0) return { ...DRY_AIR_MOLE_FRACTIONS };
  const out: Composition = {};
  for (const [n, v] of Object.entries(DRY_AIR_MOLE_FRACTIONS) as [keyof Composition, number][]) out[n] = v / (1 + w);
  out.H2O = w / (1 + w);
  return out;
}

function need(m: PortMeasurement, key: keyof PortMeasurement, what: string): number {
  const v = m[key];
  if (v === undefined || !Number.isFinite(v)) {
    throw new BalanceInputError(v === undefined ? 'MISSING_INPUT' : 'IMPOSSIBLE_INPUT', key, `${what} needs a finite ${key}, got ${v}`);
  }
  return v;
}

function finishState(
  p: number,
  T: number,
  h: number,
  s: number,
  x: number | null,
  phase: PortPhase,
  dv: DeadValues,
  env: Environment,
  V: number,
  z: number,
  flags: PortFlag[],
): PortState {
  const ePh = flowExergy({ h, s }, dv.dead);
  const psi = ePh + 0.5 * V * V + G_m_per_s2 * z;
  if (T < env.T0_K && phase !== 'condensed-fuel') flags.push('below-dead-state');
  return { p, T, h, s, x, phase, psi, ePh, eCh: dv.eCh, h0: dv.dead.h0, velocity_m_per_s: V, elevation_m: z, flags };
}

class WaterFluid implements Fluid {
  readonly family = 'water' as const;
  private memo = new Memo2<DeadValues>();
  constructor(readonly spec: Extract<FluidSpec, { kind: 'water' }>) {}
  withO2(): Fluid {
    return this;
  }
  deadValues(env: Environment): DeadValues {
    const hit = this.memo.find(env.T0_K, env.p0_Pa);
    if (hit) return hit;
    if (env.T0_K < WATER_T_MIN_K) {
      throw new BalanceInputError(
        'IMPOSSIBLE_INPUT',
        'T0_K',
        `water's dead state needs T0 >= ${WATER_T_MIN_K} K, got ${env.T0_K} K (IAPWS-IF97 has no liquid below 0 degC); use a fixed site T0 for water units in frost`,
      );
    }
    return this.memo.put(env.T0_K, env.p0_Pa, { dead: deadState.water(env.T0_K, env.p0_Pa), eCh: null });
  }
  state(m: PortMeasurement, env: Environment): PortState {
    const p = need(m, 'p_Pa', 'water');
    const V = m.velocity_m_per_s ?? 0;
    const z = m.elevation_m ?? 0;
    if (m.h_J_per_kg !== undefined) return this.statePH(p, m.h_J_per_kg, env, V, z);
    const dv = this.deadValues(env);
    if (m.x !== undefined) {
      requireInput('x', m.x, 0, 1, '[-]', 'vapour fraction');
      const st = water.px(p, m.x);
      return finishState(p, st.T, st.h, st.s, m.x, 'two-phase', dv, env, V, z, []);
    }
    const T = need(m, 'T_K', 'water (give T_K, or x or h_J_per_kg for wet steam)');
    const st = water.pt(p, T);
    const flags: PortFlag[] = [];
    if (p > P_TRIPLE_Pa && p < PC_Pa) {
      const tol = this.spec.saturationTolerance_K ?? SATURATION_TOLERANCE_K;
      if (Math.abs(T - water.tsat(p)) <= tol) flags.push('near-saturation');
    }
    return finishState(p, T, st.h, st.s, null, st.phase, dv, env, V, z, flags);
  }
  statePH(p: number, h: number, env: Environment, V = 0, z = 0): PortState {
    const st = water.ph(p, h);
    const twoPhase = st.x !== null && st.x > 0 && st.x < 1;
    return finishState(p, st.T, st.h, st.s, st.x, twoPhase ? 'two-phase' : st.phase, this.deadValues(env), env, V, z, []);
  }
  hIsentropic(p: number, s: number): number {
    return water.h_ps(p, s);
  }
}

/** Chemical exergy options of a gas fluid. */
type ChemicalMode = { kind: 'mixture'; strict: boolean } | { kind: 'fuel'; fuel: Fuel };

class GasFluid implements Fluid {
  readonly family = 'gas' as const;
  private memo = new Memo2<DeadValues>();
  constructor(
    readonly spec: FluidSpec,
    readonly mixture: GasMixture,
    private readonly chem: ChemicalMode,
    /** added to the mixture enthalpy (fuels known by heating value) [J/kg] */
    private readonly hOffset = 0,
    readonly fuel?: Fuel,
    readonly combustion?: CombustionResult,
  ) {}
  withO2(): Fluid {
    return this;
  }
  deadValues(env: Environment): DeadValues {
    return this.memo.find(env.T0_K, env.p0_Pa) ?? this.memo.put(env.T0_K, env.p0_Pa, this.computeDead(env));
  }
  private computeDead(env: Environment): DeadValues {
    {
      const mix = this.mixture;
      const dead: DeadState = Object.freeze({ ...deadState.gas(mix, env.T0_K, env.p0_Pa), h0: mix.h(env.T0_K) + this.hOffset });
      let eCh: number | null;
      if (this.chem.kind === 'fuel') eCh = fuelChemicalExergy(this.chem.fuel, env.T0_K);
      else if (this.chem.strict) eCh = mixtureChemicalExergy(mix.moleFractions, env.T0_K).J_per_kg;
      else {
        try {
          eCh = mixtureChemicalExergy(mix.moleFractions, env.T0_K).J_per_kg;
        } catch {
          eCh = null; // outside the table's T0 range; not needed for non-reacting gases
        }
      }
      return { dead, eCh };
    }
  }
  state(m: PortMeasurement, env: Environment): PortState {
    const p = need(m, 'p_Pa', 'gas');
    const V = m.velocity_m_per_s ?? 0;
    const z = m.elevation_m ?? 0;
    if (m.h_J_per_kg !== undefined) return this.statePH(p, m.h_J_per_kg, env, V, z);
    if (m.x !== undefined) throw new BalanceInputError('INVALID_MODEL', 'x', 'a vapour fraction applies to water only');
    const T = need(m, 'T_K', 'gas');
    const mix = this.mixture;
    return finishState(p, T, mix.h(T) + this.hOffset, mix.s(T, p), null, 'gas', this.deadValues(env), env, V, z, []);
  }
  statePH(p: number, h: number, env: Environment, V = 0, z = 0): PortState {
    const mix = this.mixture;
    const T = mix.T_h(h - this.hOffset);
    return finishState(p, T, h, mix.s(T, p), null, 'gas', this.deadValues(env), env, V, z, []);
  }
  hIsentropic(p: number, s: number): number {
    return this.mixture.h(this.mixture.T_ps(p, s)) + this.hOffset;
  }
}

class CondensedFuelFluid implements Fluid {
  readonly family = 'condensed-fuel' as const;
  private readonly h298: number;
  constructor(readonly spec: FluidSpec, readonly fuel: Fuel) {
    this.h298 = fuelEnthalpy298_J_per_kg(fuel);
  }
  withO2(): Fluid {
    return this;
  }
  deadValues(env: Environment): DeadValues {
    return { dead: { T0: env.T0_K, p0: env.p0_Pa, h0: this.h298, s0: 0 }, eCh: fuelChemicalExergy(this.fuel, env.T0_K) };
  }
  /** A condensed fuel is taken at the dead state: h = h(298.15 K) from the LHV, s = 0 (flagged), psi = 0. */
  state(m: PortMeasurement, env: Environment): PortState {
    return finishState(m.p_Pa ?? env.p0_Pa, env.T0_K, this.h298, 0, null, 'condensed-fuel', this.deadValues(env), env, 0, 0, [
      'no-absolute-entropy',
    ]);
  }
  statePH(): PortState {
    throw new BalanceInputError('INVALID_MODEL', 'state', 'a condensed fuel cannot take its state from an energy balance');
  }
  hIsentropic(): number {
    throw new BalanceInputError('INVALID_MODEL', 'state', 'a condensed fuel has no isentropic state');
  }
}

class LiquidFluid implements Fluid {
  readonly family = 'liquid' as const;
  private memo = new Memo2<DeadValues>();
  constructor(readonly spec: FluidSpec, private readonly liq: IncompressibleLiquid) {}
  withO2(): Fluid {
    return this;
  }
  deadValues(env: Environment): DeadValues {
    return this.memo.find(env.T0_K, env.p0_Pa) ?? this.memo.put(env.T0_K, env.p0_Pa, { dead: deadState.liquid(this.liq, env.T0_K, env.p0_Pa), eCh: null });
  }
  state(m: PortMeasurement, env: Environment): PortState {
    const p = need(m, 'p_Pa', 'liquid');
    const V = m.velocity_m_per_s ?? 0;
    const z = m.elevation_m ?? 0;
    if (m.h_J_per_kg !== undefined) return this.statePH(p, m.h_J_per_kg, env, V, z);
    const T = need(m, 'T_K', 'liquid');
    return finishState(p, T, this.liq.h(T, p), this.liq.s(T), null, 'liquid-incompressible', this.deadValues(env), env, V, z, []);
  }
  statePH(p: number, h: number, env: Environment, V = 0, z = 0): PortState {
    const T = this.liq.T_ph(p, h);
    return finishState(p, T, h, this.liq.s(T), null, 'liquid-incompressible', this.deadValues(env), env, V, z, []);
  }
  /** s depends on T only, so the isentropic end state keeps T: h(T(s), p). */
  hIsentropic(p: number, s: number): number {
    return this.liq.h(T_REF_K * Math.exp(s / this.liq.cp_J_per_kgK), p);
  }
}

class FlueGasFamily implements Fluid {
  readonly family = 'flue-gas' as const;
  private memo = new Memo2<GasFluid>();
  constructor(
    readonly spec: Extract<FluidSpec, { kind: 'flue-gas' }>,
    readonly fuel: Fuel,
  ) {}
  withO2(O2_fraction: number): GasFluid {
    requireInput('O2_fraction', O2_fraction, 0, 0.2, '[-]', `flue-gas O2 (${this.spec.o2Basis} basis)`);
    const hit = this.memo.find(O2_fraction, 0);
    if (hit) return hit;
    const comb = combustionFromO2(this.fuel, { O2_fraction, basis: this.spec.o2Basis }, this.spec.air);
    return this.memo.put(O2_fraction, 0, new GasFluid(this.spec, comb.flueGas, { kind: 'mixture', strict: true }, 0, this.fuel, comb));
  }
  deadValues(): DeadValues {
    throw new BalanceInputError('MISSING_INPUT', 'O2_fraction', 'flue gas needs its measured O2 fraction');
  }
  state(m: PortMeasurement, env: Environment): PortState {
    return this.withO2(need(m, 'O2_fraction', 'flue gas')).state(m, env);
  }
  statePH(): PortState {
    throw new BalanceInputError('INVALID_MODEL', 'state', 'a flue-gas state needs its O2 fraction: use withO2(O2).statePH');
  }
  hIsentropic(): number {
    throw new BalanceInputError('INVALID_MODEL', 'state', 'a flue-gas state needs its O2 fraction: use withO2(O2).hIsentropic');
  }
}

/**
 * Prepares a fluid once (mixtures precombined, fuels built); the result memoises its dead states.
 * @param spec the fluid as plain data
 * @param fuelOverride for a flue gas without its own fuel: the fuel it comes from (a boiler's fuel port)
 * @throws BalanceInputError for an incomplete spec; ThermoRangeError for bad compositions
 */
export function prepareFluid(spec: FluidSpec, fuelOverride?: FuelSpec): Fluid {
  switch (spec.kind) {
    case 'water':
      return new WaterFluid(spec);
    case 'gas':
      return new GasFluid(spec, mixture(spec.fractions, spec.basis), { kind: 'mixture', strict: false });
    case 'air': {
      const x = airMoleFractions(spec.humidity);
      return new GasFluid(spec, spec.humidity ? mixture(x, 'mole') : dryAir, { kind: 'mixture', strict: true });
    }
    case 'fuel-gas': {
      const fuel = gaseousFuel(spec.composition);
      return new GasFluid(spec, mixture(spec.composition, 'mole'), { kind: 'fuel', fuel }, 0, fuel);
    }
    case 'fuel': {
      const fuel = buildFuel(spec.fuel);
      if (fuel.phase === 'condensed') return new CondensedFuelFluid(spec, fuel);
      const mix = mixture(fuel.moleFractions!, 'mole');
      // Heating-value fuels: the typical composition gives cp and s, the stated LHV gives h.
      const hOffset = fuel.fuelType ? fuelEnthalpy298_J_per_kg(fuel) - mix.h(T_REF_K) : 0;
      return new GasFluid(spec, mix, { kind: 'fuel', fuel }, hOffset, fuel);
    }
    case 'flue-gas': {
      const fs = spec.fuel ?? fuelOverride;
      if (!fs) throw new BalanceInputError('MISSING_INPUT', 'fuel', 'a flue-gas fluid needs the fuel it comes from');
      return new FlueGasFamily(spec, buildFuel(fs));
    }
    case 'liquid':
      return new LiquidFluid(spec, liquid({ cp_J_per_kgK: spec.cp_J_per_kgK, rho_kg_per_m3: spec.rho_kg_per_m3 }));
    default:
      throw new BalanceInputError('INVALID_MODEL', 'fluid.kind', `unknown fluid kind '${(spec as { kind: string }).kind}'`);
  }
}

const prepared = new WeakMap<FluidSpec, Fluid>();

/** A prepared Fluid for a spec (memoised per spec object), or the Fluid itself. */
export function fluidOf(f: FluidSpec | Fluid): Fluid {
  if ('family' in f && typeof (f as Fluid).state === 'function') return f as Fluid;
  const spec = f as FluidSpec;
  let fl = prepared.get(spec);
  if (!fl) {
    fl = prepareFluid(spec);
    prepared.set(spec, fl);
  }
  return fl;
}

/**
 * State of the fluid at one port from its measurements.
 *
 * - water: (p_Pa, T_K) single phase, flagged 'near-saturation' when |T - Tsat(p)| <= tolerance;
 *   (p_Pa, x) two-phase; (p_Pa, h_J_per_kg) any phase. T is not used when x or h is given.
 * - gas, air, fuel-gas, gaseous fuel: (p_Pa, T_K) or (p_Pa, h_J_per_kg); eCh from Szargut 1988.
 * - flue-gas: as gas, plus O2_fraction [-] on the fluid's basis (composition by complete combustion).
 * - condensed fuel: taken at the dead state (psi = 0, eCh from the property core's correlations).
 * - liquid: (p_Pa, T_K) or (p_Pa, h_J_per_kg).
 *
 * @param fluid a FluidSpec (prepared once and memoised per object) or a prepared Fluid
 * @param m measurements in SI: p_Pa [Pa], T_K [K], x [-], h_J_per_kg [J/kg], O2_fraction [-],
 *   velocity_m_per_s [m/s], elevation_m [m]
 * @param env dead state: T0_K [K], p0_Pa [Pa]
 * @returns the port state (SI), with psi against the substance's own dead state
 * @throws BalanceInputError naming a missing measurement; ThermoRangeError outside a property range
 * @see docs/domain.md s.2 (psi), s.3 (wet steam), s.5 (formulations)
 */
export function portState(fluid: FluidSpec | Fluid, m: PortMeasurement, env: Environment): PortState {
  return fluidOf(fluid).state(m, env);
}
