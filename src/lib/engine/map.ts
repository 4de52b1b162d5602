/**
 * From a unit of the plant model, the tag links holding in an hour and that hour's tag statistics to
 * the input vector of src/lib/equipment (`evaluateUnitHour`, `unitHourWithUncertainty`).
 *
 * What is decided here, per port (docs/plant-model.md for the catalogue, docs/domain.md s.3 and s.5):
 * - the state: (p, T) where that fixes it; (p, x) when a vapour fraction is linked; a turbine exhaust,
 *   a let-down valve outlet or a condenser's steam inlet that is not clearly superheated (T missing, or
 *   within SATURATION_TOLERANCE_K of Tsat(p) or below it) takes its enthalpy from the energy balance
 *   (turbine: h_out = h_in - W / (mDot eta_gen) with the generator efficiency; valve: h_out = h_in),
 *   never from T and p; a boiler blowdown without T is saturated liquid; fuel and combustion air
 *   without p and T are at the dead state;
 * - the flow: the linked flow (mass, actual volume with the density at the port's p and T, or volume at
 *   the unit's reference conditions with the gas's molar mass), else the kind's mass balance; boiler
 *   air and flue gas from the fuel flow and the measured O2;
 * - the unit's power, the kind's efficiencies (parameters, without uncertainty) and the dead state.
 *
 * Every entry remembers where it came from (tag and link, parameter, site setting), its value in SI
 * and its standard uncertainty in SI: relative uncertainties are percent of the reading in the link's
 * unit, absolute ones are in the link's unit (src/lib/units uncertaintyToSI). A flow converted from a
 * volume keeps the volume reading's relative uncertainty (the density is taken as exact).
 */
import {
  SATURATION_TOLERANCE_K,
  buildFuel,
  prepareFluid,
  type FluidSpec,
  type FuelSpec,
  type PortSpec,
  type UnitKind as BalanceKind,
  type UnitModel,
} from '../equipment';
import { water } from '../thermo/water';
import { mixture, dryAir } from '../thermo/gas';
import { converterFor, type Converter } from '../units/convert';
import { MOLAR_GAS_CONSTANT_J_per_molK } from '../units/constants';
import { LINK_QUANTITIES, defaultParameters, kindSpec, measurementsFor, type FluidKind, type LinkQuantity, type ParamValue } from '../plant/kinds';
import type { Fluid as PlantFluid, FuelDefinition } from '../plant/model';
import type { EngineLink, EnginePort, EngineReason, EngineUnit, FlueGasSource, TagHour } from './types';

/** Where a vector entry comes from. */
export type InputSource =
  | { kind: 'tag'; tag: string; linkId: string; quantity: LinkQuantity; engUnit: string; reading: number; note?: string }
  | { kind: 'parameter'; key: string }
  | { kind: 'site'; what: string }
  | { kind: 'copy'; of: string; note: string };

/** One entry of the input vector: SI value, standard uncertainty in SI, and its source. */
export interface InputEntry {
  name: string;
  value: number;
  u: number;
  source: InputSource;
}

/** How a port's state and flow were decided, for the audit trail. */
export interface PortPlan {
  name: string;
  slot: string;
  direction: 'in' | 'out';
  fluid: string;
  state: string;
  flow: string;
}

/** The unit mapped to the equipment library for one hour. */
export interface MappedUnit {
  balanceKind: BalanceKind;
  model: UnitModel;
  /** entries by name (the vector order is inputNames(balanceKind, model)) */
  entries: Map<string, InputEntry>;
  ports: PortPlan[];
  /** the load measure: value in SI (NaN when a reading is missing), its unit and tags */
  load: { value: number; unit: 'W' | 'kg/s'; label: string; tags: string[] };
  /** the minimum load in the load's unit */
  minLoad: number;
  /** links whose data decide the hour's state (the unit's own) */
  keyLinks: EngineLink[];
  /** problems that stop the balance (missing links, a unit that does not convert ...) */
  problems: EngineReason[];
  notes: string[];
  /** the kind balances mass, and no flow of the group closes it by construction */
  massCheck: { groups: string[] } | null;
}

