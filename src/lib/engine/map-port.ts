/**
 * The mapping's context and its reading of links: converters per unit text, a link's hourly mean and
 * standard uncertainty in SI, mass flows from volume flows, a port's fluid as the equipment library
 * takes it. Used by the port planner (map-plan.ts) and the kinds' mappers (map-kinds.ts).
 */
import { buildFuel, prepareFluid, type FluidSpec } from '../equipment';
import { water } from '../thermo/water';
import { mixture, dryAir } from '../thermo/gas';
import { converterFor, type Converter } from '../units/convert';
import { MOLAR_GAS_CONSTANT_J_per_molK } from '../units/constants';
import { LINK_QUANTITIES, type LinkQuantity, type ParamValue } from '../plant/kinds';
import type { Fluid as PlantFluid, FuelDefinition } from '../plant/model';
import type { InputEntry, InputSource, PortPlan, WetDecision } from './map-types';
export type { WetDecision } from './map-types';
import { fuelFluidOf, fuelSpecOfDefinition, normalised } from './map-fuel';
import type { EngineLink, EnginePort, EngineReason, EngineUnit, FlueGasSource, TagHour } from './types';
import { figures } from '../format';

export interface Ctx {
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
  decisions: WetDecision[];
}


type LinkIndex = Map<string | null, Partial<Record<LinkQuantity, EngineLink>>>;
const linkIndexes = new WeakMap<readonly EngineLink[], LinkIndex>();
/** The first link of each port and quantity, kept per links array (the same for every hour it holds). */
function linkIndexOf(links: readonly EngineLink[]): LinkIndex {
  let ix = linkIndexes.get(links);
  if (!ix) {
    ix = new Map();
    for (const l of links) {
      let byQ = ix.get(l.portName);
      if (!byQ) ix.set(l.portName, (byQ = {}));
      byQ[l.quantity] ??= l;
    }
    linkIndexes.set(links, ix);
  }
  return ix;
}

/** The port's link of the first of the quantities that has one (the links array is not changed while it is in use). */
export function linkAt(ctx: Ctx, port: string | null, q1: LinkQuantity, q2?: LinkQuantity, q3?: LinkQuantity): EngineLink | undefined {
  const byQ = linkIndexOf(ctx.links).get(port);
  if (!byQ) return undefined;
  return byQ[q1] ?? (q2 && byQ[q2]) ?? (q3 && byQ[q3]) ?? undefined;
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

const linkConverters = new WeakMap<EngineLink, { p_atm_Pa: number; engUnit: string; quantity: LinkQuantity; conv: Converter | null; err: Error | null }>();
/** cachedConverter for a link's unit and quantity, kept on the link object (no key text per call). */
export function linkConverter(link: EngineLink, p_atm_Pa: number): Converter {
  let c = linkConverters.get(link);
  if (!c || c.p_atm_Pa !== p_atm_Pa || c.engUnit !== link.engUnit || c.quantity !== link.quantity) {
    const { engUnit, quantity } = link;
    try {
      c = { p_atm_Pa, engUnit, quantity, conv: cachedConverter(engUnit, LINK_QUANTITIES[quantity].quantity, p_atm_Pa), err: null };
    } catch (err) {
      c = { p_atm_Pa, engUnit, quantity, conv: null, err: err as Error };
    }
    linkConverters.set(link, c);
  }
  if (c.err || !c.conv) throw c.err;
  return c.conv;
}

/** A link's hourly mean in SI with its standard uncertainty in SI (NaN when the hour has no value). */
export function reading(ctx: Ctx, link: EngineLink): { value: number; u: number; reading: number } {
  const th = ctx.tagHours.get(link.tagName);
  const mean = th?.mean;
  if (mean === null || mean === undefined || !Number.isFinite(mean)) return { value: NaN, u: 0, reading: NaN };
  const conv = linkConverter(link, ctx.p_atm_Pa);
  const uEng = link.uncertaintyMode === 'relative' ? (Math.abs(mean) * link.uncertainty) / 100 : link.uncertainty;
  return { value: conv.toSI(mean), u: Math.abs(uEng * conv.factor), reading: mean };
}

export function put(ctx: Ctx, name: string, value: number, u: number, source: InputSource): void {
  ctx.entries.set(name, { name, value, u, source });
}

export function fromLink(ctx: Ctx, name: string, link: EngineLink): number {
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
export function molarMass(ctx: Ctx, fluid: PlantFluid | null): number | null {
  if (!fluid) return null;
  const key = fluid.kind === 'fuel' ? ctx.unit.fuel : fluid;
  if (key && molarMasses.has(key)) return molarMasses.get(key)!;
  const M = molarMassOf(ctx, fluid);
  if (key) molarMasses.set(key, M);
  return M;
}
export function molarMassOf(ctx: Ctx, fluid: PlantFluid): number | null {
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
export function density(ctx: Ctx, fluid: PlantFluid | null, p: number, T: number): number | null {
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
export function flowEntry(ctx: Ctx, port: EnginePort, link: EngineLink, pT: { p: number; T: number }): void {
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
      note = `amount of substance ${figures(r.value, 6)} mol/s times molar mass ${figures(M, 6)} kg/mol`;
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
      note = `volume flow ${figures(r.value, 6)} m3/s times density ${figures(rho, 6)} kg/m3 at the port's p and T`;
    }
  }
  put(ctx, name, mDot, Math.abs(mDot) * rel, { kind: 'tag', tag: link.tagName, linkId: link.id, quantity: link.quantity, engUnit: link.engUnit, reading: r.reading, ...(note ? { note } : {}) });
}

const condensedFuels = new WeakMap<object, boolean>();
export function isCondensed(def: FuelDefinition | null, fluid: FluidSpec): boolean {
  if (def && condensedFuels.has(def)) return condensedFuels.get(def)!;
  const c = prepareFluid(fluid).family === 'condensed-fuel';
  if (def) condensedFuels.set(def, c);
  return c;
}

export function fluidSpecOf(ctx: Ctx, port: EnginePort, o2Basis: 'dry' | 'wet'): FluidSpec | null {
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
export function tsat(p: number): number {
  try {
    return water.tsat(p);
  } catch {
    return NaN;
  }
}

