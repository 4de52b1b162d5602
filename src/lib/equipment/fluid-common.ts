/**
 * What the prepared fluids of every family share: fuels from their plain data, humid combustion
 * air, small memos of dead states and of port states (./model.ts), and the last step of every port
 * state (flow exergy and flags).
 */
import {
  DRY_AIR_MOLE_FRACTIONS,
  condensedFuel,
  dryAir,
  flowExergy,
  fuelByHeatingValue,
  gaseousFuel,
  species,
  G_m_per_s2,
  type AirSpec,
  type Composition,
  type Fuel,
} from '../thermo';
import { BalanceInputError, requireInput } from './errors';
import type { DeadValues, Environment, FluidSpec, FuelSpec, PortFlag, PortMeasurement, PortPhase, PortState } from './fluid-types';

/**
 * A small least-recently-used memo of up to three entries keyed by two numbers (no closures: hot path).
 * Its slots are fields, not arrays: a flue gas at a new O2 is a new fluid with its own memo, several per hour.
 */
export class Memo2<V> {
  private a0 = NaN;
  private b0 = NaN;
  private v0: V | undefined = undefined;
  private t0 = 0;
  private a1 = NaN;
  private b1 = NaN;
  private v1: V | undefined = undefined;
  private t1 = 0;
  private a2 = NaN;
  private b2 = NaN;
  private v2: V | undefined = undefined;
  private t2 = 0;
  private clock = 0;
  find(a: number, b: number): V | undefined {
    if (this.a0 === a && this.b0 === b) {
      this.t0 = ++this.clock;
      return this.v0;
    }
    if (this.a1 === a && this.b1 === b) {
      this.t1 = ++this.clock;
      return this.v1;
    }
    if (this.a2 === a && this.b2 === b) {
      this.t2 = ++this.clock;
      return this.v2;
    }
    return undefined;
  }
  put(a: number, b: number, value: V): V {
    // the oldest slot (the first of equals), as a scan of the three ages
    let j = 0;
    let age = this.t0;
    if (this.t1 < age) (j = 1), (age = this.t1);
    if (this.t2 < age) j = 2;
    const t = ++this.clock;
    if (j === 0) (this.a0 = a), (this.b0 = b), (this.v0 = value), (this.t0 = t);
    else if (j === 1) (this.a1 = a), (this.b1 = b), (this.v1 = value), (this.t1 = t);
    else (this.a2 = a), (this.b2 = b), (this.v2 = value), (this.t2 = t);
    return value;
  }
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

export function need(m: PortMeasurement, key: keyof PortMeasurement, what: string): number {
  const v = m[key];
  if (v === undefined || !Number.isFinite(v)) {
    throw new BalanceInputError(v === undefined ? 'MISSING_INPUT' : 'IMPOSSIBLE_INPUT', key, `${what} needs a finite ${key}, got ${v}`);
  }
  return v;
}

export function finishState(
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

/** Memo of the three most recently used port states, keyed by five numbers. */
export class StateMemo {
  private keys = new Float64Array(15).fill(NaN);
  private vals: (PortState | undefined)[] = [undefined, undefined, undefined];
  private age = [0, 0, 0];
  private clock = 0;
  find(a: number, b: number, c: number, d: number, e: number): PortState | undefined {
    const k = this.keys;
    for (let i = 0, o = 0; i < 3; i++, o += 5) {
      if (k[o] === a && k[o + 1] === b && k[o + 2] === c && k[o + 3] === d && k[o + 4] === e) {
        this.age[i] = ++this.clock;
        return this.vals[i]!;
      }
    }
    return undefined;
  }
  put(a: number, b: number, c: number, d: number, e: number, v: PortState): PortState {
    const k = this.keys;
    let j = 0;
    if (this.age[1] < this.age[j]) j = 1;
    if (this.age[2] < this.age[j]) j = 2;
    const o = 5 * j;
    k[o] = a;
    k[o + 1] = b;
    k[o + 2] = c;
    k[o + 3] = d;
    k[o + 4] = e;
    this.vals[j] = v;
    this.age[j] = ++this.clock;
    return v;
  }
}
