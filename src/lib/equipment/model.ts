/**
 * A unit's balance as one pure function of a flat vector of measurements, so that uncertainty can be
 * propagated through the whole calculation (port states, combustion, mass and energy balances,
 * fuel/product split) by central differences (JCGM 100:2008, GUM 5.1.3 and 5.1.2 eq. 10).
 *
 * The model (`UnitModel`, plain JSON-safe data) says which ports a unit has, which fluid each carries
 * and how its state and flow are known; `inputNames(kind, model)` lists the vector's entries, all in SI,
 * in this fixed order:
 *
 *   0 'T0_K'  [K]      dead-state temperature
 *   1 'p0_Pa' [Pa]     dead-state pressure
 *   then per port, in model order:
 *     '<port>.mDot_kg_per_s' [kg/s]  when flow is 'measured' (the default)
 *     '<port>.p_Pa' [Pa]             for states 'pT', 'px', 'ph', 'sat-liquid', 'sat-vapour', 'energy-balance'
 *     '<port>.T_K' [K] ('pT') | '<port>.x' [-] ('px') | '<port>.h_J_per_kg' [J/kg] ('ph')
 *     '<port>.O2_fraction' [-]       flue-gas ports (on the fluid's o2Basis)
 *   then per kind:
 *     turbine, expander:            'power_W' [W], and 'generatorEfficiency' [-] if powerMeasured is 'electric'
 *     compressor, pump, fan:        'power_W' [W], and 'motorEfficiency' [-] if powerMeasured is 'electric'
 *     motor, generator:             'powerIn_W' [W], 'powerOut_W' [W]
 *     generic:                      '<power>.power_W' [W] per power, '<heat>.Q_W' [W] and '<heat>.Tb_K' [K] per heat
 *
 * Efficiencies are vector entries (not constants) so their uncertainty propagates too.
 * @see JCGM 100:2008 (GUM) 5.1.2, 5.1.3, 6.2-6.3; docs/domain.md s.7
 */
import { BALANCE_KINDS as UNIT_KINDS, type BalanceKind as UnitKind } from '../kinds';
import type { BalancePort, TermRole, UnitBalance } from './balance';
import { BalanceInputError } from './errors';
import { StateMemo } from './fluid-common';
import { fuelSpecOf, prepareFluid, type Environment, type Fluid, type FluidSpec, type PortMeasurement, type PortState } from './fluids';
import {
  boilerBalance,
  checkEnv,
  compressorBalance,
  condenserBalance,
  genericBalance,
  heatExchangerBalance,
  machineBalance,
  mixerBalance,
  turbineBalance,
  valveBalance,
} from './kinds';

/** How a port's state is known. */
export type PortStateMode = 'pT' | 'px' | 'ph' | 'sat-liquid' | 'sat-vapour' | 'ambient' | 'energy-balance';
/** How a port's mass flow is known. */
export type PortFlowMode = 'measured' | 'mass-balance' | 'energy-balance' | 'fuel-ratio';

/** A port of a unit model (plain data). */
export interface PortSpec {
  /** unique within the unit; prefixes the port's vector entries */
  name: string;
  direction: 'in' | 'out';
  fluid: FluidSpec;
  /** kind-specific role (see the balance functions) */
  role?: string;
  /** mass-balance group (defaults per kind) */
  group?: string;
  /** default 'pT' */
  state?: PortStateMode;
  /** default 'measured' */
  flow?: PortFlowMode;
  /** constant velocity [m/s] and elevation [m] of the port (kinetic and potential exergy), default 0 */
  velocity_m_per_s?: number;
  elevation_m?: number;
}

/** A power or heat term of a generic control volume (its values are vector entries). */
export interface GenericTermSpec {
  name: string;
  role: TermRole;
  /** power: 'out' of the volume or 'in'; heat: 'in' to the volume or 'out' */
  direction: 'in' | 'out';
}