/** Merged parameters: the catalogue's defaults under the unit's own values. */
export function unitParameters(unit: EngineUnit): Record<string, ParamValue> {
  return { ...defaultParameters(unit.kind), ...unit.parameters };
}

function num(params: Record<string, ParamValue>, key: string, fallback: number): number {
  const v = params[key];
  return typeof v === 'number' && Number.isFinite(v) ? v : fallback;
}

function normalised(fr: Record<string, number>): Record<string, number> {
  let s = 0;
  for (const v of Object.values(fr)) s += v;
  const out: Record<string, number> = {};
  for (const [k, v] of Object.entries(fr)) if (v > 0) out[k] = v / s;
  return out;
}

/** The equipment FuelSpec of a plant fuel definition (gas compositions scaled to sum to 1). */
export function fuelSpecOfDefinition(f: FuelDefinition): FuelSpec {
  if (f.by === 'composition') return { composition: normalised(f.moleFractions) as never };
  if (f.by === 'heating-value') return { fuelType: f.fuelType, LHV_J_per_kg: f.LHV_J_per_kg };
  return { ultimate: { ...f.ultimate }, LHV_J_per_kg: f.LHV_J_per_kg };
}

/** The equipment FluidSpec of a unit's fuel. */
export function fuelFluidOf(f: FuelDefinition): FluidSpec {
  if (f.by === 'composition') return { kind: 'fuel-gas', composition: normalised(f.moleFractions) as never };
  return { kind: 'fuel', fuel: fuelSpecOfDefinition(f) };
}

const FLUID_WORDS: Record<FluidKind, string> = {
  water: 'water / steam',
  air: 'air',
  'flue-gas': 'flue gas',
  fuel: 'fuel',
  'fuel-gas': 'fuel gas',
  'gas-mixture': 'gas mixture',
  liquid: 'liquid',
};

interface Ctx {
  unit: EngineUnit;
  params: Record<string, ParamValue>;
  links: readonly EngineLink[];
  tagHours: ReadonlyMap<string, TagHour>;
  p_atm_Pa: number;
  flueGasSources: Readonly<Record<string, FlueGasSource>>;
  entries: Map<string, InputEntry>;
  problems: EngineReason[];
  notes: string[];
  plans: PortPlan[];
}

function linkAt(ctx: Ctx, port: string | null, ...qs: LinkQuantity[]): EngineLink | undefined {
  for (const q of qs) {
    const l = ctx.links.find((k) => k.portName === port && k.quantity === q);
    if (l) return l;
  }
  return undefined;
}

const converters = new Map<string, Converter>();
/**
 * A converter per engineering unit, quantity and site atmosphere, kept (parsing a unit text is the
 * slow part of a conversion). Uncertainties convert with the factor alone (no offset, no gauge shift),
 * as src/lib/units uncertaintyToSI does.
 */
export function cachedConverter(engUnit: string, quantity: Parameters<typeof converterFor>[1], p_atm_Pa: number): Converter {
  const key = `${engUnit}\u0000${quantity}\u0000${p_atm_Pa}`;
  let c = converters.get(key);
  if (!c) {
    if (converters.size > 5000) converters.clear();
    c = converterFor(engUnit, quantity, { p_atm_Pa });
    converters.set(key, c);
  }
  return c;
}

/** A link's hourly mean in SI with its standard uncertainty in SI (NaN when the hour has no value). */
function reading(ctx: Ctx, link: EngineLink): { value: number; u: number; reading: number } {
  const q = LINK_QUANTITIES[link.quantity].quantity;
  const th = ctx.tagHours.get(link.tagName);
  const mean = th?.mean;
  if (mean === null || mean === undefined || !Number.isFinite(mean)) return { value: NaN, u: 0, reading: NaN };
  const conv = cachedConverter(link.engUnit, q, ctx.p_atm_Pa);
  const uEng = link.uncertaintyMode === 'relative' ? (Math.abs(mean) * link.uncertainty) / 100 : link.uncertainty;
  return { value: conv.toSI(mean), u: Math.abs(uEng * conv.factor), reading: mean };
}

