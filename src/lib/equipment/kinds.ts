/**
 * One exergy balance per unit kind, with the SPECO fuel/product/loss split of docs/domain.md s.3.
 * Every function takes ports (measurements or precomputed states, flows or 'mass-balance' /
 * 'energy-balance'), resolves what the balances fix, runs the property core's controlVolumeBalance
 * (destruction from the exergy balance, entropy generation from the independent entropy balance) and
 * returns a UnitBalance with F = P + L + D.
 *
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (Wiley, 1996), ch. 3 (exergy
 *   balances, efficiencies of components); Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO).
 */
import { G_m_per_s2, type AirSpec } from '../thermo';
import {
  assemble,
  exergyInto,
  resolvePorts,
  type BalancePort,
  type HeatFlow,
  type PowerFlow,
  type ResolvedPort,
  type TermRole,
  type UnitBalance,
  type UnitKind,
  type UnitTerm,
} from './balance';
import { BalanceInputError, requireInput } from './errors';
import { fluidOf, fuelSpecOf, prepareFluid, type Environment, type Fluid, type FluidSpec, type PortMeasurement } from './fluids';

/** Common input of the port-based balances. */
export interface PortBalanceInput {
  /** dead state: T0_K [K], p0_Pa [Pa] */
  env: Environment;
  ports: BalancePort[];
  /** false skips companion figures (isentropic efficiency ...) that F, P, L, D do not need; default true */
  companions?: boolean;
}

function roleGroup(p: BalancePort): string {
  return p.role ?? 'main';
}

function termsOf(ports: ResolvedPort[], role: TermRole, chemical: boolean): UnitTerm[] {
  const out: UnitTerm[] = new Array(ports.length);
  for (let i = 0; i < ports.length; i++) out[i] = streamTerm(ports[i], role, chemical);
  return out;
}

/**
 * Checks the dead state: T0 200..400 K, p0 50..120 kPa (the property core's range).
 * @throws BalanceInputError('IMPOSSIBLE_INPUT') naming T0_K or p0_Pa
 */
export function checkEnv(env: Environment): void {
  requireInput('T0_K', env?.T0_K, 200, 400, 'K', 'dead-state temperature');
  requireInput('p0_Pa', env?.p0_Pa, 5e4, 1.2e5, 'Pa', 'dead-state pressure');
}

function countDir(ports: BalancePort[], dir: 'in' | 'out'): number {
  let n = 0;
  for (const p of ports) if (p.direction === dir) n++;
  return n;
}

function requirePorts(kind: string, ports: BalancePort[], minIn: number, minOut: number, maxIn = Infinity, maxOut = Infinity): void {
  if (!Array.isArray(ports)) throw new BalanceInputError('MISSING_INPUT', 'ports', `a ${kind} needs its ports`);
  const ni = countDir(ports, 'in');
  const no = countDir(ports, 'out');
  if (ni < minIn || ni > maxIn) {
    throw new BalanceInputError(ni < minIn ? 'MISSING_INPUT' : 'INVALID_MODEL', 'ports', `a ${kind} needs ${maxIn === minIn ? minIn : `${minIn}..${maxIn}`} inlet port(s), got ${ni}`);
  }
  if (no < minOut || no > maxOut) {
    throw new BalanceInputError(no < minOut ? 'MISSING_INPUT' : 'INVALID_MODEL', 'ports', `a ${kind} needs ${maxOut === minOut ? minOut : `${minOut}..${maxOut}`} outlet port(s), got ${no}`);
  }
}

/**
 * Checks that side a (always) and side b (when required, else when present) have an inlet and an
 * outlet; returns whether side b is present.
 */
function requireSides(ports: BalancePort[], a: string, b: string, bRequired: boolean): boolean {
  let aIn = 0;
  let aOut = 0;
  let bIn = 0;
  let bOut = 0;
  for (const p of ports) {
    if (p.role === a) p.direction === 'in' ? aIn++ : aOut++;
    else if (p.role === b) p.direction === 'in' ? bIn++ : bOut++;
  }
  if (aIn < 1 || aOut < 1) throw new BalanceInputError('MISSING_INPUT', a, `the ${a} side needs an inlet and an outlet`);
  const hasB = bIn + bOut > 0;
  if ((bRequired || hasB) && (bIn < 1 || bOut < 1)) throw new BalanceInputError('MISSING_INPUT', b, `the ${b} side needs an inlet and an outlet`);
  return hasB;
}

