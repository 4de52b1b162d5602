/**
 * Cost of exergy destruction (SPECO): Cdot_D = c_F Xdot_D, with c_F the unit cost of the unit's fuel
 * exergy. Currency-neutral: every price is in the site's currency, and a "cost" returned here is in
 * that currency (per second, hour or day as the name says).
 *
 * @see A. Lazzaretto and G. Tsatsaronis, "SPECO: A systematic and general methodology for calculating
 *      efficiencies and costs in thermal systems", Energy 31 (2006) 1257-1289.
 * @see A. Bejan, G. Tsatsaronis and M. Moran, Thermal Design and Optimization (Wiley, 1996), ch. 8.
 */
import { DAY_S, HOUR_S } from '../time';

/** Joules in one megawatt hour [J/MWh]. */
export const J_PER_MWH = 3.6e9;

function finite(name: string, v: number): void {
  if (!Number.isFinite(v)) throw new RangeError(`${name} = ${v} must be a finite number`);
}

/**
 * Unit cost of fuel exergy from a fuel price per MWh of lower heating value.
 * c_F = price / (3.6e9 J/MWh) / phi, where phi = e_ch / LHV (about 1.04 for natural gas, docs/domain.md section 4).
 *
 * @param price_per_MWh_LHV fuel price per MWh of LHV [currency/MWh]
 * @param exergyToLhvRatio phi = chemical exergy / LHV of the fuel [-], > 0
 * @returns cost per joule of fuel exergy [currency/J]
 */
export function fuelExergyCost_per_J(price_per_MWh_LHV: number, exergyToLhvRatio: number): number {
  finite('price_per_MWh_LHV', price_per_MWh_LHV);
  if (!(exergyToLhvRatio > 0 && Number.isFinite(exergyToLhvRatio))) {
    throw new RangeError(`exergyToLhvRatio = ${exergyToLhvRatio} must be > 0 (about 1.04 for natural gas)`);
  }
  return price_per_MWh_LHV / J_PER_MWH / exergyToLhvRatio;
}

/**
 * Unit cost of electricity as exergy (electric power is pure exergy, factor 1).
 * @param price_per_MWh electricity price [currency/MWh]
 * @returns cost per joule of exergy [currency/J]
 */
export function electricityExergyCost_per_J(price_per_MWh: number): number {
  finite('price_per_MWh', price_per_MWh);
  return price_per_MWh / J_PER_MWH;
}

/**
 * Unit cost of exergy of a stream bought by mass (e.g. fuel oil per tonne, steam per tonne).
 * @param price_per_kg price [currency/kg]
 * @param exergy_J_per_kg specific exergy of the stream [J/kg], > 0
 * @returns cost per joule of exergy [currency/J]
 */
export function exergyCostFromMassPrice_per_J(price_per_kg: number, exergy_J_per_kg: number): number {
  finite('price_per_kg', price_per_kg);
  if (!(exergy_J_per_kg > 0)) throw new RangeError(`exergy_J_per_kg = ${exergy_J_per_kg} must be > 0`);
  return price_per_kg / exergy_J_per_kg;
}

/**
 * Unit cost of a unit's product exergy from the cost balance c_P Xdot_P = c_F Xdot_F + Zdot, losses
 * carrying no cost of their own (charged to the product). Downstream units inherit it as their c_F.
 *
 * @param cF_per_J unit cost of fuel exergy [currency/J]
 * @param XF_W fuel exergy rate [W]
 * @param XP_W product exergy rate [W], > 0
 * @param Zdot_per_s capital and maintenance cost rate of the unit [currency/s]; default 0
 * @returns unit cost of product exergy [currency/J]
 * @see Lazzaretto & Tsatsaronis, Energy 31 (2006), cost balance of a component.
 */
export function productExergyCost_per_J(cF_per_J: number, XF_W: number, XP_W: number, Zdot_per_s = 0): number {
  finite('cF_per_J', cF_per_J);
  finite('XF_W', XF_W);
  finite('Zdot_per_s', Zdot_per_s);
  if (!(XP_W > 0)) throw new RangeError(`XP_W = ${XP_W} must be > 0 to spread the cost over the product`);
  return (cF_per_J * XF_W + Zdot_per_s) / XP_W;
}

/**
 * Cost rate of exergy destruction, Cdot_D = c_F Xdot_D.
 * @param cF_per_J unit cost of fuel exergy [currency/J]
 * @param XD_W exergy destruction rate [W]
 * @returns [currency/s]
 */
export function destructionCost_per_s(cF_per_J: number, XD_W: number): number {
  finite('cF_per_J', cF_per_J);
  finite('XD_W', XD_W);
  return cF_per_J * XD_W;
}

/** Cost of one hour of destruction at XD_W [currency/h]. @param cF_per_J [currency/J] @param XD_W [W] */
export function destructionCost_per_hour(cF_per_J: number, XD_W: number): number {
  return destructionCost_per_s(cF_per_J, XD_W) * HOUR_S;
}

/** Cost of one day of destruction at XD_W [currency/day]. @param cF_per_J [currency/J] @param XD_W [W] */
export function destructionCost_per_day(cF_per_J: number, XD_W: number): number {
  return destructionCost_per_s(cF_per_J, XD_W) * DAY_S;
}

/**
 * Cost of destruction summed over hours (the loss ledger): each hour's mean Xdot_D times 3600 s.
 * Hours with a non-finite value (not computed, not steady) are left out and counted.
 *
 * @param cF_per_J unit cost of fuel exergy [currency/J]
 * @param XD_W_perHour hourly mean destruction rates [W]
 * @returns total cost [currency], destroyed exergy [J], hours counted and skipped
 */
export function destructionCostOverHours(
  cF_per_J: number,
  XD_W_perHour: ArrayLike<number>,
): { cost: number; XD_J: number; hoursCounted: number; hoursSkipped: number } {
  finite('cF_per_J', cF_per_J);
  let XD_J = 0;
  let counted = 0;
  for (let i = 0; i < XD_W_perHour.length; i++) {
    const v = XD_W_perHour[i];
    if (!Number.isFinite(v)) continue;
    XD_J += v * HOUR_S;
    counted++;
  }
  return { cost: cF_per_J * XD_J, XD_J, hoursCounted: counted, hoursSkipped: XD_W_perHour.length - counted };
}

/**
 * Cost per day of the destruction above the baseline's expectation (the figure a drift notice states).
 * Negative when the unit does better than expected.
 *
 * @param cF_per_J unit cost of fuel exergy [currency/J]
 * @param XD_W observed destruction rate [W]
 * @param XDexpected_W expected destruction rate from the baseline [W]
 * @returns { extra_W [W], cost_per_day [currency/day] }
 */
export function extraDestructionCost_per_day(
  cF_per_J: number,
  XD_W: number,
  XDexpected_W: number,
): { extra_W: number; cost_per_day: number } {
  finite('XDexpected_W', XDexpected_W);
  const extra_W = XD_W - XDexpected_W;
  return { extra_W, cost_per_day: destructionCost_per_day(cF_per_J, extra_W) };
}
