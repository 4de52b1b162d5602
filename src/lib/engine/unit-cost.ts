/**
 * The unit cost of one unit's fuel exergy (SPECO: Cdot_D = c_F Xdot_D), by the kind of its fuel:
 * the one rule for the engine's hours and for a drift notice whose hours carry no cost.
 *
 * - boilers: their own fuel's exergy price (fuelExergyCost);
 * - pumps, compressors, fans, motors: electricity (exergy factor 1);
 * - units on water and steam: the boilers' product cost of the hour (steamCost), else the first
 *   boiler's fuel exergy price (a lower bound, said so);
 * - other units: the first boiler's fuel exergy price.
 * Null when the site has no price for that fuel: a pump is never priced at the gas price.
 *
 * @see Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289; docs/domain.md s.3 and s.7
 */
import type { UnitKind } from '../kinds';
import type { EnergyPrice, Fluid, FuelDefinition } from '../plant/model';
import { costKindOf, electricityCost, fuelExergyCost, steamCost, type BoilerHour } from './cost';
import type { CostBasis, EngineUnit } from './types';
import { HOUR_S } from '../time';

/** What the rule reads of a unit: its kind, a boiler's fuel, the fluids of its ports. */
export interface CostUnit {
  kind: UnitKind;
  fuel: FuelDefinition | null;
  ports: readonly { fluid: Fluid | null }[];
}

export interface CostSite {
  prices: readonly EnergyPrice[];
  currency: string;
  /** dead-state temperature [K], for the fuel's chemical exergy */
  T0_K: number;
}

/**
 * @param unit the unit whose fuel exergy is priced (kind, fuel, ports' fluids)
 * @param boilers the site's boilers, in the engine's order (by name)
 * @param boilerHours the boilers' hours of the same hour, when known (steam cost)
 * @returns [currency/J] with its basis in words, or null without a price for that fuel
 */
export function unitFuelCost(
  unit: CostUnit,
  site: CostSite,
  boilers: readonly Pick<CostUnit, 'fuel'>[],
  boilerHours: readonly BoilerHour[] = [],
): CostBasis | null {
  const kind = costKindOf(unit as EngineUnit) /* reads kind and ports' fluids only */;
  if (kind === 'electricity') return electricityCost(site.prices, site.currency);
  if (kind === 'own-fuel') return fuelExergyCost(site.prices, unit.fuel, site.currency, site.T0_K);
  const first = boilers[0];
  const fallback = first ? fuelExergyCost(site.prices, first.fuel, site.currency, site.T0_K) : null;
  return kind === 'steam' ? steamCost(boilerHours, fallback, site.currency) : fallback;
}

/**
 * The unit cost the hours themselves carry: sum of their cost of destruction over the exergy they
 * destroyed, c_F = sum Cdot_D,h / sum (Xdot_D,h x 3600 s). Null when no hour has a cost.
 * @param hours steady hours with destruction [W] and cost of destruction [currency/h]
 * @returns [currency/J]
 */
export function costOfHours(hours: readonly { destruction_W: number; destructionCost_per_h: number | null }[]): number | null {
  let cost = 0;
  let J = 0;
  let n = 0;
  for (const h of hours) {
    if (h.destructionCost_per_h === null) continue;
    cost += h.destructionCost_per_h;
    J += h.destruction_W * HOUR_S;
    n++;
  }
  return n && J > 0 ? cost / J : null;
}
