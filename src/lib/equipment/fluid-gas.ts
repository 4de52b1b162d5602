/**
 * Ideal-gas mixtures at a port (air, fuel gas, any mixture, flue gas at a measured O2) and fuels:
 * a gaseous fuel is a gas with its fuel's chemical exergy, a condensed fuel is taken at the dead state.
 * Chemical exergy relative to Szargut, Morris & Steward (1988).
 */
import {
  combustionFromO2,
  deadState,
  fuelChemicalExergy,
  mixtureChemicalExergy,
  type CombustionResult,
  type DeadState,
  type Fuel,
  type GasMixture,
} from '../thermo';
import { BalanceInputError, requireInput } from './errors';
import { Memo2, finishState, fuelEnthalpy298_J_per_kg, need } from './fluid-common';
import type { DeadValues, Environment, Fluid, FluidSpec, PortMeasurement, PortState } from './fluid-types';

/** Chemical exergy options of a gas fluid. */
type ChemicalMode = { kind: 'mixture'; strict: boolean } | { kind: 'fuel'; fuel: Fuel };

export class GasFluid implements Fluid {
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

export class CondensedFuelFluid implements Fluid {
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

export class FlueGasFamily implements Fluid {
  readonly family = 'flue-gas' as const;
  private memo = new Memo2<GasFluid>();
  constructor(
    readonly spec: Extract<FluidSpec, { kind: 'flue-gas' }>,
    readonly fuel: Fuel,
  ) {}
  withO2(O2_fraction: number): GasFluid {
    // the words of a range error only when it fails (the sweep asks for a flue gas many times an hour)
    if (!(O2_fraction >= 0 && O2_fraction <= 0.2)) requireInput('O2_fraction', O2_fraction, 0, 0.2, '[-]', `flue-gas O2 (${this.spec.o2Basis} basis)`);
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
