/**
 * Shared machinery of the unit balances: ports as given to a balance, resolution of flows and states
 * that come from the mass or energy balance, and assembly of the SPECO result (fuel, product, loss,
 * destruction) through the property core's `controlVolumeBalance`, which supplies the destruction from
 * the exergy balance and, independently, the entropy generation from the entropy balance.
 *
 * Sign conventions as in docs/domain.md s.2: heat into the volume and work out of it positive.
 * @see Bejan, Tsatsaronis & Moran, Thermal Design and Optimization (1996), ch. 3;
 *   Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO fuel/product definitions).
 */
import { controlVolumeBalance, G_m_per_s2, type BalanceStream } from '../thermo';
import { BalanceInputError, requireInput } from './errors';
import { fluidOf, type Environment, type Fluid, type FluidSpec, type PortMeasurement, type PortState } from './fluids';

/** Unit kinds. Aliases share one balance: expander = turbine; pump, fan = compressor; ... */
export type UnitKind =
  | 'turbine'
  | 'expander'
  | 'compressor'
  | 'pump'
  | 'fan'
  | 'heat-exchanger'
  | 'boiler'
  | 'valve'
  | 'mixer'
  | 'deaerator'
  | 'open-feedwater-heater'
  | 'condenser'
  | 'cooler'
  | 'motor'
  | 'generator'
  | 'generic';

export const UNIT_KINDS: readonly UnitKind[] = [
  'turbine', 'expander', 'compressor', 'pump', 'fan', 'heat-exchanger', 'boiler', 'valve', 'mixer',
  'deaerator', 'open-feedwater-heater', 'condenser', 'cooler', 'motor', 'generator', 'generic',
];

/** Role of a balance term in the SPECO split. */
export type TermRole = 'fuel' | 'product' | 'loss';

/**
 * One term of the fuel/product/loss split: `exergy_W` is its contribution to the total of its role
 * [W] (F = sum of fuel terms, P = sum of product terms, L = sum of loss terms); a term may be negative
 * (an outlet stream's exergy subtracted from the fuel, an inlet's from the product).
 */
export interface UnitTerm {
  label: string;
  role: TermRole;
  exergy_W: number;
}

/** Result of one unit balance. SI: W, W/K, kg/s; ratios [-]. */
export interface UnitBalance {
  kind: UnitKind;
  /** fuel exergy F [W] */
  fuel_W: number;
  /** product exergy P [W]; null for dissipative units (valve, condenser) */
  product_W: number | null;
  /** exergy loss L [W] (stack gas, cooling water, vents) */
  loss_W: number;
  /** exergy destruction D [W] from the exergy balance; F = P + L + D */
  destruction_W: number;
  /** exergy efficiency P / F [-]; null when there is no product or F <= 0 */
  efficiency: number | null;
  /** entropy generation from the entropy balance [W/K], independent of D */
  entropyGeneration_W_per_K: number;
  /** D - T0 Sgen [W]: zero (Gouy-Stodola) when mass and energy close; non-zero flags suspect data */
  gouyStodolaResidual_W: number;
  /** sum in - sum out of mass [kg/s] */
  massResidual_kg_per_s: number;
  /** first-law residual: Q - W + sum_in m e - sum_out m e [W] (unmeasured heat loss, bad data) */
  energyResidual_W: number;
  /** energyResidual_W in percent of the energy throughput (see assemble) [%] */
  energyClosure_pct: number;
  /** the fuel/product/loss terms */
  terms: UnitTerm[];
  /** companions: isentropicEfficiency, energyEfficiency, expansionEfficiency of wet outlets, ... [-] or SI */
  extras: Record<string, number>;
  /** conditions the caller should look at: near-saturation:<port>, below-dead-state:<port>, ... */
  flags: string[];
  /** resolved ports: flow [kg/s] and state, including flows and states from the mass or energy balance */
  ports: Record<string, { direction: 'in' | 'out'; mDot_kg_per_s: number; state: PortState }>;
}

/** How a port's state is given to a balance. */
export type PortStateInput =
  | PortMeasurement
  /** unknown: from the energy balance at the given pressure (wet turbine exhaust, valve outlet) */
  | { fromEnergyBalance: true; p_Pa: number; velocity_m_per_s?: number; elevation_m?: number }
  /** the port is at the dead state (T0, p0), e.g. combustion air drawn from the environment */
  | 'ambient';

/** How a port's mass flow is given [kg/s]. */
export type PortFlowInput =
  | number
  /** closes the mass balance of the port's group (at most one per group) */
  | 'mass-balance'
  /** closes the energy balance (at most one per unit) */
  | 'energy-balance'
  /** boiler air and flue gas: fuel flow times the combustion ratio from the measured O2 */
  | 'fuel-ratio';