function put(ctx: Ctx, name: string, value: number, u: number, source: InputSource): void {
  ctx.entries.set(name, { name, value, u, source });
}

function fromLink(ctx: Ctx, name: string, link: EngineLink): number {
  try {
    const r = reading(ctx, link);
    put(ctx, name, r.value, r.u, { kind: 'tag', tag: link.tagName, linkId: link.id, quantity: link.quantity, engUnit: link.engUnit, reading: r.reading });
    return r.value;
  } catch (err) {
    ctx.problems.push({ code: 'CONVERSION_FAILED', tag: link.tagName, message: `${link.tagName}: ${(err as Error).message}` });
    put(ctx, name, NaN, 0, { kind: 'tag', tag: link.tagName, linkId: link.id, quantity: link.quantity, engUnit: link.engUnit, reading: NaN });
    return NaN;
  }
}

const molarMasses = new WeakMap<object, number | null>();
/** Molar mass of a gas port's fluid [kg/mol], or null when the fluid has none that is fixed. */
function molarMass(ctx: Ctx, fluid: PlantFluid | null): number | null {
  if (!fluid) return null;
  const key = fluid.kind === 'fuel' ? ctx.unit.fuel : fluid;
  if (key && molarMasses.has(key)) return molarMasses.get(key)!;
  const M = molarMassOf(ctx, fluid);
  if (key) molarMasses.set(key, M);
  return M;
}
function molarMassOf(ctx: Ctx, fluid: PlantFluid): number | null {
  switch (fluid.kind) {
    case 'air':
      return dryAir.M_kg_per_mol;
    case 'fuel-gas':
    case 'gas-mixture':
      return mixture(normalised(fluid.moleFractions) as never, 'mole').M_kg_per_mol;
    case 'fuel': {
      if (!ctx.unit.fuel) return null;
      const f = buildFuel(fuelSpecOfDefinition(ctx.unit.fuel));
      return f.phase === 'gas' && f.M_kg_per_mol ? f.M_kg_per_mol : null;
    }
    default:
      return null;
  }
}

/** Density at flowing conditions [kg/m3] of a port's fluid at p [Pa], T [K], or null. */
function density(ctx: Ctx, fluid: PlantFluid | null, p: number, T: number): number | null {
  if (!fluid || !Number.isFinite(p) || !Number.isFinite(T)) return null;
  if (fluid.kind === 'water') return 1 / water.v_pt(p, T);
  if (fluid.kind === 'liquid') return fluid.rho_kg_per_m3;
  const M = molarMass(ctx, fluid);
  return M ? (p * M) / (MOLAR_GAS_CONSTANT_J_per_molK * T) : null;
}

/**
 * The port's mass flow entry from its flow link [kg/s]; volume flows need the port's p and T
 * (actual) or the gas's molar mass (reference conditions).
 */
function flowEntry(ctx: Ctx, port: EnginePort, link: EngineLink, pT: { p: number; T: number }): void {
  const name = `${port.name}.mDot_kg_per_s`;
  if (link.quantity === 'massFlow') {
    fromLink(ctx, name, link);
    return;
  }
  let r: { value: number; u: number; reading: number };
  try {
    r = reading(ctx, link);
  } catch (err) {
    ctx.problems.push({ code: 'CONVERSION_FAILED', tag: link.tagName, message: `${link.tagName}: ${(err as Error).message}` });
    put(ctx, name, NaN, 0, { kind: 'tag', tag: link.tagName, linkId: link.id, quantity: link.quantity, engUnit: link.engUnit, reading: NaN });
    return;
  }
  const rel = r.value !== 0 ? r.u / Math.abs(r.value) : 0;
  let mDot = NaN;
  let note = '';
  if (link.quantity === 'standardVolumeFlow') {
    const M = molarMass(ctx, port.fluid);
    if (M === null) {
      ctx.problems.push({
        code: 'CONVERSION_FAILED',
        tag: link.tagName,
        message: `${link.tagName}: a volume at reference conditions needs a gas of known composition; '${port.fluid?.kind ?? 'no fluid'}' at ${port.name} has none`,
      });
    } else {
      mDot = r.value * M;
      note = `amount of substance ${r.value} mol/s times molar mass ${M} kg/mol`;
    }
  } else {
    const rho = Number.isFinite(r.value) ? density(ctx, port.fluid, pT.p, pT.T) : null;
    if (Number.isFinite(r.value) && rho === null) {
      ctx.problems.push({
        code: 'CONVERSION_FAILED',
        tag: link.tagName,
        message: `${link.tagName}: an actual volume flow needs the density at ${port.name}, which needs its pressure and temperature and a fluid of known composition`,
      });
    } else if (rho !== null) {
      mDot = r.value * rho;
      note = `volume flow ${r.value} m3/s times density ${rho} kg/m3 at the port's p and T`;
    }
  }
  put(ctx, name, mDot, Math.abs(mDot) * rel, { kind: 'tag', tag: link.tagName, linkId: link.id, quantity: link.quantity, engUnit: link.engUnit, reading: r.reading, ...(note ? { note } : {}) });
}

