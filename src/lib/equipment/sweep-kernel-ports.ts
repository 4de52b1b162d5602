/**
 * The port layout of a sweep kernel (./sweep-kernel.ts), worked out once when the kernel is compiled:
 * which kinds it covers, each port's role in the SPECO split and its mass-balance group, and where
 * each port's inputs stand in the sweep's vector. Nothing here runs per move.
 * @see ./kinds.ts (the SPECO split per kind), ./balance.ts resolvePorts
 */
import type { BalanceKind as UnitKind } from '../kinds';
import { fuelSpecOf, prepareFluid, type Fluid, type FluidSpec, type PortMeasurement, type PortState } from './fluids';
import type { PortSpec, UnitModel } from './model';
import type { Mutable } from './sweep-states';

/** Role of a port's exergy in the split: 0 fuel (exergy into the volume), 1 product, 2 loss (out of it). */
export type Role = 0 | 1 | 2;

export interface KPort {
  name: string;
  sign: 1 | -1;
  fluid: Fluid;
  mode: 'pT' | 'px' | 'ph' | 'sat' | 'ambient' | 'energy-balance';
  flow: 'measured' | 'mass-balance' | 'energy-balance' | 'fuel-ratio';
  iM: number;
  iP: number;
  iV: number;
  iO2: number;
  fixedX: number;
  V: number;
  z: number;
  role: Role;
  /** the port's role as the model names it */
  specRole: string | undefined;
  /** index of its group's mass-balance port, -1 none */
  mb: number;
  group: number;
  /** a reusable measurement for a moved state */
  m: PortMeasurement;
  /** the hour's point: state inputs and state */
  p0: number;
  v0: number;
  o0: number;
  st0: PortState | null;
  /** a moved water (p, T) state, overwritten by the next move */
  scratch?: Mutable<PortState>;
}

export const TURBINES = new Set<UnitKind>(['turbine', 'expander']);
export const COMPRESSORS = new Set<UnitKind>(['compressor', 'pump', 'fan']);
export const COVERED = new Set<UnitKind>([...TURBINES, ...COMPRESSORS, 'heat-exchanger', 'boiler', 'valve', 'condenser', 'cooler', 'generic']);

export function roleOf(kind: UnitKind, s: PortSpec): Role {
  if (TURBINES.has(kind) || kind === 'valve') return 0;
  if (COMPRESSORS.has(kind)) return 1;
  if (kind === 'heat-exchanger') return s.role === 'hot' ? 0 : 1;
  if (kind === 'condenser' || kind === 'cooler') return s.role === 'process' ? 0 : 2;
  if (kind === 'boiler') return s.role === 'fuel' || s.role === 'air' ? 0 : s.role === 'water' ? 1 : 2;
  return s.role === 'fuel' ? 0 : s.role === 'product' ? 1 : 2;
}

export function groupName(kind: UnitKind, s: PortSpec): string {
  if (s.group) return s.group;
  if (kind === 'heat-exchanger' || kind === 'condenser' || kind === 'cooler') return s.role ?? 'main';
  if (kind === 'boiler') return s.role === 'water' || s.role === 'blowdown' ? 'water' : 'gas';
  return 'main';
}

/** The ports of the kernel, with the boiler's ambient air port appended when the model has none. */
export function kernelPorts(kind: UnitKind, model: UnitModel, names: readonly string[], fluids?: ReadonlyMap<string, Fluid>): KPort[] | null {
  const specs = [...(model.ports ?? [])];
  const fuelSpec = kind === 'boiler' ? specs.find((p) => p.role === 'fuel') : undefined;
  if (kind === 'boiler' && !specs.some((p) => p.role === 'air')) {
    const flue = specs.find((p) => p.role === 'flue-gas');
    if (!flue || flue.fluid.kind !== 'flue-gas') return null;
    specs.push({ name: 'air', direction: 'in', role: 'air', fluid: { kind: 'air', humidity: flue.fluid.air }, flow: 'fuel-ratio', state: 'ambient' });
  }
  const ix = (n: string) => names.indexOf(n);
  const groups = specs.map((s) => groupName(kind, s));
  const ports: KPort[] = [];
  for (const s of specs) {
    const state = s.state ?? 'pT';
    if (state === 'px' || state === 'ph' || state === 'pT' || state === 'ambient' || state === 'energy-balance' || state === 'sat-liquid' || state === 'sat-vapour') {
      const fluid = fluids?.get(s.name) ?? prepareFluid(s.fluid, fuelSpec ? fuelSpecOf(fuelSpec.fluid as FluidSpec) : undefined);
      const iV = state === 'pT' ? ix(`${s.name}.T_K`) : state === 'px' ? ix(`${s.name}.x`) : state === 'ph' ? ix(`${s.name}.h_J_per_kg`) : -1;
      const V = s.velocity_m_per_s ?? 0;
      const z = s.elevation_m ?? 0;
      ports.push({
        name: s.name, sign: s.direction === 'in' ? 1 : -1, fluid,
        mode: state === 'sat-liquid' || state === 'sat-vapour' ? 'sat' : state,
        flow: s.flow ?? 'measured', iM: ix(`${s.name}.mDot_kg_per_s`), iP: ix(`${s.name}.p_Pa`), iV,
        iO2: fluid.family === 'flue-gas' ? ix(`${s.name}.O2_fraction`) : -1,
        fixedX: state === 'sat-liquid' ? 0 : state === 'sat-vapour' ? 1 : NaN, V, z, role: roleOf(kind, s), specRole: s.role, mb: -1,
        group: groups.indexOf(groups[ports.length]!), m: { velocity_m_per_s: V, elevation_m: z }, p0: NaN, v0: 0, o0: 0, st0: null,
      });
    } else return null;
  }
  for (let i = 0; i < ports.length; i++) if (ports[i]!.flow === 'mass-balance') for (const q of ports) if (q.group === ports[i]!.group) q.mb = i;
  return ports;
}