/** A port as given to a balance function. */
export interface BalancePort {
  /** unique name of the port within the unit (used in labels, flags and results) */
  name: string;
  direction: 'in' | 'out';
  fluid: FluidSpec | Fluid;
  mDot_kg_per_s: PortFlowInput;
  /** measurements, an energy-balance placeholder, or 'ambient' */
  measured: PortStateInput;
  /** an already computed state (skips `measured`; the hourly engine passes memoised states) */
  state?: PortState;
  /** kind-specific role: hot/cold (heat exchanger), fuel/air/flue-gas/water/blowdown (boiler), ... */
  role?: string;
  /** mass-balance group (separate lines of one unit: hot/cold side, HP and reheat) */
  group?: string;
}

/** A port after resolution: flow and state known. */
export interface ResolvedPort {
  name: string;
  direction: 'in' | 'out';
  fluid: Fluid;
  mDot: number;
  state: PortState;
  role: string | undefined;
  group: string;
}

function isEnergyBalanceState(m: PortStateInput): m is { fromEnergyBalance: true; p_Pa: number; velocity_m_per_s?: number; elevation_m?: number } {
  return typeof m === 'object' && m !== null && (m as { fromEnergyBalance?: boolean }).fromEnergyBalance === true;
}

/** State of a port from its input (not from the energy balance). */
export function stateOfPort(port: BalancePort, fluid: Fluid, env: Environment): PortState | null {
  if (port.state) return port.state;
  const m = port.measured;
  if (m === 'ambient') return fluid.state({ p_Pa: env.p0_Pa, T_K: env.T0_K }, env);
  if (isEnergyBalanceState(m)) return null;
  return fluid.state(m, env);
}

/** Specific energy carried by a stream: h + V^2/2 + g z [J/kg]. */
function energyOf(st: PortState): number {
  return st.h + 0.5 * st.velocity_m_per_s * st.velocity_m_per_s + G_m_per_s2 * st.elevation_m;
}

export interface ResolveOptions {
  /** net power out of the volume [W] */
  work_W: number;
  /** net heat into the volume [W] */
  heat_W?: number;
  /** default group of ports without one */
  defaultGroup?: (p: BalancePort) => string;
  /** flows of 'fuel-ratio' ports, by port name [kg/s] */
  fuelRatioFlows?: Record<string, number>;
}

export interface Resolution {
  ports: ResolvedPort[];
  /**
   * For two or more outlets whose states come from the energy balance: their common isentropic
   * efficiency from the inlet state [-] (see resolvePorts); NaN otherwise.
   */
  commonExpansionEfficiency: number;
}

/**
 * Resolves the flows and states that come from the mass and energy balances.
 *
 * - 'mass-balance' flows close the mass balance of their group; a negative result is refused.
 * - One 'energy-balance' flow u: the energy residual is linear in u (its own flow and its group's
 *   mass-balance port), so u = -R(0) / (R(1) - R(0)).
 * - One state from the energy balance: its specific energy closes the energy balance exactly.
 * - Several outlet states from the energy balance (an extraction turbine with wet extractions and a wet
 *   exhaust; one equation, several unknowns): ASSUMPTION, all of them lie on one expansion line of
 *   common isentropic efficiency eta from the single inlet, h_j = h_in - eta (h_in - h_s,j(p_j)), with
 *   h_s,j at the inlet entropy; eta is the one value that closes the energy balance (linear, closed
 *   form). With one unknown outlet this is the plain energy balance h_out = h_in - W/mDot.
 *
 * @throws BalanceInputError for more than one unknown flow, an unknown flow together with unknown
 *   states, a negative derived flow, or an energy balance that cannot fix the unknown
 */
