/**
 * The site settings form of the plant page: its fields as typed (text), the check of each, the
 * fields of a stored site, and the PATCH body the form sends. Pure: the island (SiteSettingsForm)
 * only draws it.
 */
import { z } from 'zod';
import { canConvert, fromSI, toSI, type Quantity } from '../units';
import { DISPLAY_CHOICES, DisplayUnitsSchema, type DisplayUnits } from '../units/display';
import { Currency, SiteInput } from './inputs';
import type { EnergyPrice, SiteModel } from './model';

const inRange = (v: string, min: number, max: number) => Number.isFinite(Number(v)) && Number(v) >= min && Number(v) <= max;
const num = (what: string, min: number, max: number) =>
  z.string().refine((v) => v.trim() !== '' && inRange(v, min, max), `${what}: a number from ${min} to ${max}.`);
const optNum = (what: string, min: number, max: number) =>
  z.string().refine((v) => v.trim() === '' || inRange(v, min, max), `${what}: a number from ${min} to ${max}, or empty.`);

export const PriceRowSchema = z.object({
  name: z.string().trim().min(1, 'Name the price.'),
  kind: z.enum(['fuel', 'electricity']),
  price: num('Price per MWh', 0, 1e6),
  currency: z.string().trim().regex(/^[A-Z]{3}$/, 'Three capital letters.'),
});
export type PriceRow = z.infer<typeof PriceRowSchema>;

export const SiteSettingsFormSchema = z
  .object({
    name: SiteInput.shape.name,
    timeZone: SiteInput.shape.timeZone,
    elevation: optNum('Elevation [m]', -500, 6000),
    pAtm: optNum('Atmospheric pressure [kPa]', 20, 120),
    T0: num('T0 [degC]', -50, 60),
    p0: num('p0 [kPa]', 20, 120),
    t0Tag: z.string().trim(),
    t0TagUnit: z.string().trim(),
    currency: Currency,
    duPower: z.enum(DISPLAY_CHOICES.power),
    duMassFlow: z.enum(DISPLAY_CHOICES.massFlow),
    duTemperature: z.enum(DISPLAY_CHOICES.temperature),
    duPressure: z.enum(DISPLAY_CHOICES.pressure),
    duLocale: DisplayUnitsSchema.shape.locale,
    prices: z.array(PriceRowSchema),
  })
  .refine((v) => v.t0Tag === '' || canConvert(v.t0TagUnit, 'temperature'), { path: ['t0TagUnit'], message: 'A temperature unit (degC, K, degF).' });
export type SiteSettingsFormValues = z.infer<typeof SiteSettingsFormSchema>;

/** An SI value shown in a display unit, rounded for reading ('' when there is none). */
export function showSI(value_SI: number | undefined | null, unit: string, quantity: Quantity): string {
  if (value_SI === undefined || value_SI === null) return '';
  if (!canConvert(unit, quantity)) return String(value_SI);
  return String(Number(fromSI(value_SI, unit, quantity).toPrecision(6)));
}

/** A number typed in a display unit (a decimal comma reads too), to SI; null when empty, NaN when not a number. */
export function readSI(text: string, unit: string, quantity: Quantity): number | null {
  if (text.trim() === '') return null;
  const v = Number(text.replace(',', '.'));
  if (!Number.isFinite(v)) return NaN;
  return toSI(v, unit, quantity);
}

/** The form's fields for a stored site and its display units. */
export function siteSettingsValues(s: SiteModel, display: DisplayUnits): SiteSettingsFormValues {
  return {
    duPower: display.power,
    duMassFlow: display.massFlow,
    duTemperature: display.temperature,
    duPressure: display.pressure,
    duLocale: display.locale,
    name: s.name,
    timeZone: s.timeZone,
    elevation: s.elevation_m === undefined ? '' : String(s.elevation_m),
    pAtm: showSI(s.p_atm_Pa, 'kPa', 'pressure'),
    T0: showSI(s.deadState.T0_K, 'degC', 'temperature'),
    p0: showSI(s.deadState.p0_Pa, 'kPa', 'pressure'),
    t0Tag: s.deadState.T0Tag?.tag ?? '',
    t0TagUnit: s.deadState.T0Tag?.unit ?? 'degC',
    currency: s.currency,
    prices: s.prices.map((p) => ({ name: p.name, kind: p.kind, price: String(p.price_per_MWh), currency: p.currency })),
  };
}

/** The PATCH body of /api/sites/{siteId} for the checked form; `elevationOnly` leaves p_atm to the elevation. */
export function siteSettingsPatch(v: SiteSettingsFormValues, elevationOnly: boolean) {
  return {
    name: v.name,
    timeZone: v.timeZone,
    elevation_m: v.elevation.trim() === '' ? null : Number(v.elevation),
    p_atm_Pa: elevationOnly || v.pAtm.trim() === '' ? null : readSI(v.pAtm, 'kPa', 'pressure'),
    T0_K: readSI(v.T0, 'degC', 'temperature'),
    p0_Pa: readSI(v.p0, 'kPa', 'pressure'),
    T0Tag: v.t0Tag === '' ? null : { tag: v.t0Tag, unit: v.t0TagUnit },
    currency: v.currency,
    prices: v.prices.map((p): EnergyPrice => ({ name: p.name, kind: p.kind, price_per_MWh: Number(p.price), currency: p.currency })),
    displayUnits: { power: v.duPower, massFlow: v.duMassFlow, temperature: v.duTemperature, pressure: v.duPressure, locale: v.duLocale } satisfies DisplayUnits,
  };
}
