/**
 * Plans one matter port of a unit for an hour: its fluid, how its state and its flow are known, with
 * its vector entries (see map.ts for what is decided); and the catalogue's required links missing.
 */
import { SATURATION_TOLERANCE_K, type PortSpec } from '../equipment';
import { FLUID_SHORT_LABELS, type FluidKind } from '../kinds';
import { kindSpec, measurementsFor } from '../plant/kinds';
import { flowEntry, fluidSpecOf, fromLink, isCondensed, linkAt, put, reading, tsat, type Ctx } from './map-port';
import type { EngineLink, EnginePort, EngineReason, EngineUnit } from './types';
import { fixed, upTo } from '../format';

export interface PortOptions {
  direction: 'in' | 'out';
  role?: string;
  group?: string;
  /** may take its state from the energy balance when not clearly superheated */
  wetFromEnergy?: boolean;
  /** without p and T: the dead state ('ambient') */
  ambientDefault?: boolean;
  /** without T: saturated liquid at its pressure (or at the pressure of copyP) */
  satLiquidDefault?: { copyP?: string };
  /** without T: saturated vapour at its pressure (or at the pressure of copyP) */
  satVapourDefault?: { copyP?: string };
  /** without p: the site's atmospheric pressure */
  pFromAtmosphere?: boolean;
  /** flow when none is linked */
  flowDefault?: 'mass-balance' | 'fuel-ratio' | 'energy-balance' | 'none';
  /** flow: ignore any link and use this */
  flowForced?: 'fuel-ratio';
  o2Basis?: 'dry' | 'wet';
  /** a flue-gas port: its O2 entry from this link */
  o2Link?: EngineLink;
}

/**
 * Plans one matter port: fluid, state mode and flow mode, with its vector entries. Returns the
 * equipment PortSpec (null when the port cannot be modelled; a problem says why).
 */
export function planPort(ctx: Ctx, port: EnginePort, o: PortOptions): PortSpec | null {
  const o2 = o.o2Link ?? linkAt(ctx, port.name, 'o2Fraction');
  const fluid = fluidSpecOf(ctx, port, o.o2Basis ?? o2?.basis ?? 'dry');
  if (!fluid) return null;
  const spec: PortSpec = { name: port.name, direction: o.direction, fluid };
  if (o.role) spec.role = o.role;
  if (o.group) spec.group = o.group;
  const state = planState(ctx, port, o, fluid);
  if (!state) return null;
  spec.state = state.mode;
  if (fluid.kind === 'flue-gas') {
    if (!o2) {
      ctx.problems.push({ code: 'LINK_MISSING', message: `${port.name}: no O2 fraction linked` });
      return null;
    }
    fromLink(ctx, `${port.name}.O2_fraction`, o2);
  }
  const flow = planFlow(ctx, port, o, state);
  if (!flow) return null;
  spec.flow = flow.mode;
  ctx.plans.push({ name: port.name, slot: port.slot, direction: o.direction, fluid: FLUID_SHORT_LABELS[port.fluid!.kind], state: state.words, flow: flow.words });
  return spec;
}

/** How a port's state is known this hour, in words, with the p [Pa] and T [K] read (NaN when not read). */
interface StatePlan {
  mode: NonNullable<PortSpec['state']>;
  words: string;
  p: number;
  T: number;
}

/** The port's state: the dead state, or its pressure and a second property (x, T, saturation or the energy balance). Null: a link is missing (a problem says which). */
function planState(ctx: Ctx, port: EnginePort, o: PortOptions, fluid: NonNullable<PortSpec['fluid']>): StatePlan | null {
  const pL = linkAt(ctx, port.name, 'pressure');
  const TL = linkAt(ctx, port.name, 'temperature');
  if (fluid.kind === 'fuel' && isCondensed(ctx.unit.fuel, fluid)) return { mode: 'ambient', words: 'at the dead state (a condensed fuel)', p: NaN, T: NaN };
  if (o.ambientDefault && !(pL && TL)) {
    const words = pL || TL ? 'at the dead state (p and T are both needed to use them)' : 'at the dead state (no p and T linked)';
    return { mode: 'ambient', words, p: NaN, T: NaN };
  }
  const pName = `${port.name}.p_Pa`;
  const p = planPressure(ctx, port, o, pL);
  if (p === null) return null;
  const isWater = fluid.kind === 'water';
  const xL = isWater ? linkAt(ctx, port.name, 'vapourFraction') : undefined;
  if (xL) {
    fromLink(ctx, `${port.name}.x`, xL);
    return { mode: 'px', words: 'p and vapour fraction x', p, T: NaN };
  }
  if (TL) {
    const Tmean = reading(ctx, TL).value;
    const Ts = isWater ? tsat(p) : NaN;
    const wet = isWater && Number.isFinite(Ts) && Number.isFinite(Tmean) && Tmean - Ts <= SATURATION_TOLERANCE_K;
    if (o.wetFromEnergy) ctx.decisions.push({ pName, TL, water: isWater, fromEnergy: wet || !Number.isFinite(Tmean) });
    if (o.wetFromEnergy && (wet || !Number.isFinite(Tmean))) {
      const words = Number.isFinite(Tmean)
        ? `from the energy balance: T = ${fixed(Tmean - 273.15, 1)} degC is within ${upTo(SATURATION_TOLERANCE_K, 3)} K of saturation (${fixed(Ts - 273.15, 1)} degC), so p and T do not fix the state`
        : 'from the energy balance (no temperature reading this hour)';
      return { mode: 'energy-balance', words, p, T: NaN };
    }
    return { mode: 'pT', words: 'p and T', p, T: fromLink(ctx, `${port.name}.T_K`, TL) };
  }
  if (o.wetFromEnergy) return { mode: 'energy-balance', words: 'from the energy balance (no temperature linked)', p, T: NaN };
  if (o.satLiquidDefault) return { mode: 'sat-liquid', words: 'saturated liquid at p (no temperature linked)', p, T: NaN };
  if (o.satVapourDefault) return { mode: 'sat-vapour', words: 'saturated vapour at p (no temperature linked)', p, T: NaN };
  ctx.problems.push({ code: 'LINK_MISSING', message: `${port.name}: no temperature linked` });
  return null;
}