function streamTerm(p: ResolvedPort, role: TermRole, chemical: boolean): UnitTerm {
  const into = exergyInto(p, chemical);
  return { label: p.name, role, exergy_W: role === 'fuel' ? into : -into };
}

function powerFlag(name: string, value: number): void {
  requireInput(name, value, -1e12, 1e12, 'W', 'power');
}

// ------------------------------------------------------------------------------------------ turbine

/** Turbine or expander. */
export interface TurbineInput extends PortBalanceInput {
  /** measured power [W]: shaft power, or electric power at the generator terminals (see powerMeasured) */
  power_W: number;
  /** 'shaft' (default) or 'electric'; electric power is turned into shaft power as W / generatorEfficiency */
  powerMeasured?: 'shaft' | 'electric';
  /** generator efficiency [-], 0..1, needed when powerMeasured is 'electric' */
  generatorEfficiency?: number;
  kind?: 'turbine' | 'expander';
}

/**
 * Turbine / expander: F = sum_in mDot psi - sum_out mDot psi (extractions included), P = shaft power
 * (W, or W_el / eta_gen), companion isentropic efficiency (single inlet):
 *   eta_s = sum_j mDot_j (h_in - h_j) / sum_j mDot_j (h_in - h_s,j),   h_s,j = h(p_j, s_in).
 * Wet outlets take their state from the energy balance (`measured: { fromEnergyBalance, p_Pa }`):
 * h_out = h_in - W_shaft / mDot for one outlet; for several, the common-expansion-line assumption of
 * resolvePorts (extras.expansionEfficiency).
 * @throws BalanceInputError for missing ports, a generator efficiency outside (0, 1], or unsolvable outlets
 * @see docs/domain.md s.3; Bejan, Tsatsaronis & Moran (1996) ch. 3 (turbine exergetic efficiency)
 */
export function turbineBalance(input: TurbineInput): UnitBalance {
  checkEnv(input.env);
  const kind = input.kind ?? 'turbine';
  requirePorts(kind, input.ports, 1, 1);
  powerFlag('power_W', input.power_W);
  let shaft = input.power_W;
  if ((input.powerMeasured ?? 'shaft') === 'electric') {
    const eta = input.generatorEfficiency;
    if (eta === undefined) throw new BalanceInputError('MISSING_INPUT', 'generatorEfficiency', 'electric power needs the generator efficiency to give shaft power');
    requireInput('generatorEfficiency', eta, 1e-6, 1, '[-]');
    shaft = input.power_W / eta;
  }
  const res = resolvePorts(input.ports, input.env, { work_W: shaft });
  const terms = termsOf(res.ports, 'fuel', false);
  terms.push({ label: 'shaft power', role: 'product', exergy_W: shaft });
  const extras: Record<string, number> = { shaftPower_W: shaft };
  let inlet: ResolvedPort | null = null;
  let nIn = 0;
  for (const p of res.ports) if (p.direction === 'in') (inlet = p), nIn++;
  if (nIn === 1 && input.companions !== false) {
    const hin = inlet!.state.h;
    const sin = inlet!.state.s;
    let actual = 0;
    let ideal = 0;
    for (const p of res.ports) {
      if (p.direction !== 'out') continue;
      actual += p.mDot * (hin - p.state.h);
      ideal += p.mDot * (hin - p.fluid.hIsentropic(p.state.p, sin));
    }
    extras.isentropicEfficiency = ideal > 0 ? actual / ideal : NaN;
  }
  if (Number.isFinite(res.commonExpansionEfficiency)) extras.expansionEfficiency = res.commonExpansionEfficiency;
  return assemble({
    lean: input.companions === false,
    kind,
    env: input.env,
    ports: res.ports,
    chemical: false,
    powers: [{ label: 'shaft power', power_W: shaft }],
    heats: [],
    terms,
    hasProduct: true,
    extras,
  });
}

