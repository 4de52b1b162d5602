/**
 * The boiler's balance: fuel and air in, steam out, stack gas and blowdown as losses.
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (Wiley, 1996), ch. 3;
 *   Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO).
 */
import type { AirSpec } from '../../thermo';
import { assemble, resolvePorts, type BalancePort, type ResolvedPort, type UnitBalance, type UnitTerm } from '../balance';
import { BalanceInputError } from '../errors';
import { fluidOf, fuelSpecOf, prepareFluid, type Fluid, type FluidSpec, type PortMeasurement } from '../fluids';
import { checkEnv, countDir, streamTerm, type PortBalanceInput } from './common';

/**
 * Boiler / steam generator. Port roles: 'fuel' (one inlet, measured flow), 'air' (optional inlet;
 * absent means ambient air), 'flue-gas' (one outlet, fluid kind 'flue-gas', measured T and O2),
 * 'water' (feedwater, steam, reheat in and out; groups separate the lines), 'blowdown' (outlet, loss).
 * Air and flue-gas flows may be 'fuel-ratio': fuel flow times the combustion ratio from the O2.
 */
export type BoilerInput = PortBalanceInput;

function sameHumidity(a: AirSpec | undefined, b: AirSpec | undefined): boolean {
  const w = (s: AirSpec | undefined) => [s?.H2O_mol_per_molDryAir ?? null, s?.humidityRatio_kg_per_kg ?? null].join(',');
  return w(a) === w(b) || ((!a || w(a) === 'null,null') && (!b || w(b) === 'null,null'));
}

/** The boiler's ports by role, checked: one fuel inlet with a measured flow, one flue-gas outlet, water lines. */
interface BoilerPorts {
  fuelPort: BalancePort & { mDot_kg_per_s: number };
  fluePort: BalancePort;
  airPort: BalancePort | undefined;
}

function boilerPorts(ports: BalancePort[]): BoilerPorts {
  const byRole = (r: string) => ports.filter((p) => p.role === r);
  for (const p of ports) {
    if (!['fuel', 'air', 'flue-gas', 'water', 'blowdown'].includes(p.role ?? '')) {
      throw new BalanceInputError('INVALID_MODEL', p.name, `a boiler port needs role fuel, air, flue-gas, water or blowdown, got '${p.role}'`);
    }
  }
  const fuels = byRole('fuel');
  const flues = byRole('flue-gas');
  if (fuels.length !== 1 || fuels[0].direction !== 'in') throw new BalanceInputError('MISSING_INPUT', 'fuel', 'a boiler needs exactly one fuel inlet port (role fuel)');
  if (flues.length !== 1 || flues[0].direction !== 'out') throw new BalanceInputError('MISSING_INPUT', 'flue-gas', 'a boiler needs exactly one flue-gas outlet port (role flue-gas)');
  if (byRole('air').length > 1) throw new BalanceInputError('INVALID_MODEL', 'air', 'a boiler takes at most one air port');
  const water = ports.filter((p) => p.role === 'water' || p.role === 'blowdown');
  if (countDir(water, 'in') < 1 || countDir(water, 'out') < 1) throw new BalanceInputError('MISSING_INPUT', 'water', 'a boiler needs water inlet and steam outlet ports (role water)');
  const fuelPort = fuels[0];
  if (typeof fuelPort.mDot_kg_per_s !== 'number') throw new BalanceInputError('MISSING_INPUT', `${fuelPort.name}.mDot_kg_per_s`, 'the fuel flow must be measured');
  return { fuelPort: fuelPort as BoilerPorts['fuelPort'], fluePort: flues[0], airPort: byRole('air')[0] };
}

/** The flue gas's fluid (its fuel defaults to the fuel port's) before and after fixing its O2. */
function flueGasOf(fluePort: BalancePort, fuelFluid: Fluid): { flueFamily: Fluid; flue: Fluid } {
  let flueFamily: Fluid;
  const flueIn = fluePort.fluid;
  if ('family' in flueIn) flueFamily = flueIn as Fluid;
  else {
    if (flueIn.kind !== 'flue-gas') throw new BalanceInputError('INVALID_MODEL', fluePort.name, "the flue-gas port's fluid must be kind 'flue-gas'");
    flueFamily = prepareFluid(flueIn, fuelSpecOf(fuelFluid.spec));
  }
  const fm = fluePort.measured as PortMeasurement;
  const O2 = typeof fm === 'object' && fm ? fm.O2_fraction : undefined;
  if (O2 === undefined) throw new BalanceInputError('MISSING_INPUT', `${fluePort.name}.O2_fraction`, 'the flue gas needs its measured O2 fraction');
  return { flueFamily, flue: flueFamily.withO2(O2) };
}

/** The air port: an explicit port of kind 'air' with the flue gas's humidity, or ambient air (new port). */
function airPortOf(airPort: BalancePort | undefined, flueFamily: Fluid): { airPort: BalancePort; added: boolean } {
  const flueAir = (flueFamily.spec as Extract<FluidSpec, { kind: 'flue-gas' }>).air;
  if (!airPort) {
    return { airPort: { name: 'air', direction: 'in', role: 'air', fluid: { kind: 'air', humidity: flueAir }, mDot_kg_per_s: 'fuel-ratio', measured: 'ambient' }, added: true };
  }
  const spec = fluidOf(airPort.fluid).spec;
  if (spec.kind !== 'air') throw new BalanceInputError('INVALID_MODEL', airPort.name, "the air port's fluid must be kind 'air'");
  if (!sameHumidity(spec.humidity, flueAir)) throw new BalanceInputError('INVALID_MODEL', airPort.name, 'the air port and the flue gas assume different air humidity');
  return { airPort, added: false };
}