/** A unit model: ports and the kind's parameters (plain data). */
export interface UnitModel {
  ports?: PortSpec[];
  /** turbine and compressor family: what the power meter measures, default 'shaft' */
  powerMeasured?: 'shaft' | 'electric';
  /** heat exchanger: 'refuse' (default) or 'flag' streams below T0 */
  belowDeadState?: 'refuse' | 'flag';
  /** generic: include chemical exergy */
  chemical?: boolean;
  /** generic: powers and heats */
  powers?: GenericTermSpec[];
  heats?: GenericTermSpec[];
}

const TURBINES = new Set<UnitKind>(['turbine', 'expander']);
const COMPRESSORS = new Set<UnitKind>(['compressor', 'pump', 'fan']);
const MACHINES = new Set<UnitKind>(['motor', 'generator']);

/** Index of an entry, or -1. */
interface CompiledPort {
  spec: PortSpec;
  fluid: Fluid;
  iM: number;
  iP: number;
  iV: number;
  iO2: number;
  fixedX: number;
  memo: StateMemo;
}

/** A unit model compiled for fast repeated evaluation. */
export interface CompiledUnit {
  readonly kind: UnitKind;
  readonly model: UnitModel;
  /** names of the vector entries, in order (see the module comment) */
  readonly names: readonly string[];
  /**
   * the balance at x (SI, in the order of names); lean = true skips companion figures (isentropic
   * efficiency ...) that F, P, L and D do not need (the uncertainty sweep); isentropic = false (default
   * !lean) skips only the isentropic companions (h(p, s) calls), keeping port records and flags
   */
  evaluate(x: ArrayLike<number>, lean?: boolean, isentropic?: boolean): UnitBalance;
  /** the prepared fluid of each port by name (the sweep kernel shares them, and so their memos) */
  readonly fluids: ReadonlyMap<string, Fluid>;
}

function kindOk(kind: UnitKind): void {
  if (!UNIT_KINDS.includes(kind)) throw new BalanceInputError('INVALID_MODEL', 'kind', `unknown unit kind '${kind}' (one of ${UNIT_KINDS.join(', ')})`);
}

/** The vector's entry names, built in the order of the module comment; `add` refuses a name twice. */
class Layout {
  readonly names: string[] = ['T0_K', 'p0_Pa'];
  add(n: string): number {
    if (this.names.includes(n)) throw new BalanceInputError('INVALID_MODEL', n, 'two vector entries have this name (port names must be unique)');
    this.names.push(n);
    return this.names.length - 1;
  }
}

/** The entries of a kind's own terms: power and efficiency, a machine's powers in and out, a generic volume's powers and heats (-1: none). */
interface CompiledTerms {
  iPower: number;
  iEta: number;
  iIn: number;
  iOut: number;
  powers: { spec: GenericTermSpec; i: number }[];
  heats: { spec: GenericTermSpec; iQ: number; iT: number }[];
}

/**
 * Compiles a unit model: prepares fluids, fixes the vector layout, and memoises port states so that
 * a central-difference sweep recomputes only the ports an input touches.
 * @throws BalanceInputError for an unknown kind, duplicate names or a state mode the fluid cannot take
 */
export function compileUnit(kind: UnitKind, model: UnitModel): CompiledUnit {
  kindOk(kind);
  const layout = new Layout();
  const portSpecs = model.ports ?? [];
  if (MACHINES.has(kind) && portSpecs.length) throw new BalanceInputError('INVALID_MODEL', 'ports', `a ${kind} has no ports, only powerIn_W and powerOut_W`);
  const fuelPortSpec = kind === 'boiler' ? portSpecs.find((p) => p.role === 'fuel') : undefined;
  const fuelOfFlueGas = fuelPortSpec ? fuelSpecOf(fuelPortSpec.fluid) : undefined;
  const ports = portSpecs.map((spec) => compilePort(spec, fuelOfFlueGas, layout));
  const terms = compileTerms(kind, model, layout);
  const names = layout.names;
  const evaluate = (x: ArrayLike<number>, lean = false, isentropic = !lean): UnitBalance => {
    checkVector(kind, names, x);
    return runBalance(kind, model, ports, terms, x, !lean, isentropic);
  };
  return { kind, model, names: Object.freeze(names), evaluate, fluids: new Map(ports.map((p) => [p.spec.name, p.fluid])) };
}