// ----------------------------------------------------------------------------- compressor family

/** Compressor, pump or fan. */
export interface CompressorInput extends PortBalanceInput {
  /** measured power [W]: shaft, or electric input to the driving motor (see powerMeasured) */
  power_W: number;
  /** 'shaft' (default) or 'electric'; electric power becomes shaft power as W * motorEfficiency */
  powerMeasured?: 'shaft' | 'electric';
  /** motor efficiency [-], 0..1, needed when powerMeasured is 'electric' */
  motorEfficiency?: number;
  kind?: 'compressor' | 'pump' | 'fan';
}

/**
 * Compressor / pump / fan: F = shaft power, P = sum_out mDot psi - sum_in mDot psi; companion
 * isentropic efficiency (one inlet, one outlet) eta_s = (h_s - h_in) / (h_out - h_in), h_s = h(p_out, s_in).
 * @throws BalanceInputError for missing ports or a motor efficiency outside (0, 1]
 * @see docs/domain.md s.3; Bejan, Tsatsaronis & Moran (1996) ch. 3
 */
export function compressorBalance(input: CompressorInput): UnitBalance {
  checkEnv(input.env);
  const kind = input.kind ?? 'compressor';
  requirePorts(kind, input.ports, 1, 1);
  powerFlag('power_W', input.power_W);
  let shaft = input.power_W;
  if ((input.powerMeasured ?? 'shaft') === 'electric') {
    const eta = input.motorEfficiency;
    if (eta === undefined) throw new BalanceInputError('MISSING_INPUT', 'motorEfficiency', 'electric power needs the motor efficiency to give shaft power');
    requireInput('motorEfficiency', eta, 1e-6, 1, '[-]');
    shaft = input.power_W * eta;
  }
  const res = resolvePorts(input.ports, input.env, { work_W: -shaft });
  const terms: UnitTerm[] = [{ label: 'shaft power', role: 'fuel', exergy_W: shaft }];
  for (const p of res.ports) terms.push(streamTerm(p, 'product', false));
  const extras: Record<string, number> = { shaftPower_W: shaft };
  if (res.ports.length === 2 && input.companions !== false) {
    const inP = res.ports[0].direction === 'in' ? res.ports[0] : res.ports[1];
    const outP = inP === res.ports[0] ? res.ports[1] : res.ports[0];
    const a = inP.state;
    const b = outP.state;
    const hs = outP.fluid.hIsentropic(b.p, a.s);
    extras.isentropicEfficiency = b.h !== a.h ? (hs - a.h) / (b.h - a.h) : NaN;
  }
  return assemble({ lean: input.companions === false, kind, env: input.env, ports: res.ports, chemical: false, powers: [{ label: 'shaft power', power_W: -shaft }], heats: [], terms, hasProduct: true, extras });
}

// --------------------------------------------------------------------------------- heat exchanger

/** Heat exchanger: ports with role 'hot' or 'cold'. */
export interface HeatExchangerInput extends PortBalanceInput {
  /**
   * Streams below T0: the fuel/product definitions of hot-side decrease / cold-side increase do not
   * hold there. 'refuse' (default) throws BalanceInputError('BELOW_DEAD_STATE'); 'flag' computes with
   * the above-T0 definitions and adds the flag 'below-dead-state-definitions'.
   */
  belowDeadState?: 'refuse' | 'flag';
}

/**
 * Heat exchanger (both streams above T0): F = exergy decrease of the hot side, P = exergy increase of
 * the cold side. One flow per side may come from the mass balance, one flow of the unit from the
 * energy balance.
 * @throws BalanceInputError('BELOW_DEAD_STATE') for a stream below T0 unless belowDeadState is 'flag'
 * @see docs/domain.md s.3; Lazzaretto & Tsatsaronis (2006), heat exchangers above T0
 */