export function resolvePorts(ports: BalancePort[], env: Environment, opts: ResolveOptions): Resolution {
  const n = ports.length;
  const fluids: Fluid[] = new Array(n);
  const states: (PortState | null)[] = new Array(n);
  const groups: string[] = new Array(n);
  let flowUnknown = -1;
  let nUnknownStates = 0;
  for (let i = 0; i < n; i++) {
    const p = ports[i];
    for (let j = 0; j < i; j++) if (ports[j].name === p.name) throw new BalanceInputError('INVALID_MODEL', p.name, 'two ports have the same name');
    if (p.direction !== 'in' && p.direction !== 'out') {
      throw new BalanceInputError('INVALID_MODEL', p.name, `direction must be 'in' or 'out', got '${String(p.direction)}'`);
    }
    fluids[i] = fluidOf(p.fluid);
    states[i] = stateOfPort(p, fluids[i], env);
    if (states[i] === null) nUnknownStates++;
    groups[i] = p.group ?? (opts.defaultGroup ? opts.defaultGroup(p) : 'main');
    const f = p.mDot_kg_per_s;
    if (f === 'energy-balance') {
      if (flowUnknown >= 0) throw new BalanceInputError('INVALID_MODEL', p.name, `only one flow may come from the energy balance (also ${ports[flowUnknown].name})`);
      flowUnknown = i;
    } else if (typeof f === 'number') {
      requireInput(`${p.name}.mDot_kg_per_s`, f, 0, 1e6, 'kg/s', 'mass flow');
    } else if (f === 'fuel-ratio') {
      if (opts.fuelRatioFlows?.[p.name] === undefined) throw new BalanceInputError('INVALID_MODEL', p.name, "a 'fuel-ratio' flow exists only for boiler air and flue gas");
    } else if (f !== 'mass-balance') {
      throw new BalanceInputError('MISSING_INPUT', `${p.name}.mDot_kg_per_s`, `a flow, 'mass-balance', 'energy-balance' or 'fuel-ratio' is needed, got ${String(f)}`);
    }
  }
  if (flowUnknown >= 0 && nUnknownStates > 0) {
    throw new BalanceInputError('INVALID_MODEL', ports[flowUnknown].name, 'a flow and a state cannot both come from the one energy balance');
  }
  // Mass-balance port of each port's group (-1: none).
  const mbOf = new Int32Array(n).fill(-1);
  for (let i = 0; i < n; i++) {
    if (ports[i].mDot_kg_per_s !== 'mass-balance') continue;
    for (let j = 0; j < n; j++) {
      if (groups[j] !== groups[i]) continue;
      if (mbOf[j] >= 0 && mbOf[j] !== i) {
        throw new BalanceInputError('INVALID_MODEL', ports[i].name, `group '${groups[i]}' has two 'mass-balance' flows (also ${ports[mbOf[j]].name})`);
      }
      mbOf[j] = i;
    }
  }
  const flows = new Float64Array(n);
  let commonEta = NaN;
  if (flowUnknown >= 0) {
    fillFlows(ports, groups, mbOf, opts.fuelRatioFlows, 0, flows);
    const r0 = energyResidualOf(ports, states, flows, opts);
    fillFlows(ports, groups, mbOf, opts.fuelRatioFlows, 1, flows);
    const r1 = energyResidualOf(ports, states, flows, opts) - r0;
    if (!(Math.abs(r1) > 0)) throw new BalanceInputError('UNSOLVABLE', ports[flowUnknown].name, 'the energy balance does not depend on this flow');
    const u = -r0 / r1;
    if (!(u >= 0)) throw new BalanceInputError('IMPOSSIBLE_INPUT', `${ports[flowUnknown].name}.mDot_kg_per_s`, `the energy balance gives a negative flow (${u} kg/s)`);
    fillFlows(ports, groups, mbOf, opts.fuelRatioFlows, u, flows);
  } else {
    fillFlows(ports, groups, mbOf, opts.fuelRatioFlows, 0, flows);
  }
  for (let i = 0; i < n; i++) {
    if (!(flows[i] >= 0)) {
      throw new BalanceInputError('IMPOSSIBLE_INPUT', `${ports[i].name}.mDot_kg_per_s`, `the mass balance gives a negative flow (${flows[i]} kg/s)`);
    }
  }
  if (nUnknownStates === 1) {
    let j = 0;
    while (states[j] !== null) j++;
    const r = energyResidualOf(ports, states, flows, opts); // without port j
    if (!(flows[j] > 0)) throw new BalanceInputError('UNSOLVABLE', ports[j].name, 'a state from the energy balance needs a flow > 0');
    const e = (ports[j].direction === 'out' ? r : -r) / flows[j];
    states[j] = stateFromEnergy(ports[j], fluids[j], e, env);
  } else if (nUnknownStates > 1) {
    commonEta = solveCommonExpansion(ports, fluids, states, flows, env, energyResidualOf(ports, states, flows, opts));
  }
  const out: ResolvedPort[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const p = ports[i];
    out[i] = { name: p.name, direction: p.direction, fluid: fluids[i], mDot: flows[i], state: states[i]!, role: p.role, group: groups[i] };
  }
  return { ports: out, commonExpansionEfficiency: commonEta };
}