/** One port: its prepared fluid and its entries (flow, pressure, the state's second property, O2) by its modes. */
function compilePort(spec: PortSpec, fuelOfFlueGas: ReturnType<typeof fuelSpecOf>, layout: Layout): CompiledPort {
  const mode = spec.state ?? 'pT';
  const flow = spec.flow ?? 'measured';
  const fluid = prepareFluid(spec.fluid, fuelOfFlueGas);
  const cp: CompiledPort = { spec, fluid, iM: -1, iP: -1, iV: -1, iO2: -1, fixedX: NaN, memo: new StateMemo() };
  if (!['measured', 'mass-balance', 'energy-balance', 'fuel-ratio'].includes(flow)) {
    throw new BalanceInputError('INVALID_MODEL', `${spec.name}.flow`, `unknown flow mode '${flow}'`);
  }
  if (flow === 'measured') cp.iM = layout.add(`${spec.name}.mDot_kg_per_s`);
  if (fluid.family === 'condensed-fuel' && mode !== 'ambient') {
    throw new BalanceInputError('INVALID_MODEL', `${spec.name}.state`, "a condensed fuel is taken at the dead state: use state 'ambient'");
  }
  if (['px', 'sat-liquid', 'sat-vapour'].includes(mode) && fluid.family !== 'water') {
    throw new BalanceInputError('INVALID_MODEL', `${spec.name}.state`, `state '${mode}' applies to water only`);
  }
  switch (mode) {
    case 'pT':
      cp.iP = layout.add(`${spec.name}.p_Pa`);
      cp.iV = layout.add(`${spec.name}.T_K`);
      break;
    case 'px':
      cp.iP = layout.add(`${spec.name}.p_Pa`);
      cp.iV = layout.add(`${spec.name}.x`);
      break;
    case 'ph':
      cp.iP = layout.add(`${spec.name}.p_Pa`);
      cp.iV = layout.add(`${spec.name}.h_J_per_kg`);
      break;
    case 'sat-liquid':
    case 'sat-vapour':
      cp.iP = layout.add(`${spec.name}.p_Pa`);
      cp.fixedX = mode === 'sat-liquid' ? 0 : 1;
      break;
    case 'energy-balance':
      cp.iP = layout.add(`${spec.name}.p_Pa`);
      break;
    case 'ambient':
      break;
    default:
      throw new BalanceInputError('INVALID_MODEL', `${spec.name}.state`, `unknown state mode '${mode}'`);
  }
  if (fluid.family === 'flue-gas') cp.iO2 = layout.add(`${spec.name}.O2_fraction`);
  return cp;
}

/** The kind's own entries after the ports' (see the module comment). */
function compileTerms(kind: UnitKind, model: UnitModel, layout: Layout): CompiledTerms {
  const t: CompiledTerms = { iPower: -1, iEta: -1, iIn: -1, iOut: -1, powers: [], heats: [] };
  if (TURBINES.has(kind) || COMPRESSORS.has(kind)) {
    t.iPower = layout.add('power_W');
    if (model.powerMeasured === 'electric') t.iEta = layout.add(TURBINES.has(kind) ? 'generatorEfficiency' : 'motorEfficiency');
  } else if (MACHINES.has(kind)) {
    t.iIn = layout.add('powerIn_W');
    t.iOut = layout.add('powerOut_W');
  }
  t.powers = (model.powers ?? []).map((w) => ({ spec: w, i: layout.add(`${w.name}.power_W`) }));
  t.heats = (model.heats ?? []).map((q) => ({ spec: q, iQ: layout.add(`${q.name}.Q_W`), iT: layout.add(`${q.name}.Tb_K`) }));
  if (kind !== 'generic' && (t.powers.length || t.heats.length)) {
    throw new BalanceInputError('INVALID_MODEL', 'powers', 'powers and heats are entries of a generic control volume only');
  }
  return t;
}