export function heatExchangerBalance(input: HeatExchangerInput): UnitBalance {
  checkEnv(input.env);
  requirePorts('heat exchanger', input.ports, 2, 2);
  for (const p of input.ports) {
    if (p.role !== 'hot' && p.role !== 'cold') throw new BalanceInputError('INVALID_MODEL', p.name, `a heat-exchanger port needs role 'hot' or 'cold', got '${p.role}'`);
  }
  requireSides(input.ports, 'hot', 'cold', true);
  const res = resolvePorts(input.ports, input.env, { work_W: 0, defaultGroup: roleGroup });
  const flags: string[] = [];
  for (const p of res.ports) {
    if (p.state.T < input.env.T0_K) {
      if ((input.belowDeadState ?? 'refuse') === 'refuse') {
        throw new BalanceInputError(
          'BELOW_DEAD_STATE',
          p.name,
          `T = ${p.state.T} K is below T0 = ${input.env.T0_K} K; hot-side decrease / cold-side increase is not the fuel/product split there (set belowDeadState: 'flag' to compute anyway)`,
        );
      }
      if (!flags.includes('below-dead-state-definitions')) flags.push('below-dead-state-definitions');
    }
  }
  const terms: UnitTerm[] = [];
  for (const p of res.ports) terms.push(streamTerm(p, p.role === 'hot' ? 'fuel' : 'product', false));
  let dutyHot = 0;
  let dutyCold = 0;
  for (const p of res.ports) {
    const sgn = p.direction === 'in' ? 1 : -1;
    if (p.role === 'hot') dutyHot += sgn * p.mDot * p.state.h;
    else dutyCold -= sgn * p.mDot * p.state.h;
  }
  return assemble({
    lean: input.companions === false,
    kind: 'heat-exchanger',
    env: input.env,
    ports: res.ports,
    chemical: false,
    powers: [],
    heats: [],
    terms,
    hasProduct: true,
    extras: { hotDuty_W: dutyHot, coldDuty_W: dutyCold },
    flags,
  });
}

// ------------------------------------------------------------------------------------------ boiler

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
  const fluePort = flues[0];
  if (typeof fuelPort.mDot_kg_per_s !== 'number') throw new BalanceInputError('MISSING_INPUT', `${fuelPort.name}.mDot_kg_per_s`, 'the fuel flow must be measured');
  const fuelFluid = fluidOf(fuelPort.fluid);
  if (!fuelFluid.fuel) throw new BalanceInputError('INVALID_MODEL', fuelPort.name, "the fuel port's fluid must be 'fuel-gas' or 'fuel'");
  // Flue gas: its fuel defaults to the fuel port's.
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
  const flue = flueFamily.withO2(O2);
  const comb = flue.combustion!;
  // Air: an explicit port of kind 'air' with the flue gas's humidity, or ambient air.
  const flueAir = (flueFamily.spec as Extract<FluidSpec, { kind: 'flue-gas' }>).air;
  let airPort = byRole('air')[0];
  if (airPort) {
    const spec = fluidOf(airPort.fluid).spec;
    if (spec.kind !== 'air') throw new BalanceInputError('INVALID_MODEL', airPort.name, "the air port's fluid must be kind 'air'");
    if (!sameHumidity(spec.humidity, flueAir)) throw new BalanceInputError('INVALID_MODEL', airPort.name, 'the air port and the flue gas assume different air humidity');
  } else {
    airPort = { name: 'air', direction: 'in', role: 'air', fluid: { kind: 'air', humidity: flueAir }, mDot_kg_per_s: 'fuel-ratio', measured: 'ambient' };
    ports.push(airPort);
  }
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
  const terms: UnitTerm[] = [];
  const fuelFlags: string[] = [];
  let stackPh = 0;
  let stackCh = 0;
  let waterHeat = 0;
  for (const p of resolved.ports) {
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
  const condensed = fuelFluid.family === 'condensed-fuel';
  if (condensed) fuelFlags.push('no-entropy-balance');
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
    flags: fuelFlags,
  });
  if (condensed) {
    out.entropyGeneration_W_per_K = NaN;
    out.gouyStodolaResidual_W = NaN;
  }
  return out;
}

// ------------------------------------------------------------------------------------------- valve