function fillFlows(
  ports: BalancePort[],
  groups: string[],
  mbOf: Int32Array,
  ratio: Record<string, number> | undefined,
  u: number,
  flows: Float64Array,
): void {
  const n = ports.length;
  for (let i = 0; i < n; i++) {
    const f = ports[i].mDot_kg_per_s;
    flows[i] = typeof f === 'number' ? f : f === 'energy-balance' ? u : f === 'fuel-ratio' ? ratio![ports[i].name] : 0;
  }
  for (let j = 0; j < n; j++) {
    if (mbOf[j] !== j) continue; // j is its group's mass-balance port
    let net = 0; // in - out over the others of the group
    for (let i = 0; i < n; i++) if (i !== j && groups[i] === groups[j]) net += ports[i].direction === 'in' ? flows[i] : -flows[i];
    flows[j] = ports[j].direction === 'out' ? net : -net;
  }
}

/** Q - W + sum_in m e - sum_out m e over the ports whose state is known [W]. */
function energyResidualOf(ports: BalancePort[], states: (PortState | null)[], flows: Float64Array, opts: ResolveOptions): number {
  let r = (opts.heat_W ?? 0) - opts.work_W;
  for (let i = 0; i < ports.length; i++) {
    const st = states[i];
    if (st) r += (ports[i].direction === 'in' ? 1 : -1) * flows[i] * energyOf(st);
  }
  return r;
}

/** Several unknown outlet states on one expansion line of common isentropic efficiency (see resolvePorts). */
function solveCommonExpansion(
  ports: BalancePort[],
  fluids: Fluid[],
  states: (PortState | null)[],
  flows: Float64Array,
  env: Environment,
  r: number,
): number {
  let inlet = -1;
  let nIn = 0;
  let first = -1;
  for (let i = 0; i < ports.length; i++) {
    if (ports[i].direction === 'in') {
      nIn++;
      inlet = i;
    }
    if (states[i] === null) {
      if (first < 0) first = i;
      if (ports[i].direction !== 'out') nIn = -99;
    }
  }
  if (nIn !== 1 || !states[inlet]) {
    throw new BalanceInputError('INVALID_MODEL', ports[first].name, 'several states from the energy balance need one inlet and unknown outlets only');
  }
  const inSt = states[inlet]!;
  const hs = new Float64Array(ports.length);
  let num = -r; // sum over unknown outlets of m_j e_j must equal r
  let den = 0;
  for (let j = 0; j < ports.length; j++) {
    if (states[j] !== null) continue;
    const m = ports[j].measured as { p_Pa: number; velocity_m_per_s?: number; elevation_m?: number };
    hs[j] = fluids[j].hIsentropic(m.p_Pa, inSt.s);
    const V = m.velocity_m_per_s ?? 0;
    num += flows[j] * (inSt.h + 0.5 * V * V + G_m_per_s2 * (m.elevation_m ?? 0));
    den += flows[j] * (inSt.h - hs[j]);
  }
  if (!(den > 0)) throw new BalanceInputError('UNSOLVABLE', ports[first].name, 'no isentropic enthalpy drop to the unknown outlets');
  const eta = num / den;
  for (let j = 0; j < ports.length; j++) {
    if (states[j] !== null) continue;
    const m = ports[j].measured as { p_Pa: number; velocity_m_per_s?: number; elevation_m?: number };
    const h = inSt.h - eta * (inSt.h - hs[j]);
    try {
      states[j] = fluids[j].statePH(m.p_Pa, h, env, m.velocity_m_per_s ?? 0, m.elevation_m ?? 0);
    } catch (err) {
      if (err instanceof BalanceInputError) throw err;
      throw new BalanceInputError('UNSOLVABLE', ports[j].name, `the expansion line gives h = ${h} J/kg at p = ${m.p_Pa} Pa, outside the property range (${(err as Error).message})`);
    }
  }
  return eta;
}

function stateFromEnergy(port: BalancePort, fluid: Fluid, e: number, env: Environment): PortState {
  const m = port.measured as { p_Pa: number; velocity_m_per_s?: number; elevation_m?: number };
  requireInput(`${port.name}.p_Pa`, m.p_Pa, 1, 1e8, 'Pa', 'pressure of a state from the energy balance');
  const V = m.velocity_m_per_s ?? 0;
  const z = m.elevation_m ?? 0;
  const h = e - 0.5 * V * V - G_m_per_s2 * z;
  try {
    return fluid.statePH(m.p_Pa, h, env, V, z);
  } catch (err) {
    if (err instanceof BalanceInputError) throw err;
    throw new BalanceInputError('UNSOLVABLE', port.name, `the energy balance gives h = ${h} J/kg at p = ${m.p_Pa} Pa, outside the property range (${(err as Error).message})`);
  }
}

