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
import type { PortSpec, UnitModel } from '../equipment';
import type { BalanceKind } from '../kinds';
import { defaultParameters, type LinkQuantity, type ParamValue } from '../plant/kinds';
import { KIND_MAPPERS } from './map-kinds';
import { missingRequiredCached } from './map-plan';
import type { Ctx } from './map-port';
import type { EngineLink, EngineReason, EngineUnit, FlueGasSource, TagHour } from './types';

export { cachedConverter } from './map-port';
export { fuelFluidOf, fuelSpecOfDefinition } from './map-fuel';

export type { InputEntry, InputSource, MappedUnit, PortPlan, WetDecision } from './map-types';
import type { MappedUnit } from './map-types';

/** Merged parameters: the catalogue's defaults under the unit's own values. */
export function unitParameters(unit: EngineUnit): Record<string, ParamValue> {
  const hit = mergedParams.get(unit);
  if (hit && hit.kind === unit.kind && hit.own === unit.parameters) return hit.merged;
  const merged = Object.freeze({ ...defaultParameters(unit.kind), ...unit.parameters });
  mergedParams.set(unit, { kind: unit.kind, own: unit.parameters, merged });
  return merged;
}
/** Merged parameters kept per unit object (read-only; recomputed when the unit's kind or parameters object changes). */
const mergedParams = new WeakMap<EngineUnit, { kind: string; own: object; merged: Record<string, ParamValue> }>();

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
  const ctx: Ctx = { unit, params, links, tagHours, p_atm_Pa, flueGasSources, entries: new Map(), problems: [], notes: [], plans: [], decisions: [] };
  ctx.problems.push(...missingRequiredCached(unit, links));
  const keyLinks = [...links];
  const model: UnitModel = {};
  const specs: PortSpec[] = [];
  const mapper = KIND_MAPPERS[unit.kind];
  if (!mapper) throw new Error(`unknown unit kind '${String(unit.kind)}'`);
  const { balanceKind, load, minLoad, massCheck, loadNames } = mapper({ ctx, unit, params, model, specs });
  if (balanceKind !== 'motor' && balanceKind !== 'generator') model.ports = specs;
  return { balanceKind, model, entries: ctx.entries, ports: ctx.plans, load, minLoad, keyLinks, problems: dedupe(ctx.problems), notes: ctx.notes, massCheck, loadNames, decisions: ctx.decisions };
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