/**
 * Let-down / throttling valve: F = mDot (psi_in - psi_out), no product, D = F (dissipative: no
 * efficiency). The outlet state may come from the energy balance (isenthalpic: h_out = h_in).
 * @throws BalanceInputError unless there is one inlet and one outlet
 * @see docs/domain.md s.3; Bejan, Tsatsaronis & Moran (1996) ch. 3 (throttling)
 */
export function valveBalance(input: PortBalanceInput): UnitBalance {
  checkEnv(input.env);
  requirePorts('valve', input.ports, 1, 1, 1, 1);
  const res = resolvePorts(input.ports, input.env, { work_W: 0 });
  const terms = termsOf(res.ports, 'fuel', false);
  return assemble({ lean: input.companions === false, kind: 'valve', env: input.env, ports: res.ports, chemical: false, powers: [], heats: [], terms, hasProduct: false });
}

// -------------------------------------------------------------------------------- mixer family

/** Mixer, deaerator or open feedwater heater. */
export interface MixerInput extends PortBalanceInput {
  kind?: 'mixer' | 'deaerator' | 'open-feedwater-heater';
}

/**
 * Mixer / deaerator / open feedwater heater. Inlets have role 'hot' or 'cold', or none: then an inlet
 * whose specific flow exergy exceeds the outlet's is hot. Outlets: one 'outlet' (role 'outlet' or none)
 * and any number of 'vent' outlets (loss).
 *   F = sum_hot mDot_i psi_i - (mDot_out - sum_cold mDot_j) psi_out     (exergy decrease of the hot streams)
 *   P = sum_cold mDot_j (psi_out - psi_j)                               (exergy increase of the cold streams)
 *   L = sum_vent mDot psi_vent
 * The hot streams' share of the outlet is mDot_out - sum_cold, so F - P - L is the balance's D exactly
 * even when measured flows do not close the mass balance.
 * @see docs/domain.md s.3; Bejan, Tsatsaronis & Moran (1996) ch. 3 (mixing; open feedwater heaters)
 */
export function mixerBalance(input: MixerInput): UnitBalance {
  checkEnv(input.env);
  const kind = input.kind ?? 'mixer';
  requirePorts(kind, input.ports, 2, 1);
  for (const p of input.ports) {
    const ok = p.direction === 'in' ? [undefined, 'hot', 'cold'] : [undefined, 'outlet', 'vent'];
    if (!ok.includes(p.role)) throw new BalanceInputError('INVALID_MODEL', p.name, `role '${p.role}' does not apply to a ${kind} ${p.direction === 'in' ? 'inlet' : 'outlet'} (use ${ok.slice(1).join(' or ')})`);
  }
  let nMain = 0;
  let iMain = -1;
  for (let i = 0; i < input.ports.length; i++) if (input.ports[i].direction === 'out' && input.ports[i].role !== 'vent') (nMain++, (iMain = i));
  if (nMain !== 1) throw new BalanceInputError(nMain ? 'INVALID_MODEL' : 'MISSING_INPUT', 'outlet', `a ${kind} needs exactly one main outlet (others are role 'vent'), got ${nMain}`);
  const res = resolvePorts(input.ports, input.env, { work_W: 0 });
  const out = res.ports[iMain];
  const psiOut = out.state.psi;
  const terms: UnitTerm[] = [];
  let coldMass = 0;
  const flags: string[] = [];
  for (const p of res.ports) {
    if (p.direction !== 'in') continue;
    const hot = p.role === 'hot' || (p.role === undefined && p.state.psi > psiOut);
    if (hot) terms.push({ label: p.name, role: 'fuel', exergy_W: p.mDot * p.state.psi });
    else {
      coldMass += p.mDot;
      terms.push({ label: p.name, role: 'product', exergy_W: -p.mDot * p.state.psi });
    }
  }
  terms.push({ label: `${out.name} (hot streams' share)`, role: 'fuel', exergy_W: -(out.mDot - coldMass) * psiOut });
  terms.push({ label: `${out.name} (cold streams' share)`, role: 'product', exergy_W: coldMass * psiOut });
  for (const p of res.ports) if (p.direction === 'out' && p !== out) terms.push({ label: p.name, role: 'loss', exergy_W: p.mDot * p.state.psi });
  return assemble({ lean: input.companions === false, kind, env: input.env, ports: res.ports, chemical: false, powers: [], heats: [], terms, hasProduct: true, flags });
}

