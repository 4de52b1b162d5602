/**
 * Plans one matter port of a unit for an hour: its fluid, how its state and its flow are known, with
 * its vector entries (see map.ts for what is decided); and the catalogue's required links missing.
 */
import { SATURATION_TOLERANCE_K, type PortSpec } from '../equipment';
import { FLUID_SHORT_LABELS, type FluidKind } from '../kinds';
import { kindSpec, measurementsFor } from '../plant/kinds';
import { flowEntry, fluidSpecOf, fromLink, isCondensed, linkAt, put, reading, tsat, type Ctx } from './map-port';
import type { EngineLink, EnginePort, EngineReason, EngineUnit } from './types';

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
  const isWater = fluid.kind === 'water';
  const pL = linkAt(ctx, port.name, 'pressure');
  const TL = linkAt(ctx, port.name, 'temperature');
  const xL = isWater ? linkAt(ctx, port.name, 'vapourFraction') : undefined;
  const fL = linkAt(ctx, port.name, 'massFlow', 'volumeFlow', 'standardVolumeFlow');
  const spec: PortSpec = { name: port.name, direction: o.direction, fluid };
  if (o.role) spec.role = o.role;
  if (o.group) spec.group = o.group;
  let stateWords = '';
  let p = NaN;
  let T = NaN;
  const condensed = fluid.kind === 'fuel' && isCondensed(ctx.unit.fuel, fluid);
  if (condensed) {
    spec.state = 'ambient';
    stateWords = 'at the dead state (a condensed fuel)';
  } else if (o.ambientDefault && !(pL && TL)) {
    spec.state = 'ambient';
    stateWords = pL || TL ? 'at the dead state (p and T are both needed to use them)' : 'at the dead state (no p and T linked)';
  } else {
    const pName = `${port.name}.p_Pa`;
    if (pL) p = fromLink(ctx, pName, pL);
    else if (o.pFromAtmosphere) {
      p = ctx.p_atm_Pa;
      put(ctx, pName, p, 0, { kind: 'site', what: "atmospheric pressure (no pressure linked)" });
    } else if ((o.satLiquidDefault?.copyP || o.satVapourDefault?.copyP) && ctx.entries.has(`${o.satLiquidDefault?.copyP ?? o.satVapourDefault?.copyP}.p_Pa`)) {
      const from = `${o.satLiquidDefault?.copyP ?? o.satVapourDefault?.copyP}.p_Pa`;
      const src = ctx.entries.get(from)!;
      p = src.value;
      put(ctx, pName, p, src.u, { kind: 'copy', of: from, note: 'no pressure linked: the pressure of the port it leaves from' });
    } else {
      ctx.problems.push({ code: 'LINK_MISSING', message: `${port.name}: no pressure linked` });
      return null;
    }
    if (xL) {
      spec.state = 'px';
      fromLink(ctx, `${port.name}.x`, xL);
      stateWords = 'p and vapour fraction x';
    } else if (TL) {
      const Tmean = reading(ctx, TL).value;
      const Ts = isWater ? tsat(p) : NaN;
      const wet = isWater && Number.isFinite(Ts) && Number.isFinite(Tmean) && Tmean - Ts <= SATURATION_TOLERANCE_K;
      if (o.wetFromEnergy) ctx.decisions.push({ pName, TL, water: isWater, fromEnergy: wet || !Number.isFinite(Tmean) });
      if (o.wetFromEnergy && (wet || !Number.isFinite(Tmean))) {
        spec.state = 'energy-balance';
        stateWords = Number.isFinite(Tmean)
          ? `from the energy balance: T = ${(Tmean - 273.15).toFixed(1)} degC is within ${SATURATION_TOLERANCE_K} K of saturation (${(Ts - 273.15).toFixed(1)} degC), so p and T do not fix the state`
          : 'from the energy balance (no temperature reading this hour)';
      } else {
        spec.state = 'pT';
        T = fromLink(ctx, `${port.name}.T_K`, TL);
        stateWords = 'p and T';
      }
    } else if (o.wetFromEnergy) {
      spec.state = 'energy-balance';
      stateWords = 'from the energy balance (no temperature linked)';
    } else if (o.satLiquidDefault) {
      spec.state = 'sat-liquid';
      stateWords = 'saturated liquid at p (no temperature linked)';
    } else if (o.satVapourDefault) {
      spec.state = 'sat-vapour';
      stateWords = 'saturated vapour at p (no temperature linked)';
    } else {
      ctx.problems.push({ code: 'LINK_MISSING', message: `${port.name}: no temperature linked` });
      return null;
    }
  }
  if (fluid.kind === 'flue-gas') {
    if (!o2) {
      ctx.problems.push({ code: 'LINK_MISSING', message: `${port.name}: no O2 fraction linked` });
      return null;
    }
    fromLink(ctx, `${port.name}.O2_fraction`, o2);
  }
  let flowWords: string;
  if (o.flowForced) {
    spec.flow = o.flowForced;
    flowWords = 'from the fuel flow and the measured O2 (combustion balance)';
  } else if (fL) {
    spec.flow = 'measured';
    flowEntry(ctx, port, fL, { p, T });
    flowWords = fL.quantity === 'massFlow' ? 'measured' : fL.quantity === 'volumeFlow' ? 'measured volume flow times density' : 'measured volume at reference conditions';
  } else if (o.flowDefault && o.flowDefault !== 'none') {
    spec.flow = o.flowDefault;
    flowWords = o.flowDefault === 'mass-balance' ? 'from the mass balance' : o.flowDefault === 'energy-balance' ? 'from the energy balance' : 'from the combustion balance';
  } else {
    ctx.problems.push({ code: 'LINK_MISSING', message: `${port.name}: no flow linked` });
    return null;
  }
  ctx.plans.push({ name: port.name, slot: port.slot, direction: o.direction, fluid: FLUID_SHORT_LABELS[port.fluid!.kind], state: stateWords, flow: flowWords });
  return spec;
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

