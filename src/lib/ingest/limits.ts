/**
 * Physically possible values of a tag, by the quantity its engineering unit measures. A reading
 * outside these is no measurement (a transmitter fault, a historian's fill value like 1e308, a
 * cell the export mangled): the reader rejects it as a cell with the reason 'impossible', so it
 * never reaches a tag hour and never replaces a good one.
 *
 * These are limits of physics and of any plausible plant instrument, deliberately wide: they are not
 * the validity range of one transmitter (that is the tag link's validMin/validMax, which counts
 * out-of-range samples per hour instead).
 *
 * Rationale per quantity (SI):
 * - every quantity: |value| <= 1e18 in its own unit and finite. The largest count a plant keeps is
 *   an energy counter: a 1 GW unit over 30 years is about 9.5e17 J (1e9 W x 9.47e8 s), so nothing
 *   measured exceeds 1e18 in any unit. Historians' fill values (1e30, 3.4e38 = float32 max, 1e308)
 *   lie far beyond.
 * - temperature (absolute): 0 K <= T <= 10,000 K. Zero kelvin is the lower bound of thermodynamic
 *   temperature (third law); 10,000 K is well above any flame (about 3,100 K for oxy-acetylene,
 *   from memory) or furnace.
 * - temperature difference: |dT| <= 10,000 K (differences of the above).
 * - pressure (absolute): 0 Pa <= p <= 1e10 Pa. Absolute pressure cannot be negative; 10 GPa is an
 *   order of magnitude above the highest industrial vessels (about 1 GPa, from memory). A gauge unit
 *   may read down to minus the local atmosphere: the bound uses 108.5 kPa, above the highest
 *   sea-level pressure on record (about 108.4 kPa, from memory).
 * - pressure difference: |dp| <= 1e10 Pa.
 * - mass flow: |m| <= 1e6 kg/s (about 3.6 million t/h; the largest river turbines pass about
 *   1e6 kg/s per unit, from memory). Flows may be negative (reverse flow).
 * - volume flow (actual): |V| <= 1e6 m3/s. Standard volume flow: |n| <= 1e8 mol/s.
 * - power and heat flow: |P| <= 1e11 W (the largest power station is about 2.25e10 W, from memory).
 * - energy: |E| <= 1e18 J (see above).
 * - specific enthalpy: |h| <= 1e9 J/kg (hydrogen's higher heating value, the largest of any fuel,
 *   is about 1.42e8 J/kg).
 * - fraction: -0.1 <= x <= 1.1. A fraction lies in [0, 1]; analysers read a little below zero and
 *   above full scale near the ends of their range (common practice: allow 10 % of full scale).
 * - density: 0 <= rho <= 1e5 kg/m3 (the densest element, osmium, is 22,590 kg/m3).
 * - speed: |v| <= 1e5 m/s. Length: |l| <= 1e7 m.
 */
import { describeUnit, registry, type Quantity } from '../units';

/** Largest magnitude accepted in any unit (see above). */
export const MAX_ABS_VALUE = 1e18;
/** Highest local atmosphere a gauge reading may be relative to [Pa] (see above). */
const P_ATM_HIGHEST_Pa = 108_500;

