/**
 * The unit cost of each unit's fuel exergy for one hour (SPECO: Cdot_D = c_F Xdot_D), from the
 * site's prices. The simplest defensible chain, stated in each hour's audit trail:
 *
 * - a boiler's fuel: its fuel's price per MWh of LHV on an exergy basis, c = price / (3.6e9 J/MWh) / phi
 *   with phi = e_ch / LHV of that fuel (src/lib/thermo fuelChemicalExergy);
 * - steam (units on water and steam downstream of the boilers): the boilers' product cost of that hour,
 *   c_steam = sum_b c_F,b F_b / sum_b P_b (cost balance of the boilers, no capital cost, losses charged
 *   to the product), i.e. the fuel's exergy price divided by the boiler's exergy efficiency for one
 *   boiler. Without a boiler hour to go by, the fuel's exergy price itself (a lower bound, said so);
 * - electricity (pumps, compressors, fans, motors): the site's electricity price (exergy factor 1);
 * - other units (gas expanders, flue-gas exchangers): the fuel's exergy price.
 *
 * @see Lazzaretto & Tsatsaronis, Energy 31 (2006) 1257-1289 (SPECO cost balances);
 *   src/lib/analytics/cost.ts; docs/domain.md s.7
 */
import { electricityExergyCost_per_J, fuelExergyCost_per_J, productExergyCost_per_J } from '../analytics/cost';
import { buildFuel } from '../equipment';
import { fuelChemicalExergy } from '../thermo/chemical-exergy';
import type { EnergyPrice, FuelDefinition } from '../plant/model';
import { fuelSpecOfDefinition } from './map';
import type { CostBasis, EngineUnit } from './types';
import { fixed, upTo } from '../format';

const fmt = (c_per_J: number, currency: string) => `${fixed(c_per_J * 3.6e9, 2)} ${currency}/MWh of exergy`;
/** A price as the site set it [currency/MWh]. */
const price$ = (price_per_MWh: number) => upTo(price_per_MWh, 4);

/** The price a boiler's fuel names, else the site's first fuel price (same currency as the site). */
export function fuelPriceOf(prices: readonly EnergyPrice[], fuel: FuelDefinition | null, currency: string): EnergyPrice | null {
  const ok = prices.filter((p) => p.currency === currency);
  if (fuel?.price) {
    const named = ok.find((p) => p.name === fuel.price);
    if (named) return named;
  }
  return ok.find((p) => p.kind === 'fuel') ?? null;
}

/**
 * Unit cost of a boiler fuel's exergy.
 * @param T0_K dead-state temperature [K] (the fuel's chemical exergy)
 * @returns [currency/J] with its basis, or null without a fuel price or fuel definition
 */
export function fuelExergyCost(prices: readonly EnergyPrice[], fuel: FuelDefinition | null, currency: string, T0_K: number): CostBasis | null {
  const price = fuelPriceOf(prices, fuel, currency);
  if (!price || !fuel) return null;
  const f = buildFuel(fuelSpecOfDefinition(fuel));
  const phi = fuelChemicalExergy(f, T0_K) / f.LHV_J_per_kg;
  const c = fuelExergyCost_per_J(price.price_per_MWh, phi);
  return { cF_per_J: c, basis: `fuel '${price.name}' at ${price$(price.price_per_MWh)} ${currency}/MWh (LHV), exergy/LHV = ${fixed(phi, 4)}: ${fmt(c, currency)}` };
}

/** Unit cost of electricity as exergy, from the site's first electricity price; null without one. */
export function electricityCost(prices: readonly EnergyPrice[], currency: string): CostBasis | null {
  const price = prices.find((p) => p.kind === 'electricity' && p.currency === currency);
  if (!price) return null;
  const c = electricityExergyCost_per_J(price.price_per_MWh);
  return { cF_per_J: c, basis: `electricity '${price.name}' at ${price$(price.price_per_MWh)} ${currency}/MWh: ${fmt(c, currency)}` };
}

/** A boiler's hour as the steam cost needs it. */
export interface BoilerHour {
  name: string;
  fuel_W: number | null;
  product_W: number | null;
  /** the boiler's fuel exergy cost [currency/J] */
  cF_per_J: number | null;
}

/**
 * Unit cost of steam exergy in an hour: the boilers' product cost, c = sum c_F F / sum P.
 * @param fallback the fuel's exergy cost to use when no boiler hour has F and P (a lower bound)
 */
export function steamCost(boilers: readonly BoilerHour[], fallback: CostBasis | null, currency: string): CostBasis | null {
  const ok = boilers.filter((b) => b.cF_per_J !== null && b.fuel_W !== null && b.product_W !== null && b.fuel_W > 0 && b.product_W > 0);
  if (ok.length) {
    let cost = 0;
    let F = 0;
    let P = 0;
    for (const b of ok) {
      cost += b.cF_per_J! * b.fuel_W!;
      F += b.fuel_W!;
      P += b.product_W!;
    }
    const c = productExergyCost_per_J(cost / F, F, P);
    const eff = ok.length === 1 ? `, boiler ${ok[0]!.name} exergy efficiency ${fixed((100 * ok[0]!.product_W!) / ok[0]!.fuel_W!, 1)} %` : '';
    return { cF_per_J: c, basis: `steam from ${ok.map((b) => b.name).join(', ')} this hour: fuel exergy cost / boiler exergy efficiency${eff}: ${fmt(c, currency)}` };
  }
  if (!fallback) return null;
  return { cF_per_J: fallback.cF_per_J, basis: `steam priced at the fuel's exergy price (no boiler hour to go by; a lower bound): ${fallback.basis}` };
}

/** Which cost applies to a unit's fuel exergy. */
export function costKindOf(unit: EngineUnit): 'fuel' | 'electricity' | 'steam' | 'own-fuel' {
  if (unit.kind === 'boiler') return 'own-fuel';
  if (unit.kind === 'pump' || unit.kind === 'compressor' || unit.kind === 'fan' || unit.kind === 'motor-generator') return 'electricity';
  return unit.ports.some((p) => p.fluid?.kind === 'water') ? 'steam' : 'fuel';
}