/** Fuel and air are fuel, water lines product, flue gas and blowdown loss; with the stack loss and the heat to the water. */
function boilerTerms(ports: ResolvedPort[]): { terms: UnitTerm[]; stackPh: number; stackCh: number; waterHeat: number } {
  const terms: UnitTerm[] = [];
  let stackPh = 0;
  let stackCh = 0;
  let waterHeat = 0;
  for (const p of ports) {
    if (p.role === 'fuel' || p.role === 'air') terms.push(streamTerm(p, 'fuel', true));
    else if (p.role === 'water') {
      terms.push(streamTerm(p, 'product', true));
      waterHeat += (p.direction === 'out' ? 1 : -1) * p.mDot * p.state.h;
    } else {
      terms.push(streamTerm(p, 'loss', true));
      if (p.role === 'blowdown') waterHeat += p.mDot * p.state.h;
      if (p.role === 'flue-gas') {
        stackPh = p.mDot * p.state.psi;
        stackCh = p.mDot * (p.state.eCh ?? 0);
      }
    }
  }
  return { terms, stackPh, stackCh, waterHeat };
}

/**
 * Boiler: F = fuel exergy (chemical + physical) + combustion-air exergy (chemical + physical),
 * P = steam out - water in over all water lines (reheat included), L = stack gas + blowdown,
 * D = F - P - L (from the exergy balance).
 *
 * Stack loss: the flue gas's physical exergy against the flue gas's own composition at (T0, p0) plus
 * its chemical exergy relative to the Szargut 1988 environment, as an ideal-gas mixture with the
 * water as vapour (no condensation at the dead state), complete combustion (no CO, soot or NOx), ash
 * not counted. Flue-gas composition and flow from the fuel and the measured O2 (property core,
 * combustionFromO2).
 *
 * Gouy-Stodola residual: with a gaseous fuel of known composition it is the energy residual plus the
 * small difference between the Szargut table and the NASA Gibbs energies of the reaction (about 1e-4
 * of the fuel exergy for methane). Condensed fuels have no absolute entropy in the property core:
 * entropyGeneration_W_per_K and gouyStodolaResidual_W are then NaN (flag 'no-entropy-balance').
 * @throws BalanceInputError for missing or duplicated roles, or air/flue-gas humidity that differ
 * @see docs/domain.md s.3, s.4; Bejan, Tsatsaronis & Moran (1996) ch. 3 (boiler, combustion chamber)
 */
export function boilerBalance(input: BoilerInput): UnitBalance {
  checkEnv(input.env);
  const env = input.env;
  const ports = [...input.ports];
  const { fuelPort, fluePort, airPort: givenAir } = boilerPorts(ports);
  const fuelFluid = fluidOf(fuelPort.fluid);
  if (!fuelFluid.fuel) throw new BalanceInputError('INVALID_MODEL', fuelPort.name, "the fuel port's fluid must be 'fuel-gas' or 'fuel'");
  const { flueFamily, flue } = flueGasOf(fluePort, fuelFluid);
  const comb = flue.combustion!;
  const { airPort, added } = airPortOf(givenAir, flueFamily);
  if (added) ports.push(airPort);
  const mf = fuelPort.mDot_kg_per_s;
  const fuelRatioFlows: Record<string, number> = {
    [airPort.name]: mf * comb.air_kg_per_kgFuel,
    [fluePort.name]: mf * comb.flue_kg_per_kgFuel,
  };
  const resolved = resolvePorts(
    ports.map((p) => (p === fluePort ? { ...p, fluid: flue } : p)),
    env,
    { work_W: 0, defaultGroup: (p) => (p.role === 'water' || p.role === 'blowdown' ? 'water' : 'gas'), fuelRatioFlows },
  );
  const { terms, stackPh, stackCh, waterHeat } = boilerTerms(resolved.ports);
  const condensed = fuelFluid.family === 'condensed-fuel';
  const fuelEnergy = mf * fuelFluid.fuel.LHV_J_per_kg;
  const out = assemble({
    lean: input.companions === false,
    kind: 'boiler',
    env,
    ports: resolved.ports,
    chemical: true,
    powers: [],
    heats: [],
    terms,
    hasProduct: true,
    extraThroughput_W: fuelEnergy,
    extras: {
      lambda: comb.lambda,
      airFlow_kg_per_s: fuelRatioFlows[airPort.name],
      flueGasFlow_kg_per_s: resolved.ports.find((p) => p.name === fluePort.name)!.mDot,
      stackLossPhysical_W: stackPh,
      stackLossChemical_W: stackCh,
      fuelChemicalExergy_J_per_kg: resolved.ports.find((p) => p.name === fuelPort.name)!.state.eCh ?? NaN,
      energyEfficiencyLHV: fuelEnergy > 0 ? waterHeat / fuelEnergy : NaN,
    },
    flags: condensed ? ['no-entropy-balance'] : [],
  });
  if (condensed) {
    out.entropyGeneration_W_per_K = NaN;
    out.gouyStodolaResidual_W = NaN;
  }
  return out;
}