// ------------------------------------------------------------------------------ condenser family

/** Condenser or cooler: ports with role 'process' and, optionally, 'cooling'. */
export interface CondenserInput extends PortBalanceInput {
  kind?: 'condenser' | 'cooler';
}

/**
 * Condenser / cooler: F = exergy decrease of the process stream, no product.
 * With cooling-side ports (flow measured or from the energy balance): L = exergy increase of the
 * cooling medium, D = F - L. Without them the heat is taken as rejected to the environment at T0
 * (a heat term at Tb = T0 closing the energy balance, zero exergy): D = F, L = 0 and the flag
 * 'loss-not-separated'. A wet process inlet may take its state from the energy balance (cooling-water
 * heat balance) or from x or h.
 * @see docs/domain.md s.3; Bejan, Tsatsaronis & Moran (1996) ch. 3 (dissipative components)
 */
export function condenserBalance(input: CondenserInput): UnitBalance {
  checkEnv(input.env);
  const kind = input.kind ?? 'condenser';
  requirePorts(kind, input.ports, 1, 1);
  for (const p of input.ports) {
    if (p.role !== 'process' && p.role !== 'cooling') throw new BalanceInputError('INVALID_MODEL', p.name, `a ${kind} port needs role 'process' or 'cooling', got '${p.role}'`);
  }
  const hasCooling = requireSides(input.ports, 'process', 'cooling', false);
  const heats: HeatFlow[] = [];
  const flags: string[] = [];
  const res = resolvePorts(input.ports, input.env, { work_W: 0, defaultGroup: roleGroup });
  if (!hasCooling) {
    let q = 0;
    for (const p of res.ports) q += (p.direction === 'in' ? 1 : -1) * p.mDot * (p.state.h + 0.5 * p.state.velocity_m_per_s ** 2 + G_m_per_s2 * p.state.elevation_m);
    heats.push({ label: 'heat rejected at T0', Q_W: -q, Tb_K: input.env.T0_K });
    flags.push('loss-not-separated');
  }
  const terms: UnitTerm[] = [];
  for (const p of res.ports) terms.push(streamTerm(p, p.role === 'process' ? 'fuel' : 'loss', false));
  let duty = 0;
  for (const p of res.ports) if (p.role === 'process') duty += (p.direction === 'in' ? 1 : -1) * p.mDot * p.state.h;
  return assemble({ lean: input.companions === false, kind, env: input.env, ports: res.ports, chemical: false, powers: [], heats, terms, hasProduct: false, extras: { duty_W: duty }, flags });
}

// ------------------------------------------------------------------------------- motor/generator

/** Motor or generator. */
export interface MachineInput {
  env: Environment;
  /** electric (motor) or shaft (generator) power in [W], > 0 */
  powerIn_W: number;
  /** shaft (motor) or electric (generator) power out [W], >= 0 */
  powerOut_W: number;
  kind?: 'motor' | 'generator';
}

/**
 * Motor / generator: F = power in, P = power out, efficiency = P / F, equal to the energy efficiency.
 * The losses leave as heat; the boundary is drawn where they reach the environment (Tb = T0), so they
 * carry no exergy and D = F - P (L = 0). An efficiency above 1 (meter error) is flagged, not refused.
 * @throws BalanceInputError for a non-positive power in or a negative power out
 * @see docs/domain.md s.3
 */