/** A vector of the layout's length with every entry finite, or the error naming the entry. */
function checkVector(kind: UnitKind, names: readonly string[], x: ArrayLike<number>): void {
  const nIn = names.length;
  if (x.length !== nIn) throw new BalanceInputError('INVALID_MODEL', 'x', `the ${kind} model has ${nIn} inputs (${names.join(', ')}), got ${x.length}`);
  for (let i = 0; i < nIn; i++) {
    if (!Number.isFinite(x[i])) throw new BalanceInputError(Number.isNaN(x[i]) ? 'MISSING_INPUT' : 'IMPOSSIBLE_INPUT', names[i], `needs a finite value, got ${x[i]}`);
  }
}

/** The ports at x: each one's measurements and its state (memoised per port), or its pressure alone for an energy-balance state. */
function portsAt(ports: readonly CompiledPort[], x: ArrayLike<number>, env: Environment): BalancePort[] {
  const out: BalancePort[] = new Array(ports.length);
  for (let k = 0; k < ports.length; k++) {
    const cp = ports[k];
    const spec = cp.spec;
    const mode = spec.state ?? 'pT';
    const flow = spec.flow ?? 'measured';
    const V = spec.velocity_m_per_s ?? 0;
    const z = spec.elevation_m ?? 0;
    const mDot = cp.iM >= 0 ? x[cp.iM] : (flow as 'mass-balance' | 'energy-balance' | 'fuel-ratio');
    const O2 = cp.iO2 >= 0 ? x[cp.iO2] : 0; // memo keys must not be NaN (NaN !== NaN)
    let measured: BalancePort['measured'];
    let state: PortState | undefined;
    if (mode === 'energy-balance') {
      measured = { fromEnergyBalance: true, p_Pa: x[cp.iP], velocity_m_per_s: V, elevation_m: z };
    } else {
      const m: PortMeasurement = { velocity_m_per_s: V, elevation_m: z };
      let p: number;
      let v = 0;
      if (mode === 'ambient') {
        p = env.p0_Pa;
        m.T_K = env.T0_K;
      } else {
        p = x[cp.iP];
        if (mode === 'pT') m.T_K = v = x[cp.iV];
        else if (mode === 'px') m.x = v = x[cp.iV];
        else if (mode === 'ph') m.h_J_per_kg = v = x[cp.iV];
        else m.x = v = cp.fixedX;
      }
      m.p_Pa = p;
      if (cp.iO2 >= 0) m.O2_fraction = O2;
      measured = m;
      const fl = cp.fluid;
      state = cp.memo.find(p, v, O2, env.T0_K, env.p0_Pa) ?? cp.memo.put(p, v, O2, env.T0_K, env.p0_Pa, fl.state(m, env));
    }
    out[k] = { name: spec.name, direction: spec.direction, fluid: cp.fluid, mDot_kg_per_s: mDot, measured, state, role: spec.role, group: spec.group };
  }
  return out;
}

/** A generic volume's powers at x, positive out of the volume [W]. */
function genericPowers(powers: CompiledTerms['powers'], x: ArrayLike<number>) {
  const out = new Array(powers.length);
  for (let k = 0; k < powers.length; k++) {
    const { spec, i } = powers[k];
    out[k] = { label: spec.name, role: spec.role, power_W: spec.direction === 'out' ? x[i] : -x[i] };
  }
  return out;
}

/** A generic volume's heats at x, positive into the volume [W], with their boundary temperatures [K]. */
function genericHeats(heats: CompiledTerms['heats'], x: ArrayLike<number>) {
  const out = new Array(heats.length);
  for (let k = 0; k < heats.length; k++) {
    const { spec, iQ, iT } = heats[k];
    out[k] = { label: spec.name, role: spec.role, Q_W: spec.direction === 'in' ? x[iQ] : -x[iQ], Tb_K: x[iT] };
  }
  return out;
}

