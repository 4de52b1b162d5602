/**
 * The engineer's units: the units a site shows its numbers in (power kW or MW, mass flow t/h, kg/s or
 * kg/h, temperature degC or K, pressure bar(g), bar(a), kPa or MPa), with defaults taken from the
 * units of the site's tags. SI stays inside and in the API; screens, mails and reports for people
 * convert at the edge with these functions. Conversions are those of ./convert.ts (checked against
 * pint in tests/units/pint-crosscheck.test.ts). Pure; no I/O.
 */
import { z } from 'zod';
import { fromSI, unitEntry } from './convert';
import { parseUnit } from './parse';
import type { Quantity } from './quantities';

/** The choices per quantity, as canonical unit names of the registry (first one is the default). */
export const DISPLAY_CHOICES = {
  power: ['kW', 'MW', 'W'],
  massFlow: ['t/h', 'kg/s', 'kg/h'],
  temperature: ['degC', 'K'],
  pressure: ['barg', 'bar', 'kPa', 'MPa'],
} as const;

export type DisplayQuantity = keyof typeof DISPLAY_CHOICES;

/** How each canonical unit is written on a screen. */
const SHOWN: Record<string, string> = { degC: '°C', barg: 'bar(g)', bar: 'bar(a)' };

/** A site's display units; `locale` gives the digit grouping ('en-GB': 1,234.5; 'de-DE': 1.234,5). */
export const DisplayUnitsSchema = z.object({
  power: z.enum(DISPLAY_CHOICES.power),
  massFlow: z.enum(DISPLAY_CHOICES.massFlow),
  temperature: z.enum(DISPLAY_CHOICES.temperature),
  pressure: z.enum(DISPLAY_CHOICES.pressure),
  locale: z.string().min(2).max(35).regex(/^[A-Za-z]{2,3}(-[A-Za-z0-9]{2,8})*$/, 'a language tag such as en-GB'),
});
export type DisplayUnits = z.infer<typeof DisplayUnitsSchema>;

export const DEFAULT_DISPLAY_UNITS: DisplayUnits = { power: 'kW', massFlow: 't/h', temperature: 'degC', pressure: 'barg', locale: 'en-GB' };

/** The unit as a screen writes it: 'degC' is '°C', 'barg' is 'bar(g)', 'bar' is 'bar(a)'. */
export const shownUnit = (unit: string): string => SHOWN[unit] ?? unit;

/** What a tag's unit suggests as display unit of its quantity, or null. */
function suggestion(q: DisplayQuantity, canonical: string): string | null {
  if ((DISPLAY_CHOICES[q] as readonly string[]).includes(canonical)) return canonical;
  const entry = (() => {
    try {
      return unitEntry(canonical, q as Quantity);
    } catch {
      return null;
    }
  })();
  if (!entry) return null;
  if (q === 'pressure') return entry.gauge ? 'barg' : 'bar';
  if (q === 'power') return entry.factor >= 1e6 ? 'MW' : 'kW';
  if (q === 'massFlow') return entry.factor >= 0.1 ? 't/h' : 'kg/h';
  if (q === 'temperature') return 'degC';
  return null;
}

/**
 * Display units from the units of a site's tags: per quantity the unit most tags suggest (ties keep
 * the default), so a site whose historian writes MW and bar(g) sees MW and bar(g).
 * @param tags the quantity and engineering unit text of each linked tag
 */
export function deriveDisplayUnits(tags: readonly { quantity: string; unit: string | null }[], locale = DEFAULT_DISPLAY_UNITS.locale): DisplayUnits {
  const out: DisplayUnits = { ...DEFAULT_DISPLAY_UNITS, locale };
  for (const q of Object.keys(DISPLAY_CHOICES) as DisplayQuantity[]) {
    const votes = new Map<string, number>();
    for (const t of tags) {
      if (t.quantity !== q || !t.unit) continue;
      const canonical = parseUnit(t.unit);
      const s = canonical ? suggestion(q, canonical) : null;
      if (s) votes.set(s, (votes.get(s) ?? 0) + 1);
    }
    const best = [...votes.entries()].sort((a, b) => b[1] - a[1])[0];
    if (best && best[1] > (votes.get(out[q]) ?? 0)) (out as Record<DisplayQuantity, string>)[q] = best[0];
  }
  return out;
}

/** Stored choices over derived ones: a stored value that no longer parses is ignored. */
export function resolveDisplayUnits(stored: unknown, derived: DisplayUnits): DisplayUnits {
  const parsed = DisplayUnitsSchema.partial().safeParse(stored ?? {});
  return { ...derived, ...(parsed.success ? Object.fromEntries(Object.entries(parsed.data).filter(([, v]) => v !== undefined)) : {}) };
}

/** Kinds of number a screen writes (src/lib/words WordQuantity). */
export type ShownQuantity = DisplayQuantity | 'temperatureDifference' | 'specificEnergy' | 'specificEntropy' | 'entropyRate' | 'ratio' | 'percent' | 'count' | 'none';

/**
 * The linear map from SI to the shown unit: shown = SI * factor + offset, and the unit's text.
 * Gauge pressure needs the site's atmosphere `p_atm_Pa`.
 */
export function displayScale(q: ShownQuantity, du: DisplayUnits, p_atm_Pa = 101325): { factor: number; offset: number; unit: string } {
  switch (q) {
    case 'power':
    case 'massFlow':
    case 'temperature':
    case 'pressure': {
      const unit = du[q];
      const at0 = fromSI(0, unit, q, { p_atm_Pa });
      const at1 = fromSI(1, unit, q, { p_atm_Pa });
      return { factor: at1 - at0, offset: at0, unit: shownUnit(unit) };
    }
    case 'temperatureDifference':
      return { factor: 1, offset: 0, unit: du.temperature === 'K' ? 'K' : '°C' };
    case 'specificEnergy':
      return { factor: 1e-3, offset: 0, unit: 'kJ/kg' };
    case 'specificEntropy':
      return { factor: 1e-3, offset: 0, unit: 'kJ/(kg K)' };
    case 'entropyRate':
      return { factor: 1e-3, offset: 0, unit: 'kW/K' };
    case 'ratio':
      return { factor: 100, offset: 0, unit: '%' };
    default:
      return { factor: 1, offset: 0, unit: '' };
  }
}

/** A value [SI] in the shown unit (null stays null). */
export function toShown(v_SI: number | null | undefined, q: ShownQuantity, du: DisplayUnits, p_atm_Pa?: number): number | null {
  if (v_SI === null || v_SI === undefined || !Number.isFinite(v_SI)) return null;
  const s = displayScale(q, du, p_atm_Pa);
  return v_SI * s.factor + s.offset;
}