/** A power flow of the balance: out of the volume positive [W]. */
export interface PowerFlow {
  label: string;
  power_W: number;
}

/** A heat flow of the balance: into the volume positive [W], at boundary temperature Tb [K]. */
export interface HeatFlow {
  label: string;
  Q_W: number;
  Tb_K: number;
}

export interface AssembleInput {
  kind: UnitKind;
  env: Environment;
  ports: ResolvedPort[];
  /** use physical + chemical exergy of streams (reacting units); else physical only */
  chemical: boolean;
  powers: PowerFlow[];
  heats: HeatFlow[];
  terms: UnitTerm[];
  /** false for dissipative units: product_W is null */
  hasProduct: boolean;
  /** energy throughput beyond the streams' h - h0 and power/heat in (fuel LHV) [W] */
  extraThroughput_W?: number;
  extras?: Record<string, number>;
  flags?: string[];
  /** the uncertainty sweep: F, P, L, D and efficiency only (no port records; flags as given) */
  lean?: boolean;
}

/** Exergy per kg carried by a resolved stream in a balance [J/kg]. */
export function streamExergy(p: ResolvedPort, chemical: boolean): number {
  return chemical ? p.state.psi + (p.state.eCh ?? 0) : p.state.psi;
}

/**
 * Runs `controlVolumeBalance` on the resolved ports, powers and heats, sums the role terms, and
 * builds the result. D is the balance's destruction; F - P - L equals it whenever every signed term
 * of the balance is given to exactly one role (the kinds here do so).
 *
 * Energy throughput (denominator of energyClosure_pct): sum over inlets of mDot max(0, h - h0), plus
 * power and heat into the volume, plus extraThroughput_W (fuel mDot LHV for a boiler).
 */
export function assemble(a: AssembleInput): UnitBalance {
  const T0 = a.env.T0_K;
  const np = a.ports.length;
  const streams: BalanceStream[] = new Array(np);
  for (let i = 0; i < np; i++) {
    const p = a.ports[i];
    streams[i] = {
      mDot_kg_per_s: p.mDot,
      h_J_per_kg: p.state.h,
      s_J_per_kgK: p.state.s,
      psi_J_per_kg: streamExergy(p, a.chemical),
      direction: p.direction,
      label: p.name,
      velocity_m_per_s: p.state.velocity_m_per_s,
      elevation_m: p.state.elevation_m,
    };
  }
  const cv = controlVolumeBalance({ T0_K: T0, streams, heat: a.heats, power_W: a.powers });
  let F = 0;
  let P = 0;
  let L = 0;
  for (const t of a.terms) {
    if (t.role === 'fuel') F += t.exergy_W;
    else if (t.role === 'product') P += t.exergy_W;
    else L += t.exergy_W;
  }
  let throughput = a.extraThroughput_W ?? 0;
  for (const p of a.ports) if (p.direction === 'in') throughput += p.mDot * Math.max(0, p.state.h - p.state.h0);
  for (const w of a.powers) if (w.power_W < 0) throughput -= w.power_W;
  for (const q of a.heats) if (q.Q_W > 0) throughput += q.Q_W;
  const flags = a.flags ?? [];
  const ports: UnitBalance['ports'] = {};
  if (!a.lean) {
    for (const p of a.ports) {
      ports[p.name] = { direction: p.direction, mDot_kg_per_s: p.mDot, state: p.state };
      for (const f of p.state.flags) flags.push(`${f}:${p.name}`);
    }
  }
  const D = cv.exergyDestroyed_W;
  if (D < -1e-9 * Math.max(Math.abs(F), 1)) flags.push('negative-destruction');
  return {
    kind: a.kind,
    fuel_W: F,
    product_W: a.hasProduct ? P : null,
    loss_W: L,
    destruction_W: D,
    efficiency: a.hasProduct && F > 0 ? P / F : null,
    entropyGeneration_W_per_K: cv.entropyGeneration_W_per_K,
    gouyStodolaResidual_W: cv.gouyStodolaGap_W,
    massResidual_kg_per_s: cv.massResidual_kg_per_s,
    energyResidual_W: cv.energyResidual_W,
    energyClosure_pct: throughput > 0 ? (100 * cv.energyResidual_W) / throughput : 0,
    terms: a.terms,
    extras: a.extras ?? {},
    flags,
    ports,
  };
}

/** Signed exergy of a resolved stream as seen by the volume: into it positive [W]. */
export function exergyInto(p: ResolvedPort, chemical: boolean): number {
  return (p.direction === 'in' ? 1 : -1) * p.mDot * streamExergy(p, chemical);
}
