/**
 * Resolution of a unit's ports before its balance: the flows and states that come from the mass or
 * energy balance rather than from measurements (see resolvePorts).
 *
 * Sign conventions as in docs/domain.md s.2: heat into the volume and work out of it positive.
 */
import { G_m_per_s2 } from '../thermo';
import type { BalancePort, PortStateInput, ResolvedPort } from './ports';
import { BalanceInputError, requireInput } from './errors';
import { fluidOf, type Environment, type Fluid, type PortState } from './fluids';
import { figures } from '../format';

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
  const scan = scanPorts(ports, env, opts);
  const flows = solveFlows(ports, scan, opts);
  const commonEta = solveStates(ports, scan, flows, env, opts);
  const { fluids, states, groups } = scan;
  const n = ports.length;
  const out: ResolvedPort[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const p = ports[i];
    out[i] = { name: p.name, direction: p.direction, fluid: fluids[i], mDot: flows[i], state: states[i]!, role: p.role, group: groups[i] };
  }
  return { ports: out, commonExpansionEfficiency: commonEta };
}

/** What the ports give before the balances: fluid, known state (null: from the energy balance), group. */
interface PortScan {
  fluids: Fluid[];
  states: (PortState | null)[];
  groups: string[];
  /** the port whose flow comes from the energy balance, or -1 */
  flowUnknown: number;
  nUnknownStates: number;
}

/** Checks each port's name, direction and flow input and takes its fluid, state and group. */
function scanPorts(ports: BalancePort[], env: Environment, opts: ResolveOptions): PortScan {
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
  return { fluids, states, groups, flowUnknown, nUnknownStates };
}

/** The mass-balance port of each port's group (-1: none); two in one group are refused. */
function massBalancePorts(ports: BalancePort[], groups: string[]): Int32Array {
  const n = ports.length;
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
  return mbOf;
}

/** Every port's flow: given, from the fuel ratio, the mass balance of its group or the energy balance. */
function solveFlows(ports: BalancePort[], scan: PortScan, opts: ResolveOptions): Float64Array {
  const { states, groups, flowUnknown } = scan;
  const n = ports.length;
  const mbOf = massBalancePorts(ports, groups);
  const flows = new Float64Array(n);
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
  return flows;
}

/**
 * Fills in the states that come from the energy balance (scan.states, in place); returns the common
 * expansion efficiency when several do, else NaN.
 */
function solveStates(ports: BalancePort[], scan: PortScan, flows: Float64Array, env: Environment, opts: ResolveOptions): number {
  const { fluids, states, nUnknownStates } = scan;
  if (nUnknownStates === 1) {
    let j = 0;
    while (states[j] !== null) j++;
    const r = energyResidualOf(ports, states, flows, opts); // without port j
    if (!(flows[j] > 0)) throw new BalanceInputError('UNSOLVABLE', ports[j].name, 'a state from the energy balance needs a flow > 0');
    const e = (ports[j].direction === 'out' ? r : -r) / flows[j];
    states[j] = stateFromEnergy(ports[j], fluids[j], e, env);
  } else if (nUnknownStates > 1) {
    return solveCommonExpansion(ports, fluids, states, flows, env, energyResidualOf(ports, states, flows, opts));
  }
  return NaN;
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
      throw new BalanceInputError('UNSOLVABLE', ports[j].name, `the expansion line gives h = ${figures(h / 1e3, 6)} kJ/kg at p = ${figures(m.p_Pa, 6)} Pa, outside the property range (${(err as Error).message})`);
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
    throw new BalanceInputError('UNSOLVABLE', port.name, `the energy balance gives h = ${figures(h / 1e3, 6)} kJ/kg at p = ${figures(m.p_Pa, 6)} Pa, outside the property range (${(err as Error).message})`);
  }
}