/** The kind's balance at a checked vector x. */
function runBalance(kind: UnitKind, model: UnitModel, ports: readonly CompiledPort[], t: CompiledTerms, x: ArrayLike<number>, companions: boolean, isentropic: boolean): UnitBalance {
  const env: Environment = { T0_K: x[0], p0_Pa: x[1] };
  checkEnv(env);
  if (MACHINES.has(kind)) return machineBalance({ env, powerIn_W: x[t.iIn], powerOut_W: x[t.iOut], kind: kind as 'motor' | 'generator' });
  const bp = portsAt(ports, x, env);
  if (TURBINES.has(kind)) {
    return turbineBalance({ env, ports: bp, companions, isentropic, power_W: x[t.iPower], powerMeasured: model.powerMeasured, generatorEfficiency: t.iEta >= 0 ? x[t.iEta] : undefined, kind: kind as 'turbine' });
  }
  if (COMPRESSORS.has(kind)) {
    return compressorBalance({ env, ports: bp, companions, isentropic, power_W: x[t.iPower], powerMeasured: model.powerMeasured, motorEfficiency: t.iEta >= 0 ? x[t.iEta] : undefined, kind: kind as 'pump' });
  }
  switch (kind) {
    case 'heat-exchanger':
      return heatExchangerBalance({ env, ports: bp, companions, belowDeadState: model.belowDeadState });
    case 'boiler':
      return boilerBalance({ env, ports: bp, companions });
    case 'valve':
      return valveBalance({ env, ports: bp, companions });
    case 'mixer':
    case 'deaerator':
    case 'open-feedwater-heater':
      return mixerBalance({ env, ports: bp, companions, kind });
    case 'condenser':
    case 'cooler':
      return condenserBalance({ env, ports: bp, companions, kind });
    default:
      return genericBalance({ env, ports: bp, companions, chemical: model.chemical, powers: genericPowers(t.powers, x), heats: genericHeats(t.heats, x) });
  }
}

const compiled = new WeakMap<UnitModel, Map<UnitKind, CompiledUnit>>();

/**
 * The compiled form of (kind, model), memoised per model object: keep one model object per unit and
 * model version (and do not mutate it), so that fluids are prepared and port states memoised once.
 */
export function compiledUnit(kind: UnitKind, model: UnitModel): CompiledUnit {
  let byKind = compiled.get(model);
  if (!byKind) {
    byKind = new Map();
    compiled.set(model, byKind);
  }
  let c = byKind.get(kind);
  if (!c) {
    c = compileUnit(kind, model);
    byKind.set(kind, c);
  }
  return c;
}

/**
 * Names of the input vector of a unit, in order (see the module comment for units).
 * @throws BalanceInputError for an invalid model
 */
export function inputNames(kind: UnitKind, model: UnitModel): readonly string[] {
  return compiledUnit(kind, model).names;
}

/**
 * Builds the input vector from named values.
 * @param values SI values by input name (see inputNames)
 * @throws BalanceInputError('MISSING_INPUT') naming the first absent entry
 */
export function inputVector(kind: UnitKind, model: UnitModel, values: Readonly<Record<string, number>>): Float64Array {
  const names = inputNames(kind, model);
  const x = new Float64Array(names.length);
  names.forEach((n, i) => {
    const v = values[n];
    if (v === undefined) throw new BalanceInputError('MISSING_INPUT', n, `no value given (the ${kind} model needs ${names.join(', ')})`);
    x[i] = v;
  });
  return x;
}

/**
 * The balance of one unit for one hour, as a pure function of the flat input vector.
 * @param kind unit kind
 * @param model the unit model (compiled once per object and memoised)
 * @param measurements SI values in the order of inputNames(kind, model)
 * @param options isentropic: false skips the isentropic companions (default true)
 * @returns the UnitBalance
 * @throws BalanceInputError for missing or impossible inputs; ThermoRangeError outside property ranges
 * @see docs/domain.md s.3
 */
export function evaluateUnitHour(kind: UnitKind, model: UnitModel, measurements: ArrayLike<number>, options: { isentropic?: boolean } = {}): UnitBalance {
  return compiledUnit(kind, model).evaluate(measurements, false, options.isentropic ?? true);
}