export function machineBalance(input: MachineInput): UnitBalance {
  checkEnv(input.env);
  const kind = input.kind ?? 'motor';
  requireInput('powerIn_W', input.powerIn_W, 1e-9, 1e12, 'W', 'power in');
  requireInput('powerOut_W', input.powerOut_W, 0, 1e12, 'W', 'power out');
  const loss = input.powerIn_W - input.powerOut_W;
  const inLabel = kind === 'motor' ? 'electric power in' : 'shaft power in';
  const outLabel = kind === 'motor' ? 'shaft power out' : 'electric power out';
  const flags = loss < 0 ? ['efficiency-above-one'] : [];
  return assemble({
    kind,
    env: input.env,
    ports: [],
    chemical: false,
    powers: [
      { label: inLabel, power_W: -input.powerIn_W },
      { label: outLabel, power_W: input.powerOut_W },
    ],
    heats: [{ label: 'losses to the environment at T0', Q_W: -loss, Tb_K: input.env.T0_K }],
    terms: [
      { label: inLabel, role: 'fuel', exergy_W: input.powerIn_W },
      { label: outLabel, role: 'product', exergy_W: input.powerOut_W },
    ],
    hasProduct: true,
    extras: { energyEfficiency: input.powerOut_W / input.powerIn_W },
    flags,
  });
}

// ------------------------------------------------------------------------------------------ generic

/** A power of a generic control volume: out of the volume positive [W]. */
export interface GenericPower extends PowerFlow {
  role: TermRole;
}

/** A heat of a generic control volume: into the volume positive [W] at Tb [K]. */
export interface GenericHeat extends HeatFlow {
  role: TermRole;
}

/** Generic control volume: every port, power and heat has role 'fuel', 'product' or 'loss'. */
export interface GenericInput extends PortBalanceInput {
  powers?: GenericPower[];
  heats?: GenericHeat[];
  /** include the streams' chemical exergy (reacting volumes); default false */
  chemical?: boolean;
}

/**
 * Generic control volume: any ports, heat flows with their boundary temperature, and powers. The user
 * designates each term: a 'fuel' term adds the exergy it brings into the volume to F; a 'product' or
 * 'loss' term adds the exergy it takes out of the volume to P or L. D comes from the exergy balance and
 * equals F - P - L. P is null when no term is a product.
 * @throws BalanceInputError for a term without a role
 * @see docs/domain.md s.2, s.3; Lazzaretto & Tsatsaronis (2006)
 */
export function genericBalance(input: GenericInput): UnitBalance {
  checkEnv(input.env);
  const powers = input.powers ?? [];
  const heats = input.heats ?? [];
  const roles: TermRole[] = ['fuel', 'product', 'loss'];
  for (const p of input.ports) if (!roles.includes(p.role as TermRole)) throw new BalanceInputError('INVALID_MODEL', p.name, `a generic port needs role fuel, product or loss, got '${p.role}'`);
  for (const w of powers) {
    if (!roles.includes(w.role)) throw new BalanceInputError('INVALID_MODEL', w.label, `a generic power needs role fuel, product or loss, got '${w.role}'`);
    powerFlag(`${w.label}.power_W`, w.power_W);
  }
  for (const q of heats) {
    if (!roles.includes(q.role)) throw new BalanceInputError('INVALID_MODEL', q.label, `a generic heat needs role fuel, product or loss, got '${q.role}'`);
    requireInput(`${q.label}.Tb_K`, q.Tb_K, 1, 1e5, 'K', 'boundary temperature');
  }
  if (input.ports.length + powers.length + heats.length === 0) throw new BalanceInputError('MISSING_INPUT', 'ports', 'a generic control volume needs at least one term');
  const chemical = input.chemical ?? false;
  let W = 0;
  for (const w of powers) W += w.power_W;
  let Q = 0;
  for (const q of heats) Q += q.Q_W;
  const res = resolvePorts(input.ports, input.env, { work_W: W, heat_W: Q });
  const terms: UnitTerm[] = [];
  for (const p of res.ports) terms.push(streamTerm(p, p.role as TermRole, chemical));
  const T0 = input.env.T0_K;
  for (const w of powers) terms.push({ label: w.label, role: w.role, exergy_W: w.role === 'fuel' ? -w.power_W : w.power_W });
  for (const q of heats) {
    const x = (1 - T0 / q.Tb_K) * q.Q_W;
    terms.push({ label: q.label, role: q.role, exergy_W: q.role === 'fuel' ? x : -x });
  }
  let hasProduct = false;
  for (const t of terms) if (t.role === 'product') hasProduct = true;
  return assemble({ lean: input.companions === false, kind: 'generic', env: input.env, ports: res.ports, chemical, powers, heats, terms, hasProduct });
}