const condensedFuels = new WeakMap<object, boolean>();
function isCondensed(def: FuelDefinition | null, fluid: FluidSpec): boolean {
  if (def && condensedFuels.has(def)) return condensedFuels.get(def)!;
  const c = prepareFluid(fluid).family === 'condensed-fuel';
  if (def) condensedFuels.set(def, c);
  return c;
}

function fluidSpecOf(ctx: Ctx, port: EnginePort, o2Basis: 'dry' | 'wet'): FluidSpec | null {
  const f = port.fluid;
  if (!f) {
    ctx.problems.push({ code: 'MODEL_INCOMPLETE', message: `port '${port.name}' has no fluid` });
    return null;
  }
  switch (f.kind) {
    case 'water':
      return { kind: 'water' };
    case 'air':
      return { kind: 'air' };
    case 'fuel-gas':
      return { kind: 'fuel-gas', composition: normalised(f.moleFractions) as never };
    case 'gas-mixture':
      return { kind: 'gas', fractions: normalised(f.moleFractions) as never, basis: 'mole' };
    case 'liquid':
      return { kind: 'liquid', cp_J_per_kgK: f.cp_J_per_kgK, rho_kg_per_m3: f.rho_kg_per_m3 };
    case 'fuel':
      if (!ctx.unit.fuel) {
        ctx.problems.push({ code: 'MODEL_INCOMPLETE', message: `unit '${ctx.unit.name}' has no fuel definition for its port '${port.name}'` });
        return null;
      }
      return fuelFluidOf(ctx.unit.fuel);
    case 'flue-gas': {
      if (ctx.unit.kind === 'boiler' && (!f.fuelFrom || f.fuelFrom === ctx.unit.name)) return { kind: 'flue-gas', o2Basis };
      const src = f.fuelFrom ? ctx.flueGasSources[f.fuelFrom] : undefined;
      if (!src?.fuel) {
        ctx.problems.push({
          code: 'MODEL_INCOMPLETE',
          message: `flue gas at '${port.name}' needs the boiler it comes from (fuelFrom) with a fuel definition${f.fuelFrom ? `; '${f.fuelFrom}' has none` : ''}`,
        });
        return null;
      }
      return { kind: 'flue-gas', o2Basis: src.o2Link?.basis ?? 'dry', fuel: fuelSpecOfDefinition(src.fuel) };
    }
  }
}

/** Saturation temperature at p [K], or NaN above the critical pressure or outside the range. */
function tsat(p: number): number {
  try {
    return water.tsat(p);
  } catch {
    return NaN;
  }
}