/** Possible range in SI per quantity, with the reason shown to the operator. */
export const PHYSICAL_RANGE_SI: Record<Quantity, { min: number; max: number; why: string }> = {
  pressure: { min: 0, max: 1e10, why: 'absolute pressure cannot be negative or above 10 GPa' },
  pressureDifference: { min: -1e10, max: 1e10, why: 'a pressure difference beyond 10 GPa is no measurement' },
  temperature: { min: 0, max: 1e4, why: 'a temperature below absolute zero or above 10,000 K is no measurement' },
  temperatureDifference: { min: -1e4, max: 1e4, why: 'a temperature difference beyond 10,000 K is no measurement' },
  massFlow: { min: -1e6, max: 1e6, why: 'a mass flow beyond 1e6 kg/s is no measurement' },
  volumeFlow: { min: -1e6, max: 1e6, why: 'a volume flow beyond 1e6 m3/s is no measurement' },
  standardVolumeFlow: { min: -1e8, max: 1e8, why: 'a gas flow beyond 1e8 mol/s is no measurement' },
  power: { min: -1e11, max: 1e11, why: 'a power beyond 100 GW is no measurement' },
  heatFlow: { min: -1e11, max: 1e11, why: 'a heat flow beyond 100 GW is no measurement' },
  energy: { min: -1e18, max: 1e18, why: 'an energy beyond 1e18 J is no measurement' },
  specificEnthalpy: { min: -1e9, max: 1e9, why: 'a specific enthalpy beyond 1e9 J/kg is no measurement' },
  fraction: { min: -0.1, max: 1.1, why: 'a fraction below -10 % or above 110 % is no measurement' },
  density: { min: 0, max: 1e5, why: 'a density below zero or above 100,000 kg/m3 is no measurement' },
  speed: { min: -1e5, max: 1e5, why: 'a speed beyond 100 km/s is no measurement' },
  length: { min: -1e7, max: 1e7, why: 'a length beyond 10,000 km is no measurement' },
};

export interface ValueLimits {
  /** Lowest possible value in the tag's own unit. */
  min: number;
  /** Highest possible value in the tag's own unit. */
  max: number;
  /** Why values outside are impossible (shown with rejected cells). */
  why: string;
}

const ANY: ValueLimits = { min: -MAX_ABS_VALUE, max: MAX_ABS_VALUE, why: `no instrument reads beyond ${MAX_ABS_VALUE.toExponential(0)} in any unit` };

/** A unit's possible range in that unit, for one quantity. */
function rangeIn(quantity: Quantity, unit: string): ValueLimits | null {
  const entry = registry[quantity].find((e) => e.unit === unit);
  if (!entry) return null;
  const r = PHYSICAL_RANGE_SI[quantity];
  const lowOffset = entry.offset + (entry.gauge ? P_ATM_HIGHEST_Pa : 0);
  const highOffset = entry.offset;
  const min = Math.max(-MAX_ABS_VALUE, (r.min - lowOffset) / entry.factor);
  const max = Math.min(MAX_ABS_VALUE, (r.max - highOffset) / entry.factor);
  return { min, max, why: r.why };
}

const cache = new Map<string, ValueLimits>();

/**
 * The possible range of a tag's values in its own unit.
 * @param unitText the tag's engineering unit as exported ('degC', 'bar(g)', 't/h'), or null
 * @param quantity the quantity when known (from the plant model's link); otherwise read from the
 *   unit: a unit shared by several quantities ('K' for temperatures and their differences, 'bar' for
 *   pressures and differences) gets the widest of their ranges, except the temperature scales with
 *   an offset (degC, degF), which name a temperature (differences are written in K or 'delta degC').
 * @returns limits in the unit; without a known unit, the magnitude limit only
 */
export function valueLimitsFor(unitText: string | null | undefined, quantity?: Quantity | null): ValueLimits {
  const key = `${unitText ?? ''}|${quantity ?? ''}`;
  const hit = cache.get(key);
  if (hit) return hit;
  let out = ANY;
  const unit = unitText ? describeUnit(unitText).unit : null;
  if (unit) {
    if (quantity) out = rangeIn(quantity, unit) ?? ANY;
    else {
      let candidates = (Object.keys(registry) as Quantity[]).filter((q) => registry[q].some((e) => e.unit === unit));
      const tempScale = registry.temperature.find((e) => e.unit === unit && e.offset !== 0);
      if (tempScale) candidates = ['temperature'];
      const ranges = candidates.map((q) => rangeIn(q, unit)).filter((r): r is ValueLimits => r !== null);
      const [first] = ranges;
      if (ranges.length === 1 && first) out = first;
      else if (ranges.length > 1 && first) {
        const min = Math.min(...ranges.map((r) => r.min));
        const max = Math.max(...ranges.map((r) => r.max));
        out = { min, max, why: ranges.find((r) => r.min === min)?.why ?? first.why };
      }
    }
  }
  if (cache.size > 1000) cache.clear();
  cache.set(key, out);
  return out;
}