/** The port's pressure entry [Pa]: linked, the site's atmosphere, or copied from the port it leaves from. Null: none linked (a problem says so). */
function planPressure(ctx: Ctx, port: EnginePort, o: PortOptions, pL: ReturnType<typeof linkAt>): number | null {
  const pName = `${port.name}.p_Pa`;
  if (pL) return fromLink(ctx, pName, pL);
  if (o.pFromAtmosphere) {
    put(ctx, pName, ctx.p_atm_Pa, 0, { kind: 'site', what: "atmospheric pressure (no pressure linked)" });
    return ctx.p_atm_Pa;
  }
  const copyP = o.satLiquidDefault?.copyP ?? o.satVapourDefault?.copyP;
  if ((o.satLiquidDefault?.copyP || o.satVapourDefault?.copyP) && ctx.entries.has(`${copyP}.p_Pa`)) {
    const from = `${copyP}.p_Pa`;
    const src = ctx.entries.get(from)!;
    put(ctx, pName, src.value, src.u, { kind: 'copy', of: from, note: 'no pressure linked: the pressure of the port it leaves from' });
    return src.value;
  }
  ctx.problems.push({ code: 'LINK_MISSING', message: `${port.name}: no pressure linked` });
  return null;
}

/** How the port's mass flow is known: forced by the kind, linked, or the kind's default balance. Null: none linked (a problem says so). */
function planFlow(ctx: Ctx, port: EnginePort, o: PortOptions, state: StatePlan): { mode: NonNullable<PortSpec['flow']>; words: string } | null {
  if (o.flowForced) return { mode: o.flowForced, words: 'from the fuel flow and the measured O2 (combustion balance)' };
  const fL = linkAt(ctx, port.name, 'massFlow', 'volumeFlow', 'standardVolumeFlow');
  if (fL) {
    flowEntry(ctx, port, fL, { p: state.p, T: state.T });
    const words = fL.quantity === 'massFlow' ? 'measured' : fL.quantity === 'volumeFlow' ? 'measured volume flow times density' : 'measured volume at reference conditions';
    return { mode: 'measured', words };
  }
  if (o.flowDefault && o.flowDefault !== 'none') {
    const words = o.flowDefault === 'mass-balance' ? 'from the mass balance' : o.flowDefault === 'energy-balance' ? 'from the energy balance' : 'from the combustion balance';
    return { mode: o.flowDefault, words };
  }
  ctx.problems.push({ code: 'LINK_MISSING', message: `${port.name}: no flow linked` });
  return null;
}

/** Required measurements of the catalogue that have no link this hour (docs/plant-model.md). */
export function missingRequired(unit: EngineUnit, links: readonly EngineLink[]): EngineReason[] {
  const spec = kindSpec(unit.kind);
  const out: EngineReason[] = [];
  for (const slot of spec.ports) {
    const ports = unit.ports.filter((p) => p.slot === slot.slot);
    if (ports.length < slot.min) out.push({ code: 'MODEL_INCOMPLETE', message: `the ${spec.label.toLowerCase()} needs ${slot.min} '${slot.slot}' port(s), it has ${ports.length}` });
    for (const port of ports) {
      if (slot.stream === 'matter' && !port.fluid) continue; // reported when planned
      for (const m of measurementsFor(slot, (port.fluid?.kind ?? null) as FluidKind | null)) {
        if (m.need !== 'required') continue;
        if (!links.some((l) => l.portName === port.name && m.anyOf.includes(l.quantity))) {
          out.push({ code: 'LINK_MISSING', message: `${port.name}: no ${m.label} linked` });
        }
      }
    }
  }
  for (const m of spec.unitMeasurements) {
    if (m.need === 'required' && !links.some((l) => l.portName === null && m.anyOf.includes(l.quantity))) {
      out.push({ code: 'LINK_MISSING', message: `no ${m.label} of the unit linked` });
    }
  }
  if (spec.needsFuel && !unit.fuel) out.push({ code: 'MODEL_INCOMPLETE', message: 'no fuel definition' });
  return out;
}

const missingCache = new WeakMap<object, Map<string, EngineReason[]>>();
/** missingRequired, kept per unit object and link set (the same for every hour those links hold). */
const missingByArray = new WeakMap<object, { unit: object; r: EngineReason[] }>();
export function missingRequiredCached(unit: EngineUnit, links: readonly EngineLink[]): EngineReason[] {
  const hit = missingByArray.get(links);
  if (hit && hit.unit === unit) return hit.r.map((x) => ({ ...x }));
  const r = missingRequiredByKey(unit, links);
  missingByArray.set(links, { unit, r });
  return r.map((x) => ({ ...x }));
}
export function missingRequiredByKey(unit: EngineUnit, links: readonly EngineLink[]): EngineReason[] {
  const key = links.map((l) => `${l.id}:${l.portName}:${l.quantity}`).join(',');
  let byUnit = missingCache.get(unit);
  if (!byUnit) missingCache.set(unit, (byUnit = new Map()));
  let r = byUnit.get(key);
  if (!r) {
    if (byUnit.size > 1000) byUnit.clear();
    byUnit.set(key, (r = missingRequired(unit, links)));
  }
  return r;
}