interface PortOptions {
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
function planPort(ctx: Ctx, port: EnginePort, o: PortOptions): PortSpec | null {
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
  ctx.plans.push({ name: port.name, slot: port.slot, direction: o.direction, fluid: FLUID_WORDS[port.fluid!.kind], state: stateWords, flow: flowWords });
  return spec;
}

/** Required measurements of the catalogue that have no link this hour (docs/plant-model.md). */
function missingRequired(unit: EngineUnit, links: readonly EngineLink[]): EngineReason[] {
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
function missingRequiredCached(unit: EngineUnit, links: readonly EngineLink[]): EngineReason[] {
  const hit = missingByArray.get(links);
  if (hit && hit.unit === unit) return hit.r.map((x) => ({ ...x }));
  const r = missingRequiredByKey(unit, links);
  missingByArray.set(links, { unit, r });
  return r.map((x) => ({ ...x }));
}
function missingRequiredByKey(unit: EngineUnit, links: readonly EngineLink[]): EngineReason[] {
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

const sumOf = (ctx: Ctx, names: string[]) => names.reduce((s, n) => s + (ctx.entries.get(n)?.value ?? NaN), 0);
const tagsOf = (ctx: Ctx, names: string[]) =>
  names.map((n) => ctx.entries.get(n)?.source).flatMap((s) => (s?.kind === 'tag' ? [s.tag] : []));

/**
 * Maps a unit and the links holding in an hour, with the hour's tag statistics, to the equipment
 * library's model and input entries.
 *
 * @param unit the unit of the plant model
 * @param links the unit's link versions holding at the hour's start
 * @param tagHours the hour's statistics by tag name (engineering units)
 * @param p_atm_Pa the site's atmospheric pressure [Pa] (gauge readings, stacks without pressure)
 * @param flueGasSources boilers that flue-gas ports of other units come from
 */
export function mapUnitHour(
  unit: EngineUnit,
  links: readonly EngineLink[],
  tagHours: ReadonlyMap<string, TagHour>,
  p_atm_Pa: number,
  flueGasSources: Readonly<Record<string, FlueGasSource>> = {},
): MappedUnit {
  const params = unitParameters(unit);
  const ctx: Ctx = { unit, params, links, tagHours, p_atm_Pa, flueGasSources, entries: new Map(), problems: [], notes: [], plans: [] };
  ctx.problems.push(...missingRequiredCached(unit, links));
  const keyLinks = [...links];
  const model: UnitModel = {};
  const specs: PortSpec[] = [];
  const add = (s: PortSpec | null) => {
    if (s) specs.push(s);
  };
  const bySlot = (slot: string) => unit.ports.filter((p) => p.slot === slot);
  const one = (slot: string) => bySlot(slot)[0];
  const flowName = (p: EnginePort | undefined) => (p ? `${p.name}.mDot_kg_per_s` : '');
  let balanceKind: BalanceKind;
  let load: MappedUnit['load'];
  let minLoad = 0;
  let massCheck: MappedUnit['massCheck'] = null;
  const powerEntry = (name: string, q: LinkQuantity): boolean => {
    const l = linkAt(ctx, null, q);
    if (!l) return false;
    fromLink(ctx, name, l);
    return true;
  };
  const measuredFlows = (ps: EnginePort[]) => ps.filter((p) => ctx.entries.has(flowName(p))).map(flowName);

  switch (unit.kind) {
    case 'turbine': {
      balanceKind = 'turbine';
      for (const p of bySlot('inlet')) add(planPort(ctx, p, { direction: 'in' }));
      for (const p of bySlot('extraction')) add(planPort(ctx, p, { direction: 'out', wetFromEnergy: false }));
      for (const p of bySlot('exhaust')) add(planPort(ctx, p, { direction: 'out', wetFromEnergy: true, flowDefault: 'mass-balance' }));
      powerEntry('power_W', 'power');
      if ((params.powerBasis ?? 'generator-terminals') === 'generator-terminals') {
        model.powerMeasured = 'electric';
        put(ctx, 'generatorEfficiency', num(params, 'generatorEfficiency', 0.97), 0, { kind: 'parameter', key: 'generatorEfficiency' });
      } else model.powerMeasured = 'shaft';
      if (params.wetExhaustMethod === 'condenser-heat-balance') {
        ctx.notes.push("wet exhaust method 'condenser-heat-balance' is worked as the turbine's own energy balance (the condenser is a unit of its own)");
      }
      load = { value: ctx.entries.get('power_W')?.value ?? NaN, unit: 'W', label: 'power', tags: tagsOf(ctx, ['power_W']) };
      minLoad = num(params, 'minLoad_W', 0);
      massCheck = specs.some((s) => s.flow === 'mass-balance') ? null : { groups: ['main'] };
      break;
    }
    case 'compressor':
    case 'pump':
    case 'fan': {
      balanceKind = unit.kind;
      for (const p of bySlot('inlet')) add(planPort(ctx, p, { direction: 'in' }));
      for (const p of bySlot('outlet')) add(planPort(ctx, p, { direction: 'out', flowDefault: 'mass-balance' }));
      powerEntry('power_W', 'power');
      if ((params.powerBasis ?? 'electric') === 'electric') {
        model.powerMeasured = 'electric';
        put(ctx, 'motorEfficiency', num(params, 'driveEfficiency', 0.95), 0, { kind: 'parameter', key: 'driveEfficiency' });
      } else model.powerMeasured = 'shaft';
      load = { value: ctx.entries.get('power_W')?.value ?? NaN, unit: 'W', label: 'power', tags: tagsOf(ctx, ['power_W']) };
      minLoad = num(params, 'minLoad_W', 0);
      massCheck = specs.some((s) => s.flow === 'mass-balance') ? null : { groups: ['main'] };
      break;
    }
    case 'heat-exchanger': {
      balanceKind = 'heat-exchanger';
      model.belowDeadState = 'flag';
      add(one('hotIn') && planPort(ctx, one('hotIn')!, { direction: 'in', role: 'hot' }));
      add(one('hotOut') && planPort(ctx, one('hotOut')!, { direction: 'out', role: 'hot', flowDefault: 'mass-balance' }));
      add(one('coldIn') && planPort(ctx, one('coldIn')!, { direction: 'in', role: 'cold' }));
      add(one('coldOut') && planPort(ctx, one('coldOut')!, { direction: 'out', role: 'cold', flowDefault: 'mass-balance' }));
      const hot = flowName(one('hotIn'));
      load = { value: ctx.entries.get(hot)?.value ?? NaN, unit: 'kg/s', label: 'hot-side flow', tags: tagsOf(ctx, [hot]) };
      minLoad = num(params, 'minLoad_kg_per_s', 0);
      const groups = (['hot', 'cold'] as const).filter((r) => !specs.some((s) => s.role === r && s.flow !== undefined && s.flow !== 'measured'));
      massCheck = groups.length ? { groups: [...groups] } : null;
      break;
    }
    case 'boiler': {
      balanceKind = 'boiler';
      const fuelPort = one('fuel');
      add(fuelPort && planPort(ctx, fuelPort, { direction: 'in', role: 'fuel', ambientDefault: true }));
      for (const p of bySlot('air')) add(planPort(ctx, p, { direction: 'in', role: 'air', ambientDefault: true, flowForced: 'fuel-ratio' }));
      for (const p of bySlot('flueGas')) add(planPort(ctx, p, { direction: 'out', role: 'flue-gas', pFromAtmosphere: true, flowForced: 'fuel-ratio' }));
      for (const p of bySlot('feedwater')) add(planPort(ctx, p, { direction: 'in', role: 'water' }));
      const steam = bySlot('steam');
      for (const p of steam) add(planPort(ctx, p, { direction: 'out', role: 'water', flowDefault: 'mass-balance' }));
      for (const p of bySlot('reheatIn')) add(planPort(ctx, p, { direction: 'in', role: 'water', group: 'reheat' }));
      for (const p of bySlot('reheatOut')) add(planPort(ctx, p, { direction: 'out', role: 'water', group: 'reheat', flowDefault: 'mass-balance' }));
      for (const p of bySlot('blowdown')) add(planPort(ctx, p, { direction: 'out', role: 'blowdown', satLiquidDefault: { copyP: steam[0]?.name } }));
      const steamFlows = steam.map(flowName);
      load = { value: steamFlows.length ? sumOf(ctx, steamFlows) : NaN, unit: 'kg/s', label: 'steam flow', tags: tagsOf(ctx, steamFlows) };
      minLoad = num(params, 'minLoad_kg_per_s', 0);
      const groups: string[] = [];
      if (!specs.some((s) => (s.role === 'water' || s.role === 'blowdown') && !s.group && s.flow === 'mass-balance')) groups.push('water');
      if (bySlot('reheatIn').length && !specs.some((s) => s.group === 'reheat' && s.flow === 'mass-balance')) groups.push('reheat');
      massCheck = groups.length ? { groups } : null;
      break;
    }
    case 'let-down-valve': {
      balanceKind = 'valve';
      for (const p of bySlot('inlet')) add(planPort(ctx, p, { direction: 'in' }));
      for (const p of bySlot('outlet')) add(planPort(ctx, p, { direction: 'out', wetFromEnergy: true, flowDefault: 'mass-balance' }));
      const f = flowName(one('inlet'));
      load = { value: ctx.entries.get(f)?.value ?? NaN, unit: 'kg/s', label: 'flow', tags: tagsOf(ctx, [f]) };
      minLoad = num(params, 'minLoad_kg_per_s', 0);
      massCheck = specs.some((s) => s.flow === 'mass-balance') ? null : { groups: ['main'] };
      break;
    }
    case 'mixer': {
      balanceKind = 'mixer';
      const inlets = bySlot('inlet');
      for (const p of inlets) add(planPort(ctx, p, { direction: 'in' }));
      const outlet = one('outlet');
      add(outlet && planPort(ctx, outlet, { direction: 'out', role: 'outlet', flowDefault: 'mass-balance' }));
      for (const p of bySlot('vent')) {
        if (!linkAt(ctx, p.name, 'massFlow', 'volumeFlow', 'standardVolumeFlow')) {
          ctx.notes.push(`vent '${p.name}' has no flow linked: left out of the balance`);
          continue;
        }
        add(planPort(ctx, p, { direction: 'out', role: 'vent', satVapourDefault: { copyP: outlet?.name } }));
      }
      const out = flowName(outlet);
      const useOut = ctx.entries.has(out);
      const names = useOut ? [out] : measuredFlows(inlets);
      load = { value: names.length ? sumOf(ctx, names) : NaN, unit: 'kg/s', label: useOut ? 'outlet flow' : 'inlet flows', tags: tagsOf(ctx, names) };
      minLoad = num(params, 'minLoad_kg_per_s', 0);
      massCheck = specs.some((s) => s.flow === 'mass-balance') ? null : { groups: ['main'] };
      break;
    }
    case 'condenser': {
      balanceKind = 'condenser';
      const cIn = one('coolantIn');
      const cOut = one('coolantOut');
      const coolantFlow = cIn ? linkAt(ctx, cIn.name, 'massFlow', 'volumeFlow', 'standardVolumeFlow') : undefined;
      const coolant = Boolean(cIn && cOut);
      const pin = one('processIn');
      // A wet process inlet can take its state from the energy balance only when the coolant flow is known.
      add(pin && planPort(ctx, pin, { direction: 'in', role: 'process', wetFromEnergy: coolant && Boolean(coolantFlow) }));
      add(one('processOut') && planPort(ctx, one('processOut')!, { direction: 'out', role: 'process', flowDefault: 'mass-balance' }));
      const inletFromEnergy = specs.some((s) => s.name === pin?.name && s.state === 'energy-balance');
      if (coolant) {
        add(planPort(ctx, cIn!, { direction: 'in', role: 'cooling', pFromAtmosphere: true, flowDefault: inletFromEnergy ? 'none' : 'energy-balance' }));
        add(planPort(ctx, cOut!, { direction: 'out', role: 'cooling', pFromAtmosphere: true, flowDefault: 'mass-balance' }));
      } else if (cIn || cOut) ctx.notes.push('coolant side incomplete (needs an inlet and an outlet): destruction and loss are not split');
      const f = flowName(pin);
      load = { value: ctx.entries.get(f)?.value ?? NaN, unit: 'kg/s', label: 'process flow', tags: tagsOf(ctx, [f]) };
      minLoad = num(params, 'minLoad_kg_per_s', 0);
      massCheck = specs.some((s) => s.role === 'process' && s.flow === 'mass-balance') ? null : { groups: ['process'] };
      break;
    }
    case 'motor-generator': {
      balanceKind = params.mode === 'generator' ? 'generator' : 'motor';
      powerEntry('powerIn_W', 'powerIn');
      powerEntry('powerOut_W', 'powerOut');
      load = { value: ctx.entries.get('powerOut_W')?.value ?? NaN, unit: 'W', label: 'power out', tags: tagsOf(ctx, ['powerOut_W']) };
      minLoad = num(params, 'minLoad_W', 0);
      break;
    }
    case 'control-volume': {
      balanceKind = 'generic';
      const inlets = bySlot('inlet');
      let mb = false;
      for (const p of [...inlets, ...bySlot('outlet')]) {
        const direction = p.slot === 'inlet' ? 'in' : 'out';
        const hasFlow = Boolean(linkAt(ctx, p.name, 'massFlow', 'volumeFlow', 'standardVolumeFlow'));
        const s = planPort(ctx, p, { direction, role: p.account ?? 'fuel', flowDefault: !hasFlow && !mb ? 'mass-balance' : 'none' });
        if (s?.flow === 'mass-balance') mb = true;
        add(s);
      }
      model.chemical = false;
      model.powers = [];
      model.heats = [];
      if (linkAt(ctx, null, 'powerIn')) {
        model.powers.push({ name: 'power in', role: 'fuel', direction: 'in' });
        powerEntry('power in.power_W', 'powerIn');
      }
      if (linkAt(ctx, null, 'powerOut')) {
        model.powers.push({ name: 'power out', role: 'product', direction: 'out' });
        powerEntry('power out.power_W', 'powerOut');
      }
      for (const p of [...bySlot('heatIn'), ...bySlot('heatOut')]) {
        const direction = p.slot === 'heatIn' ? 'in' : 'out';
        const q = linkAt(ctx, p.name, 'heatFlow');
        const t = linkAt(ctx, p.name, 'temperature');
        if (!q) continue; // reported as a missing required link
        fromLink(ctx, `${p.name}.Q_W`, q);
        if (t) fromLink(ctx, `${p.name}.Tb_K`, t);
        else if (p.boundaryT_K !== null) put(ctx, `${p.name}.Tb_K`, p.boundaryT_K, 0, { kind: 'parameter', key: `${p.name}.boundaryT_K` });
        else {
          ctx.problems.push({ code: 'LINK_MISSING', message: `${p.name}: no boundary temperature (link one, or set the port's boundaryT_K)` });
          continue;
        }
        const role = (p.account ?? (direction === 'in' ? 'fuel' : 'product')) as 'fuel' | 'product' | 'loss';
        model.heats.push({ name: p.name, role, direction });
        ctx.plans.push({ name: p.name, slot: p.slot, direction, fluid: 'heat', state: t ? 'boundary temperature measured' : 'fixed boundary temperature', flow: 'heat flow measured' });
      }
      const names = measuredFlows(inlets);
      load = { value: names.length ? sumOf(ctx, names) : NaN, unit: 'kg/s', label: 'inlet flows', tags: tagsOf(ctx, names) };
      minLoad = num(params, 'minLoad_kg_per_s', 0);
      massCheck = mb || specs.length === 0 ? null : { groups: ['main'] };
      break;
    }
    default:
      throw new Error(`unknown unit kind '${String(unit.kind)}'`);
  }
  if (balanceKind !== 'motor' && balanceKind !== 'generator') model.ports = specs;
  return { balanceKind, model, entries: ctx.entries, ports: ctx.plans, load, minLoad, keyLinks, problems: dedupe(ctx.problems), notes: ctx.notes, massCheck };
}

function dedupe(rs: EngineReason[]): EngineReason[] {
  const seen = new Set<string>();
  return rs.filter((r) => {
    const k = `${r.code}|${r.message}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}
